// Size families: one shape on a small, a medium and a large measured tube.
// Every expected value below is worked by hand from trade sizes, not read from
// the code under test:
//  - Form tubes are sold by their inside diameter in whole inches; the sizes
//    used here are 14, 16, 18, 20, 24 and 30 in (355.6 ... 762 mm).
//  - The default pan is a 4-1/4 in pocket with a 1/2 in rabbet round it, so a
//    pan and its rim reach R = 4.25 / 2 + 0.5 in = 66.675 mm from the pocket centre.
//  - A pan is hidden when its rim stays inside the tube's outside wall, here
//    with a 1.5 mm tuck (our common practice, from memory) and the offset
//    rounded down to 1/2 mm: offset = floor(2 (D / 2 - 66.675 - 1.5)) / 2.
//  - The look scales with the trunk: a lobe's reach, width and valley grow by
//    the ratio of the tube diameters, so a tip stands beyond the wall by the
//    parent's distance times that ratio.
import { describe, expect, it } from 'vitest'
import { buildPlate } from '../../../geometry/plate'
import { deriveForTube, presetParams } from '../../../geometry/presets'
import { problemRows } from '../../../geometry/checks/messages'

const INCH = 25.4

/** Small, medium and large tubes (in) per starting shape, each with room to hide its pans (see below). */
const FAMILIES: Record<string, [number, number, number]> = {
  'gnarled-oak': [14, 18, 24],
  'slim-birch': [14, 16, 20],
  'banyan-sprawl': [18, 24, 30],
  'river-stone': [14, 18, 24],
  'plain-column': [14, 18, 24],
}

/** By hand: the hidden offset for the default pan on a D mm tube (see the header). */
const handOffset = (D: number) => Math.floor(2 * (D / 2 - 66.675 - 1.5)) / 2

describe('hand values of the family sizes', () => {
  it('work out as the header says', () => {
    // 14 in: 177.8 - 68.175 = 109.625 -> 109.5; 18 in: 228.6 - 68.175 = 160.425 -> 160; 24 in: 304.8 - 68.175 = 236.625 -> 236.5
    expect(handOffset(14 * INCH)).toBe(109.5)
    expect(handOffset(18 * INCH)).toBe(160)
    expect(handOffset(24 * INCH)).toBe(236.5)
  })
})

describe.each(Object.entries(FAMILIES))('a family of %s', (id, tubes) => {
  const parent = presetParams(id)!
  const parentPlate = buildPlate(parent)

  it.each(tubes.map((t, i) => [['small', 'medium', 'large'][i]!, t] as const))('%s on a %s in tube', (_size, inches) => {
    const D = inches * INCH
    const s = D / parent.tubeDiameter
    const size = deriveForTube(parent, D)
    const plate = buildPlate(size)

    // Hardware keeps its real size.
    expect(size.pocketDiameter).toBe(107.95)
    expect(size.rabbetWidth).toBe(12.7)
    for (const key of ['pocketDiameter', 'rabbetWidth', 'rabbetDepth', 'panDepth', 'caster', 'fasteners', 'casterCount', 'centreHoleDiameter', 'indexHoleDiameter', 'minWood', 'layers', 'sheetThickness', 'cutting'] as const) {
      expect(size[key], key).toEqual(parent[key])
    }
    const holeSizes = (p: typeof plate, kind: string) => [...new Set(p.holes.filter((h) => h.kind === kind).map((h) => h.diameter))]
    for (const kind of ['pocket', 'centre', 'index']) expect(holeSizes(plate, kind), kind).toEqual(holeSizes(parentPlate, kind))

    // The trunk is the new tube, and the lobes follow it.
    expect(size.tubeDiameter).toBeCloseTo(D, 3)
    expect(size.lobes.reach).toBeCloseTo(parent.lobes.reach * s, 2)
    expect(size.lobes.width).toBeCloseTo(parent.lobes.width * s, 2)
    expect(size.lobes.valley).toBeCloseTo(parent.lobes.valley * s, 2)
    expect(plate.lobeTips.length).toBe(parent.lobes.count)
    plate.lobeTips.forEach((tip, i) => {
      const before = parentPlate.lobeTips[i]!
      expect(tip.angle).toBeCloseTo(before.angle, 6)
      expect(tip.radius - D / 2).toBeCloseTo((before.radius - parent.tubeDiameter / 2) * s, 0)
    })

    // Pans hidden: the offset is the hand value, so each rim is 1.5 to 2 mm inside the outside wall.
    expect(size.casterOffset).toBe(handOffset(D))
    expect(plate.findings.map((f) => f.code)).not.toContain('pan-visible')
    expect(plate.findings.filter((f) => f.severity === 'error')).toEqual([])
    expect(plate.holes.filter((h) => h.kind === 'index').length).toBeGreaterThanOrEqual(1)
  })
})

describe('a size whose tube is too slim to hide its pans', () => {
  it('keeps the tube standing: six pans on a 10 in tube move out until the foot is no error', () => {
    // By hand: six pans need (2 R + minWood) / (2 sin 30 deg) = (133.35 + 19.05) / 1 = 152.4 mm of offset to clear
    // each other, but hide only within 127 - 66.675 - 1.5 = 58.8 mm: they must show.
    const banyan = presetParams('banyan-sprawl')!
    const size = deriveForTube(banyan, 10 * INCH)
    const plate = buildPlate(size)
    expect(size.casterOffset).toBeGreaterThanOrEqual(152.4)
    expect(plate.findings.map((f) => f.code)).toContain('pan-visible')
    expect(plate.findings.filter((f) => f.severity === 'error')).toEqual([])
    // The error limit is a quarter of the foot (engineering judgement, from memory; see checks/pans.ts).
    expect(plate.metrics.tubeBearing).toBeGreaterThanOrEqual(0.25)
  })
})

describe('every starting shape on every tube the field takes', () => {
  it('derives a plate with no error from 4 to 49 in (every 3 in)', () => {
    for (const id of Object.keys(FAMILIES)) {
      const parent = presetParams(id)!
      for (let inches = 4; inches <= 49; inches += 3) {
        const errors = buildPlate(deriveForTube(parent, inches * INCH)).findings.filter((f) => f.severity === 'error').map((f) => f.code)
        expect(errors, `${id} on ${inches} in`).toEqual([])
      }
    }
  }, 60_000)
})

describe('derived sizes keep their access openings wherever a hole saw fits between the pans', () => {
  // By hand: an opening of radius r at offset a, midway between neighbouring pans (n casters at offset d,
  // rim radius R = 66.675 mm), stands clear when a + r stays 1 mm inside the tube's inside wall, and the
  // minimum wood is left to the centre hole (a - r - centre / 2), to each pan (law of cosines:
  // sqrt(a^2 + d^2 - 2 a d cos(pi / n)) - R - r) and to the next opening (2 a sin(pi / n) - 2 r).
  // Offsets are scanned every 0.1 mm. Hole saws: 3/4 to 6 in in 1/8 in steps (REFERENCES, "Hole saws").
  const room = (p: ReturnType<typeof deriveForTube>, r: number) => {
    const R = 66.675
    const half = Math.PI / p.casterCount
    const inside = p.tubeDiameter / 2 - p.tubeWall - 1
    for (let a = 0; a + r <= inside; a += 0.1) {
      const wood = Math.min(
        a - r - p.centreHoleDiameter / 2,
        Math.sqrt(a * a + p.casterOffset ** 2 - 2 * a * p.casterOffset * Math.cos(half)) - R - r,
        2 * a * Math.sin(half) - 2 * r,
      )
      if (wood >= p.minWood) return true
    }
    return false
  }

  it.each(['gnarled-oak', 'banyan-sprawl', 'river-stone', 'plain-column'])('%s on tubes of 4 to 40 in', (id) => {
    const parent = presetParams(id)!
    expect(parent.access.enabled).toBe(true)
    for (let inches = 4; inches <= 40; inches += 2) {
      const size = deriveForTube(parent, inches * INCH)
      if (size.access.enabled) {
        expect(size.access.diameter, `${id} ${inches} in`).toBeLessThanOrEqual(parent.access.diameter + 0.01)
        const eighths = size.access.diameter / INCH * 8
        expect(Math.abs(eighths - Math.round(eighths)), `${id} ${inches} in: a hole-saw size`).toBeLessThan(1e-6)
        expect(room(size, size.access.diameter / 2 - 0.05), `${id} ${inches} in`).toBe(true)
        const plate = buildPlate(size)
        expect(plate.holes.filter((h) => h.kind === 'access').length).toBe(size.casterCount)
        expect(plate.findings.filter((f) => f.severity === 'error'), `${id} ${inches} in`).toEqual([])
      } else {
        // Left out only when not even a 3/4 in saw finds room.
        expect(room(size, (0.75 * INCH) / 2), `${id} ${inches} in`).toBe(false)
      }
    }
  }, 60_000)
})

describe('a derived size that drops its access openings says so', () => {
  // By hand, the plain column on an 8 in tube (203.2 mm outside, 1/4 in wall): its three default pans
  // (rim radius R = 66.675 mm) sit at d = 89 mm. A 3/4 in opening (r = 9.525 mm) must stay 1 mm inside
  // the wall: a + r <= 101.6 - 6.35 - 1, so a <= 84.725 mm. Midway between two pans (half angle 60 deg,
  // cos = 1/2) the law of cosines gives the distance to a pan centre sqrt(a^2 + d^2 - a d); 3/4 in of
  // minimum wood to the rim needs sqrt(a^2 - 89 a + 7921) >= 66.675 + 9.525 + 19.05 = 95.25, i.e.
  // a^2 - 89 a - 1151.56 >= 0, a >= (89 + sqrt(89^2 + 4 * 1151.56)) / 2 = 100.46 mm: beyond 84.725 mm.
  // No 3/4 in opening fits, so none smaller than the parent's does either.
  const size = deriveForTube(presetParams('plain-column')!, 8 * INCH)

  it('is the case worked by hand', () => {
    expect(size.casterCount).toBe(3)
    expect(size.casterOffset).toBe(89)
    expect(size.tubeWall).toBeCloseTo(6.35, 6)
    expect((89 + Math.sqrt(89 ** 2 + 4 * (95.25 ** 2 - 89 ** 2))) / 2).toBeGreaterThan(101.6 - 6.35 - 1 - 9.525)
    expect(size.access.enabled).toBe(false)
  })

  it('carries a warning on the plate, naming the 3/4 in saw', () => {
    const found = buildPlate(size).findings.filter((f) => f.code === 'access-no-room')
    expect(found).toHaveLength(1)
    expect(found[0]!.severity).toBe('warning')
    expect(found[0]!.values?.smallestSaw).toBeCloseTo(0.75 * INCH, 6)
    // The Checks list's row, in the reader's units: 3/4 in is 19.05 mm (1 in = 25.4 mm, NIST SP 811).
    const rows = problemRows(buildPlate(size), { units: 'in', suggest: false }).filter((r) => r.code === 'access-no-room')
    expect(rows).toHaveLength(1)
    expect(rows[0]!.text).toContain('3/4"')
    expect(rows[0]!.text).toMatch(/counterweight goes in before the tube/)
    const mmRow = problemRows(buildPlate(size), { units: 'mm', suggest: false }).find((r) => r.code === 'access-no-room')!
    expect(mmRow.text).toMatch(/19(\.1)? mm/)
  })

  it('is not raised where an opening would fit (the same shape on a 12 in tube, openings on)', () => {
    const roomy = deriveForTube(presetParams('plain-column')!, 12 * INCH)
    expect(roomy.access.enabled).toBe(true)
    const off = { ...roomy, access: { ...roomy.access, enabled: false } }
    expect(buildPlate(off).findings.map((f) => f.code)).not.toContain('access-no-room')
  })
})

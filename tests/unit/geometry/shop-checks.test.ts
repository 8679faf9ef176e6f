// The checks a shop makes before cutting, against values from outside the
// code: the round-cutter and block-through-opening rules (REFERENCES, "Added
// for the second round"), circle and ring geometry worked by hand, two
// independent polygon engines, and brute-force searches written here.

import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { Clipper, FillRule, type PathD } from 'clipper2-ts'
import polygonClipping from 'polygon-clipping'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema, type PlateParamsInput } from '../../../geometry/params'
import { deriveForTube, presetParams, PRESETS } from '../../../geometry/presets'
import { bendRadii, insideRadiusFindings } from '../../../geometry/checks/cutting'
import { unionArea } from '../../../geometry/math/circles'
import { TUBE_BEARING, LEAST_RABBET_FLOOR } from '../../../geometry/checks/pans'
import { acceptedParams, circleRing, shoelace, threeInch } from './helpers'

const DEG = Math.PI / 180
const INCH = 25.4
const build = (input: PlateParamsInput) => buildPlate(plateParamsSchema.parse(input))
const codes = (input: PlateParamsInput) => build(input).findings.map((f) => f.code)

describe('a round cutter leaves inside radii no tighter than its own (REFERENCES: a 1/4 in bit leaves 1/8 in)', () => {
  // A 200 mm square with a round bite of radius 2 mm taken out of the middle of its right edge:
  // the bite's arc is the only inward bend, radius exactly 2 mm.
  function bitten(rho: number): [number, number][] {
    const ring: [number, number][] = [[-100, -100], [100, -100], [100, -rho]]
    // Round the bite clockwise (inward) from (100, -rho) to (100, rho) about (100, 0).
    for (let i = 1; i < 180; i++) {
      const a = -90 - i
      ring.push([100 + rho * Math.cos(a * DEG), rho * Math.sin(a * DEG)])
    }
    ring.push([100, rho], [100, 100], [-100, 100])
    return ring
  }
  const params = (bit: number) => plateParamsSchema.parse({ cutting: { bitDiameter: bit } })

  it('measures the bite as a 2 mm inside bend', () => {
    const radii = bendRadii(bitten(2))
    const inward = [...radii].filter((r) => r < 0).map((r) => -r)
    expect(inward.length).toBeGreaterThan(100)
    for (const r of inward) expect(r).toBeCloseTo(2, 6)
  })

  it('flags it for a 1/4 in bit (1/8 in = 3.175 mm radius), once, at the bite', () => {
    const ring = bitten(2)
    const found = insideRadiusFindings(params(0.25 * INCH), ring)
    expect(found).toHaveLength(1)
    expect(found[0]!.values!.radius).toBeCloseTo(2, 6)
    expect(found[0]!.values!.cutterRadius).toBeCloseTo(3.175, 9)
    expect(found[0]!.at!.x).toBeGreaterThan(97.9)
    expect(Math.abs(found[0]!.at!.y)).toBeLessThanOrEqual(2)
    expect(found[0]!.field).toBe('cutting.bitDiameter')
  })

  it('passes it for a bit of radius 1.9 mm, and a 3.2 mm bite for the 1/4 in bit', () => {
    const ring = bitten(2)
    expect(insideRadiusFindings(params(3.8), ring)).toEqual([])
    const wide = bitten(3.2)
    expect(insideRadiusFindings(params(0.25 * INCH), wide)).toEqual([])
  })

  it.each(['default', ...PRESETS.map((p) => p.id)])('%s: the outline itself keeps every inside bend at least 1/8 in', (id) => {
    const plate = buildPlate(id === 'default' ? plateParamsSchema.parse({}) : presetParams(id)!)
    expect(plate.findings.map((f) => f.code)).not.toContain('inside-radius')
  })

  it('blends a lobe foot wider where a larger cutter needs it', () => {
    // Tall, narrow, blunt roots: with a 1/16 in bit the feet may bend tighter than a 1 in bit allows;
    // with the 1 in bit the feet are widened so that no inside bend is tighter than 1/2 in.
    const input = { lobes: { count: 6, reach: 200, width: 60, roundness: 1, irregularity: 0 } }
    const fine = build({ ...input, cutting: { bitDiameter: 1.5875 } })
    const coarse = build({ ...input, cutting: { bitDiameter: 25.4 } })
    expect(coarse.metrics.area).toBeGreaterThan(fine.metrics.area)
    const tightest = (ring: [number, number][]) => Math.min(...[...bendRadii(ring)].filter((r) => r < 0).map((r) => -r))
    expect(tightest(coarse.outline)).toBeGreaterThanOrEqual(12.7 * 0.95)
  })
})

describe('a block passes a round opening when its smallest section\'s diagonal is less than the opening (REFERENCES)', () => {
  // A caster top plate of 2 x 4 in needs more than sqrt(2^2 + 4^2) = 4.472 in.
  const caster = { topPlateWidth: 2 * INCH, topPlateLength: 4 * INCH, boltSpacingX: 3 * INCH, boltSpacingY: 1.25 * INCH, boltDiameter: 6.35, racewayDiameter: 1.5 * INCH }
  it('refuses a 4.47 in pocket and takes a 4.48 in one', () => {
    expect(codes({ caster, pocketDiameter: 4.47 * INCH, casterOffset: 120 })).toContain('caster-too-big-for-pocket')
    expect(codes({ caster, pocketDiameter: 4.48 * INCH, casterOffset: 120 })).not.toContain('caster-too-big-for-pocket')
  })
})

describe('the swivel circle with the tread width and a clearance', () => {
  it('counts the tread: a 40 mm tread on the default 2 in caster swings into its 4-1/4 in pocket', () => {
    // Reach 44.45 (lead 19.05 + wheel radius 25.4); tread edge hypot(44.45, 20) = 48.743; + 6.35 = 55.09 > 53.975.
    expect(codes({ caster: { treadWidth: 40 } })).toContain('wheel-swing')
    // hypot(44.45, 9.525) + 6.35 = 51.81 < 53.975
    expect(codes({})).not.toContain('wheel-swing')
    // With a 3/8 in clearance instead: 45.459 + 9.525 = 54.98 > 53.975.
    expect(codes({ caster: { swivelClearance: 9.525 } })).toContain('wheel-swing')
  })
})

describe('pans hidden under the trunk', () => {
  it.each(['default', ...PRESETS.map((p) => p.id).filter((id) => id !== 'slim-birch')])('%s: every rabbet lies inside the tube\'s outside wall', (id) => {
    const plate = buildPlate(id === 'default' ? plateParamsSchema.parse({}) : presetParams(id)!)
    for (const rb of plate.rabbets) expect(Math.hypot(rb.x, rb.y) + rb.diameter / 2).toBeLessThanOrEqual(plate.trunk.diameter / 2)
    expect(plate.findings.map((f) => f.code)).not.toContain('pan-visible')
  })

  it('warns where a pan shows, with its place, the field and the numbers', () => {
    // 3 in hardware at 170 mm: rabbet edge 170 + 98.425 = 268.425 mm against the 158.75 mm tube radius.
    const plate = build(threeInch())
    const f = plate.findings.find((x) => x.code === 'pan-visible')!
    expect(f.severity).toBe('warning')
    expect(f.field).toBe('casterOffset')
    expect(f.values!.showing).toBeCloseTo(268.425 - 158.75, 9)
    expect(f.at!.radius).toBeCloseTo(98.425, 9)
    // Hidden would need offset <= 158.75 - 98.425 - 1.5 = 58.825, but the pans need 120.65 to clear the centre hole.
    expect(f.message).toMatch(/too slim/)
  })
})

describe('tube bearing (REFERENCES, "a form tube\'s foot": a notch removes bearing in proportion to its angle)', () => {
  it('matches a hand computation by the law of cosines', () => {
    // Tube 317.5 (radii 158.75 and 152.4), pans of radius 66.675 at 150 mm. A rabbet circle meets the
    // wall's inside face where cos(a) = (152.4^2 + 150^2 - 66.675^2) / (2 x 152.4 x 150): a = 25.46 deg,
    // wider than at the outside face; three notches of 2a each.
    const half = Math.acos((152.4 ** 2 + 150 ** 2 - 66.675 ** 2) / (2 * 152.4 * 150)) / DEG
    const plate = build({ casterOffset: 150, access: { enabled: false } })
    expect(plate.notches).toHaveLength(3)
    expect(plate.notches[0]!.span).toBeCloseTo(2 * half, 9)
    expect(plate.metrics.tubeBearing).toBeCloseTo(1 - (3 * 2 * half) / 360, 9)
    expect(plate.metrics.tubeBearing).toBeCloseTo(0.5757, 3)
  })

  it('matches a brute-force scan of the ring for the issue\'s case, and reports it', () => {
    // An 8-1/2 in tube, four 6-1/2 in pans (3 in casters) at 160 mm: the notches take most of the foot.
    const plate = build(threeInch({ tubeDiameter: 215.9, casterCount: 4, casterOffset: 160, access: { enabled: false }, lobes: { count: 4 } }))
    const ro = 215.9 / 2
    const ri = ro - 6.35
    let notched = 0
    const steps = 36000
    for (let i = 0; i < steps; i++) {
      const a = (i / steps) * 2 * Math.PI
      let hit = false
      for (let k = 0; k <= 40 && !hit; k++) {
        const s = ri + ((ro - ri) * k) / 40
        hit = plate.rabbets.some((rb) => Math.hypot(s * Math.cos(a) - rb.x, s * Math.sin(a) - rb.y) <= rb.diameter / 2)
      }
      if (hit) notched++
    }
    expect(plate.metrics.tubeBearing).toBeCloseTo(1 - notched / steps, 3)
    const f = plate.findings.find((x) => x.code === 'tube-bearing')!
    expect(f.values!.bearing).toBeCloseTo(plate.metrics.tubeBearing, 12)
    // Engineering judgement (from memory): a warning below 50 % of the foot, an error below 25 %.
    expect(TUBE_BEARING).toEqual({ warn: 0.5, error: 0.25 })
    expect(f.severity).toBe(plate.metrics.tubeBearing < 0.25 ? 'error' : 'warning')
  })

  it('is 1 where no pan reaches the wall, and an error when almost nothing is left', () => {
    expect(build({ casterOffset: 400, lobes: { count: 0 } }).metrics.tubeBearing).toBe(1)
    // Eight 3 in caster pans on a 12-1/2 in tube at 175 mm: the rabbets overlap the whole ring.
    const crowded = build(threeInch({ casterCount: 8, casterOffset: 175, access: { enabled: false } }))
    expect(crowded.metrics.tubeBearing).toBeLessThan(0.25)
    expect(crowded.findings.find((f) => f.code === 'tube-bearing')!.severity).toBe('error')
  })
})

describe('notch height (the pan stack above the plate top)', () => {
  it('is the pan depth less the rabbet depth plus 1/2 in clearance (from memory)', () => {
    // Default: 31.75 - 9.525 + 12.7 = 34.925 mm. 3 in hardware: 63.5 - 9.525 + 12.7 = 66.675 mm.
    for (const n of build({ casterOffset: 150 }).notches) expect(n.height).toBeCloseTo(34.925, 9)
    for (const n of build(threeInch()).notches) expect(n.height).toBeCloseTo(66.675, 9)
  })
})

describe('wood under a rabbet', () => {
  it('warns below 1/2 in of plywood under the rim (from memory)', () => {
    // One 3/4 in sheet (19.05) with a 3/8 in rabbet leaves 9.525 mm.
    const f = build({ layers: 1, sheetThickness: 19.05 }).findings.find((x) => x.code === 'rabbet-floor-thin')!
    expect(f.values!.wood).toBeCloseTo(9.525, 9)
    expect(LEAST_RABBET_FLOOR).toBe(12.7)
    expect(codes({})).not.toContain('rabbet-floor-thin')
  })
})

describe('sheet fit with the edge margin and kerf', () => {
  // A plain disc: no lobes, no wobble, radius = tube radius + valley. 1100 / 2 + 59.4 = 609.4: 1218.8 mm across.
  const disc = { tubeDiameter: 1100, lobes: { count: 0, irregularity: 0, valley: 59.4 }, casterOffset: 400, access: { enabled: false } }
  it('a 1218.8 mm disc does not fit a 48 in (1219.2 mm) sheet with 1/2 in margins and a 1/4 in kerf', () => {
    const plate = build(disc)
    expect(plate.metrics.width).toBeCloseTo(1218.8, 0)
    expect(plate.findings.map((f) => f.code)).toContain('larger-than-sheet')
    // 1218.8 > 1219.2 - 2 x 12.7 = 1193.8 (the kerf is kept between parts, not at the sheet's margin)
  })
  it('fits with no margin and no kerf', () => {
    expect(codes({ ...disc, cutting: { edgeMargin: 0, kerf: 0 } })).not.toContain('larger-than-sheet')
  })
})

describe('the valley after the wobble', () => {
  it.each([1, 2, 3, 99])('never comes nearer the trunk than the stated 6 mm minimum (seed %i)', (seed) => {
    const plate = build({ lobes: { count: 0, valley: 6, irregularity: 1, seed } })
    const least = Math.min(...plate.outline.map(([x, y]) => Math.hypot(x, y)))
    // Polygon vertices lie on the curve; chords may cut 0.1 mm inside it, vertices not.
    expect(least).toBeGreaterThanOrEqual(317.5 / 2 + 6 - 1e-9)
  })
})

describe('roots a shop can cut and keep', () => {
  it('warns of sharp tips and thin roots, with the least values', () => {
    // Short, needle-thin pointed roots cut with a 1/16 in bit (so their feet are hardly widened).
    const list = build({ lobes: { count: 5, reach: 60, width: 10, roundness: 0, irregularity: 0 }, cutting: { bitDiameter: 1.5875 } }).findings
    const tip = list.find((f) => f.code === 'root-tip-sharp')!
    expect(tip.values!.least).toBe(12.7)
    expect(tip.values!.radius).toBeLessThan(12.7)
    const narrow = list.find((f) => f.code === 'root-narrow')!
    expect(narrow.values!.least).toBe(38.1)
    expect(narrow.values!.width).toBeLessThan(38.1)
  })
})

describe('holes: how each is made, and the rim fasteners', () => {
  it('hole-saws openings of a saw size up to 6 in, routes the rest, drills centre and index', () => {
    const plate = build({})
    const pocket = plate.holes.find((h) => h.kind === 'pocket')!
    expect(pocket).toMatchObject({ method: 'hole-saw' })
    expect(pocket.sawSize).toBeCloseTo(4.25 * INCH, 9)
    expect(plate.holes.find((h) => h.kind === 'access')!).toMatchObject({ method: 'hole-saw', sawSize: 50.8 })
    const big = build({ tubeDiameter: 900, casterOffset: 300, access: { diameter: 8 * INCH, offset: 200 } })
    expect(big.holes.find((h) => h.kind === 'access')!.method).toBe('routed')
    const odd = build({ pocketDiameter: 110 })
    expect(odd.holes.find((h) => h.kind === 'pocket')!.method).toBe('routed')
  })

  it('puts the pan-rim fasteners in the rabbet floor, and the caster bolts inside the pocket (through steel)', () => {
    const plate = build({})
    expect(plate.fasteners).toHaveLength(3 * 4)
    for (const f of plate.fasteners) {
      const pocket = plate.holes.find((h) => h.id === f.pocketId)!
      const d = Math.hypot(f.x - pocket.x, f.y - pocket.y)
      // Middle of the rabbet ring: (107.95 + 12.7) / 2 = 60.325 mm from the pocket centre.
      expect(d).toBeCloseTo(60.325, 9)
      expect(d - f.diameter / 2).toBeGreaterThan(107.95 / 2)
      expect(d + f.diameter / 2).toBeLessThan(107.95 / 2 + 12.7)
    }
    for (const m of plate.casterMounts) {
      const pocket = plate.holes.find((h) => h.id === m.pocketId)!
      for (const b of m.bolts) expect(Math.hypot(b.x - pocket.x, b.y - pocket.y) + b.diameter / 2).toBeLessThan(pocket.diameter / 2)
    }
    expect(codes({ fasteners: { boltCircleDiameter: 100 } })).toContain('fastener-off-rim')
  })

  it('never loses an index hole: every accepted plate without an error has at least one (property)', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        const plate = buildPlate(params)
        if (plate.findings.some((f) => f.severity === 'error')) return true
        return plate.holes.filter((h) => h.kind === 'index').length >= 1
      }),
      { numRuns: 60 },
    )
  }, 60_000)
})

describe('net area of overlapping holes', () => {
  const toPathD = (ring: readonly (readonly [number, number])[]): PathD => ring.map(([x, y]) => ({ x, y }))
  // Three unit circles on the corners of a unit equilateral triangle. By inclusion-exclusion:
  // 3 pi - 3 x lens(1, 1, 1) + Reuleaux triangle = 3 pi - 3 x 1.228370 + (pi - sqrt 3) / 2 = 6.444439
  // (lens: Weisstein, "Circle-Circle Intersection", MathWorld; Reuleaux area (pi - sqrt 3) w^2 / 2).
  const three = [{ x: 0, y: 0, radius: 1 }, { x: 1, y: 0, radius: 1 }, { x: 0.5, y: Math.sqrt(3) / 2, radius: 1 }]

  it('is exact where three holes share a spot (hand value)', () => {
    expect(unionArea(three)).toBeCloseTo(3 * Math.PI - 3 * 1.22837 + (Math.PI - Math.sqrt(3)) / 2, 5)
    expect(unionArea(three)).toBeCloseTo(6.444439, 5)
  })

  it('matches polygon-clipping and clipper2-ts on random circles', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ x: fc.double({ min: -50, max: 50, noNaN: true }), y: fc.double({ min: -50, max: 50, noNaN: true }), radius: fc.double({ min: 1, max: 40, noNaN: true }) }), { minLength: 1, maxLength: 6 }), (circles) => {
        const n = 256
        // A regular n-gon's area is n R^2 sin(2 pi / n) / 2: scale each ring out so its area is the circle's.
        const k = Math.sqrt((2 * Math.PI) / (n * Math.sin((2 * Math.PI) / n)))
        const rings = circles.map((c) => circleRing(c.x, c.y, c.radius * k, n))
        const [first, ...rest] = rings.map((r) => [r] as [number, number][][])
        const pc = polygonClipping.union(first!, ...rest)
        let pcArea = 0
        for (const poly of pc) poly.forEach((ring, i) => { const a = Math.abs(shoelace(ring.slice(0, -1))); pcArea += i === 0 ? a : -a })
        const cl = Clipper.areaPathsD(Clipper.unionD(rings.map(toPathD), [], FillRule.NonZero, 6))
        const exact = unionArea(circles)
        // Chord error: a ring of equal area crosses each circle, so the union differs by at most the slivers, well under 1e-3 relative.
        expect(Math.abs(exact - pcArea) / exact).toBeLessThan(1e-3)
        expect(Math.abs(exact - cl) / exact).toBeLessThan(1e-3)
      }),
      { numRuns: 15 },
    )
  }, 60_000)
})

describe('a new design from a starting shape on a measured tube (deriveForTube)', () => {
  it.each(PRESETS.map((p) => p.id))('%s on 12-1/2, 16-1/2 and 24-1/2 in tubes: no error, pans hidden where the tube allows', (id) => {
    for (const tube of [317.5, 419.1, 622.3]) {
      const params = deriveForTube(presetParams(id)!, tube)
      const plate = buildPlate(params)
      // By hand: pans of radius R = pocket / 2 + rabbet width must stand at least
      // max(R + minWood + centre / 2, (2R + minWood) / (2 sin(pi / n))) out to clear the centre hole and each
      // other (chord of the caster circle), and at most ro - R - 1.5 (tucked) to hide.
      const R = params.pocketDiameter / 2 + params.rabbetWidth
      const least = Math.max(R + params.minWood + params.centreHoleDiameter / 2, (2 * R + params.minWood) / (2 * Math.sin(Math.PI / params.casterCount)))
      const room = least <= tube / 2 - R - 1.5
      if (room) {
        expect(plate.findings.filter((f) => f.severity === 'error'), `${id} ${tube}`).toEqual([])
        expect(plate.findings.map((f) => f.code), `${id} ${tube}`).not.toContain('pan-visible')
      } else {
        expect(plate.findings.find((f) => f.code === 'pan-visible')!.message).toMatch(/too slim/)
      }
      expect(plate.holes.filter((h) => h.kind === 'index').length).toBeGreaterThanOrEqual(1)
    }
  })
})

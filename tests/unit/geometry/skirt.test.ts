// Skirt strips checked against outside values: Ramanujan's ellipse perimeter
// (REFERENCES: a = 2, b = 1 gives 9.688421, a quarter 2.422105), Pythagoras
// for straight strips, and each run against the outline read independently
// here (a ray from the centre intersected with the outline polygon by a
// helper written in this file, not the library's code).

import { describe, expect, it } from 'vitest'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'
import { PRESETS, presetParams } from '../../../geometry/presets'
import { profileLength, skirtCutList, skirtStrips, skirtTotals } from '../../../geometry/skirt'

/** Ramanujan (1914), first approximation: pi [3(a+b) - sqrt((3a+b)(a+3b))]. */
function ramanujanPerimeter(a: number, b: number): number {
  return Math.PI * (3 * (a + b) - Math.sqrt((3 * a + b) * (a + 3 * b)))
}

/** Farthest crossing of the ray from the origin at `deg` with a closed polygon (parametric segment intersection). */
function rayHit(poly: readonly (readonly [number, number])[], deg: number): number {
  const dx = Math.cos((deg * Math.PI) / 180)
  const dy = Math.sin((deg * Math.PI) / 180)
  let far = -1
  for (let i = 0; i < poly.length; i++) {
    const [x1, y1] = poly[i]!
    const [x2, y2] = poly[(i + 1) % poly.length]!
    const sx = x2 - x1
    const sy = y2 - y1
    const den = dx * sy - dy * sx
    if (den === 0) continue
    const t = (x1 * sy - y1 * sx) / den
    const u = (x1 * dy - y1 * dx) / den
    if (u >= -1e-9 && u <= 1 + 1e-9 && t > far) far = t
  }
  return far
}

describe('strip lengths', () => {
  it('quarter-ellipse length matches Ramanujan: a = 2, b = 1 gives 2.422105 (REFERENCES)', () => {
    // The library integrates the arc numerically; Ramanujan's formula is itself about 3 ppm short at
    // a/b = 2, so agreement is to 1e-5 (toBeCloseTo 4 digits: |diff| < 5e-5), and the gap is below 1e-5.
    const quarter = profileLength(2, 1, 'quarter-ellipse')
    expect(quarter).toBeCloseTo(2.422105, 4)
    expect(Math.abs(quarter - 2.422105)).toBeLessThan(1e-5)
    // The complete elliptic integral gives 9.6884482 for the whole ellipse (value from memory): 2.4221121 a quarter.
    expect(quarter).toBeCloseTo(9.6884482 / 4, 6)
    // Scaled to shop sizes and other aspect ratios, against the formula itself. Ramanujan's first
    // formula drifts short as the ellipse flattens (about 0.4 % at the flat limit, from memory), so 5:1 allows 3e-4.
    for (const [a, b] of [[200, 100], [120, 150], [300, 60], [50, 50]] as const) {
      const quarter = ramanujanPerimeter(a, b) / 4
      expect(Math.abs(profileLength(a, b, 'quarter-ellipse') - quarter) / quarter).toBeLessThan(3e-4)
    }
    // A circle (a = b) has the exact quarter pi r / 2 (plain geometry).
    expect(profileLength(80, 80, 'quarter-ellipse')).toBeCloseTo((Math.PI * 80) / 2, 6)
  })

  it('straight strips follow Pythagoras: 3-4-5 and the built strips', () => {
    expect(profileLength(300, 400, 'straight')).toBeCloseTo(500, 9)
    const plate = buildPlate(presetParams(PRESETS[0]!.id)!)
    const { strips } = skirtStrips(plate, { height: 152.4, profile: 'straight' })
    for (const s of strips) expect(s.length).toBeCloseTo(Math.sqrt(s.run ** 2 + s.rise ** 2), 6)
    for (const s of strips) expect(s.lean).toBeCloseTo((Math.atan2(s.rise, s.run) * 180) / Math.PI, 6)
  })

  it('the eased blend lies between the straight strip and the quarter ellipse (a chord is shortest; convexity)', () => {
    const line = profileLength(200, 120, 'straight')
    const ell = profileLength(200, 120, 'quarter-ellipse')
    const eased = profileLength(200, 120, 'eased')
    expect(eased).toBeGreaterThan(line)
    expect(eased).toBeLessThan(ell)
  })
})

describe('stations and runs', () => {
  for (const preset of PRESETS) {
    it(`${preset.id}: each run is the outline radius less the tube radius along the station's ray`, () => {
      const plate = buildPlate(presetParams(preset.id)!)
      const { strips } = skirtStrips(plate)
      expect(strips.length).toBeGreaterThan(3)
      for (const s of strips) {
        const expected = rayHit(plate.outline, s.angle) - plate.params.tubeDiameter / 2
        expect(Math.abs(s.run - expected)).toBeLessThan(0.05)
      }
    })

    it(`${preset.id}: stations cover the whole edge with no gap wider than a strip`, () => {
      const plate = buildPlate(presetParams(preset.id)!)
      const width = 76.2
      const { strips } = skirtStrips(plate, { stripWidth: width, overlap: 19.05 })
      // Walk the outline independently: arc position of each station by projecting it on its segment.
      const ring = plate.outline
      const cum = [0]
      for (let i = 0; i < ring.length; i++) {
        const [x1, y1] = ring[i]!
        const [x2, y2] = ring[(i + 1) % ring.length]!
        cum.push(cum[i]! + Math.hypot(x2 - x1, y2 - y1))
      }
      const perimeter = cum[ring.length]!
      const arcOf = (p: readonly [number, number]): number => {
        let best = Infinity
        let pos = 0
        for (let i = 0; i < ring.length; i++) {
          const [x1, y1] = ring[i]!
          const [x2, y2] = ring[(i + 1) % ring.length]!
          const L2 = (x2 - x1) ** 2 + (y2 - y1) ** 2 || 1
          const u = Math.max(0, Math.min(1, ((p[0] - x1) * (x2 - x1) + (p[1] - y1) * (y2 - y1)) / L2))
          const d = Math.hypot(x1 + u * (x2 - x1) - p[0], y1 + u * (y2 - y1) - p[1])
          if (d < best) {
            best = d
            pos = cum[i]! + u * Math.sqrt(L2)
          }
        }
        return pos
      }
      const arcs = strips.map((s) => arcOf(s.at)).sort((a, b) => a - b)
      let widest = arcs[0]! + perimeter - arcs[arcs.length - 1]!
      for (let i = 1; i < arcs.length; i++) widest = Math.max(widest, arcs[i]! - arcs[i - 1]!)
      expect(widest).toBeLessThanOrEqual(width)
      expect(widest).toBeGreaterThan(0)
    })
  }

  it('stations are closer where the edge turns fast (a lobe tip) than along a gentle edge (a plain round plate)', () => {
    const round = buildPlate(plateParamsSchema.parse({ lobes: { count: 0, irregularity: 0, valley: 150 } }))
    const lobed = buildPlate(plateParamsSchema.parse({ lobes: { count: 6, reach: 200, width: 60, roundness: 0, irregularity: 0 } }))
    const perStation = (p: typeof round) => { const r = skirtStrips(p); return r.perimeter / r.strips.length }
    // A round plate of radius ~ 310 mm: a 57 mm pitch stands off 57^2 / (8 * 310) ~ 1.3 mm < 3 mm, so the full pitch is kept.
    expect(perStation(round)).toBeGreaterThan(50)
    expect(perStation(lobed)).toBeLessThan(perStation(round))
  })

  it('a fixed count gives exactly that many stations, numbered from the clocking axis', () => {
    const plate = buildPlate(plateParamsSchema.parse({}))
    const { strips } = skirtStrips(plate, { count: 24 })
    expect(strips.map((s) => s.number)).toEqual(Array.from({ length: 24 }, (_, i) => i + 1))
    const first = strips[0]!.angle
    const axis = ((plate.params.rotation % 360) + 360) % 360
    expect(Math.min(Math.abs(first - axis), 360 - Math.abs(first - axis))).toBeLessThan(0.01)
  })

  it('rise is one height, or interpolated by run from the crotches up to the roots', () => {
    const plate = buildPlate(plateParamsSchema.parse({}))
    const even = skirtStrips(plate, { height: 100 })
    for (const s of even.strips) expect(s.rise).toBe(100)
    const roots = skirtStrips(plate, { height: 100, rootHeight: 250 }).strips
    const longest = roots.reduce((a, b) => (b.run > a.run ? b : a))
    const shortest = roots.reduce((a, b) => (b.run < a.run ? b : a))
    expect(longest.rise).toBeCloseTo(250, 9)
    expect(shortest.rise).toBeCloseTo(100, 9)
    for (const s of roots) {
      const t = (s.run - shortest.run) / (longest.run - shortest.run)
      expect(s.rise).toBeCloseTo(100 + 150 * t, 6)
    }
  })
})

/** Arc walker written here, apart from the library's: the point at arc length s along a closed polygon. */
function walker(ring: readonly (readonly [number, number])[]) {
  const cum = [0]
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = ring[i]!
    const [x2, y2] = ring[(i + 1) % ring.length]!
    cum.push(cum[i]! + Math.hypot(x2 - x1, y2 - y1))
  }
  const perimeter = cum[ring.length]!
  const at = (s: number): [number, number] => {
    s = ((s % perimeter) + perimeter) % perimeter
    let i = 0
    while (cum[i + 1]! < s) i++
    const [x1, y1] = ring[i]!
    const [x2, y2] = ring[(i + 1) % ring.length]!
    const t = (s - cum[i]!) / (cum[i + 1]! - cum[i]! || 1)
    return [x1 + (x2 - x1) * t, y1 + (y2 - y1) * t]
  }
  const arcOf = (p: readonly [number, number]): number => {
    let best = Infinity
    let pos = 0
    for (let i = 0; i < ring.length; i++) {
      const [x1, y1] = ring[i]!
      const [x2, y2] = ring[(i + 1) % ring.length]!
      const L2 = (x2 - x1) ** 2 + (y2 - y1) ** 2 || 1
      const u = Math.max(0, Math.min(1, ((p[0] - x1) * (x2 - x1) + (p[1] - y1) * (y2 - y1)) / L2))
      const d = Math.hypot(x1 + u * (x2 - x1) - p[0], y1 + u * (y2 - y1) - p[1])
      if (d < best) { best = d; pos = cum[i]! + u * Math.sqrt(L2) }
    }
    return pos
  }
  return { perimeter, at, arcOf }
}

describe('a fixed station count that leaves bare edge (issue 23, item 14)', () => {
  // A round plate: no lobes, valley 150 mm on the default 12-1/2 in tube, so radius R = 158.75 + 150 = 308.75 mm
  // and a perimeter of 2 pi R = 1939.9 mm (plain geometry; the outline polygon is a hair shorter).
  const round = buildPlate(plateParamsSchema.parse({ lobes: { count: 0, irregularity: 0, valley: 150 } }))
  const R = 308.75
  const width = 76.2

  it('12 stations on a 1939.9 mm edge stand 161.7 mm apart: a warning with the gap and 85.5 mm of bare edge (hand sums)', () => {
    const r = skirtStrips(round, { count: 12, stripWidth: width, overlap: 19.05 })
    // Hand: 2 pi 308.75 / 12 = 161.66 mm; bare = 161.66 - 76.2 = 85.46 mm. The stations follow the automatic
    // density, which on a circle is even to within the closing step, so allow 1 %.
    expect(r.bareEdge).not.toBeNull()
    expect(r.bareEdge!.gap).toBeGreaterThan(0.99 * (2 * Math.PI * R) / 12)
    expect(r.bareEdge!.gap).toBeLessThan(1.01 * (2 * Math.PI * R) / 12)
    expect(r.bareEdge!.bare).toBeCloseTo(r.bareEdge!.gap - width, 9)
    // Neighbouring station numbers, the last one wrapping to the first.
    expect(Math.abs(r.bareEdge!.before - r.bareEdge!.after) === 1 || (r.bareEdge!.after === 12 && r.bareEdge!.before === 1)).toBe(true)
  })

  it('the threshold is one strip width: 25 stations (77.6 mm apart) warn, 26 (74.6 mm) do not (2 pi R / n by hand)', () => {
    expect(skirtStrips(round, { count: 25, stripWidth: width, overlap: 19.05 }).bareEdge).not.toBeNull()
    expect(skirtStrips(round, { count: 26, stripWidth: width, overlap: 19.05 }).bareEdge).toBeNull()
  })

  for (const preset of PRESETS) {
    it(`${preset.id}: automatic spacing never leaves bare edge`, () => {
      expect(skirtStrips(buildPlate(presetParams(preset.id)!)).bareEdge).toBeNull()
    })
  }
})

describe("each strip's two sides (issue 23, item 14)", () => {
  it('on a round plate both sides are equal, by the law of cosines and Pythagoras (hand sums)', () => {
    const plate = buildPlate(plateParamsSchema.parse({ lobes: { count: 0, irregularity: 0, valley: 150 } }))
    const { strips } = skirtStrips(plate, { height: 127, stripWidth: 76.2, overlap: 19.05, profile: 'straight' })
    // Foot corners half a width along the edge (angle 38.1 / 308.75 either side), top corners half a width round
    // the tube (38.1 / 158.75): in plan they are sqrt(R^2 + ro^2 - 2 R ro cos(dphi)) apart, then up 127 mm.
    const R = 308.75
    const ro = 158.75
    const dphi = 38.1 / R - 38.1 / ro
    const plan = Math.sqrt(R * R + ro * ro - 2 * R * ro * Math.cos(dphi))
    const side = Math.hypot(plan, 127)
    // dphi = 0.12340 - 0.24000 = -0.11660 rad; plan = 152.20 mm; side = hypot(152.20, 127) = 198.2 mm (by hand).
    // The outline polygon stands a hair inside the circle, so each built side may differ by 0.3 mm.
    expect(side).toBeCloseTo(198.2, 0)
    for (const s of strips) {
      expect(Math.abs(s.sides[0] - side)).toBeLessThan(0.3)
      expect(Math.abs(s.sides[1] - side)).toBeLessThan(0.3)
    }
  })

  it('a strip leaning across a root flank is longer on its outer side; each side is Pythagoras on corners found here', () => {
    // Six long even roots on a 12 in tube: the flanks run steeply outward.
    const plate = buildPlate(plateParamsSchema.parse({ tubeDiameter: 304.8, rotation: 0, lobes: { count: 6, reach: 250, width: 70, irregularity: 0 } }))
    const width = 76.2
    const rise = 150
    const { strips } = skirtStrips(plate, { height: rise, stripWidth: width, overlap: 19.05, profile: 'straight' })
    const w = walker(plate.outline)
    const ro = plate.params.tubeDiameter / 2
    let lopsided = 0
    for (const s of strips) {
      const arc = w.arcOf(s.at)
      const landing = Math.atan2(s.at[1], s.at[0])
      const sides = [-1, 1].map((dir) => {
        const foot = w.at(arc + (dir * width) / 2)
        const top: [number, number] = [ro * Math.cos(landing + (dir * width) / 2 / ro), ro * Math.sin(landing + (dir * width) / 2 / ro)]
        // Pythagoras in three dimensions: plan offset, then the rise.
        return { length: Math.hypot(top[0] - foot[0], top[1] - foot[1], rise), footRadius: Math.hypot(foot[0], foot[1]) }
      })
      expect(Math.abs(s.sides[0] - sides[0]!.length)).toBeLessThan(0.05)
      expect(Math.abs(s.sides[1] - sides[1]!.length)).toBeLessThan(0.05)
      expect(s.longestSide).toBeCloseTo(Math.max(s.length, sides[0]!.length, sides[1]!.length), 6)
      if (Math.abs(sides[0]!.length - sides[1]!.length) > 25) {
        lopsided++
        // The longer side is the one whose foot stands further out along the flank.
        const outer = sides[0]!.footRadius > sides[1]!.footRadius ? 0 : 1
        expect(s.sides[outer]).toBeGreaterThan(s.sides[1 - outer]!)
        expect(s.longestSide).toBeGreaterThan(s.length + 10)
      }
    }
    // Each of the 6 roots has two flanks with strips across them.
    expect(lopsided).toBeGreaterThanOrEqual(12)
    // The cut list lists every strip at its longest side, rounded up to 1/8 in (3.175 mm).
    const rows = skirtCutList(strips, 'in')
    for (const s of strips) {
      const row = rows.find((r) => r.stations.includes(s.number))!
      expect(row.length).toBeGreaterThanOrEqual(s.longestSide - 1e-9)
      expect(row.length - s.longestSide).toBeLessThan(3.175)
    }
  })
})

describe('cut list', () => {
  const fake = (number: number, longestSide: number) => ({ number, longestSide })

  it('groups by length rounded up to 1/8 in (3.175 mm) or 5 mm, with totals', () => {
    const strips = [fake(1, 100.1), fake(2, 101.5), fake(3, 103.2), fake(4, 100.0)]
    const inch = skirtCutList(strips, 'in')
    // 100.0 / 3.175 = 31.50 -> 32 steps = 101.6; 100.1 and 101.5 also round up to 101.6; 103.2 -> 33 steps = 104.775.
    expect(inch).toEqual([
      { length: 33 * 3.175, count: 1, stations: [3] },
      { length: 32 * 3.175, count: 3, stations: [1, 2, 4] },
    ])
    const mm = skirtCutList(strips, 'mm')
    // 100.1, 101.5, 103.2 round up to 105 mm; 100.0 is exactly 20 steps of 5 mm.
    expect(mm.map((r) => [r.length, r.count])).toEqual([[105, 3], [100, 1]])
    // Hand sums: 3 x 105 + 100 = 415 mm running; 415 x 50 mm wide = 20 750 mm2.
    expect(skirtTotals(mm, 50)).toEqual({ count: 4, runningLength: 415, sheetArea: 20750 })
  })

  it('settings reject an overlap as wide as the strip with a field message', () => {
    const r = plateParamsSchema.safeParse({ skirt: { stripWidth: 50, overlap: 50 } })
    expect(r.success).toBe(false)
    expect(r.error!.issues[0]!.path).toEqual(['skirt', 'overlap'])
  })

  it('an old revision without skirt settings parses to the defaults', () => {
    const p = plateParamsSchema.parse({ tubeDiameter: 300 })
    expect(p.skirt.profile).toBe('quarter-ellipse')
    expect(p.skirt.count).toBeNull()
  })
})

describe('contract (CONTRACTS.md)', () => {
  it('skirtStrips(plate, { height, count, profile }) gives { strips: { angle, run, rise, length }[] } in degrees and mm', async () => {
    const geometry = await import('../../../geometry')
    const plate = geometry.buildPlate(geometry.plateParamsSchema.parse({}))
    const { strips } = geometry.skirtStrips(plate, { height: 150, count: 12, profile: 'straight' })
    expect(strips).toHaveLength(12)
    for (const s of strips) {
      expect(s.angle).toBeGreaterThanOrEqual(0)
      expect(s.angle).toBeLessThan(360)
      expect(s.rise).toBe(150)
      // Pythagoras.
      expect(s.length).toBeCloseTo(Math.hypot(s.run, 150), 6)
    }
  })
})

// Shop math checked against values from outside the project (REFERENCES.md,
// "Rolling stability" and the second-round table). Expected values are worked
// by hand here, never read from the code under test.

import { describe, expect, it } from 'vitest'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema, type PlateParamsInput } from '../../../geometry/params'
import {
  analyseUnit, blockMass, blockPassage, blockPasses, supportPolygon, tipping, unitSchema, unitStability, floorTouch,
} from '../../../geometry/stability'

const IN = 25.4
const G = 9.80665 // standard gravity, CGPM 1901
const DEG = Math.PI / 180
type P = [number, number]

/** Kingpins evenly round a circle of radius r (mm), the first at `start` degrees. */
function ring(n: number, r: number, start = 90): P[] {
  return Array.from({ length: n }, (_, k) => [r * Math.cos((start + (k * 360) / n) * DEG), r * Math.sin((start + (k * 360) / n) * DEG)] as P)
}

/** A symmetric plate (no irregularity) with its kingpins on a 12 in radius. */
function plateWith(input: PlateParamsInput) {
  return buildPlate(plateParamsSchema.parse({ tubeDiameter: 700, casterOffset: 12 * IN, pocketDiameter: 100, lobes: { irregularity: 0 }, ...input }))
}

describe('worked values: kingpins on a 12 in radius, centre of mass at 36 in (REFERENCES "Rolling stability": statics, Meriam & Kraige; swivel lead moves the polygon inward)', () => {
  const cases = [
    { n: 3, lead: 0, d: 6.0, angle: 9.46 },
    { n: 3, lead: 1.5, d: 4.5, angle: 7.13 },
    { n: 4, lead: 0, d: 8.485, angle: 13.26 },
    { n: 4, lead: 1.5, d: 6.985, angle: 10.98 },
  ]

  for (const c of cases) {
    it(`hand-made layout: ${c.n} casters, lead ${c.lead} in -> d ${c.d} in, ${c.angle} deg`, () => {
      const support = supportPolygon(ring(c.n, 12 * IN), c.lead * IN)
      const t = tipping(support, 0, 0, 36 * IN)
      expect(t.distance / IN).toBeCloseTo(c.d, 3)
      expect(t.angle).toBeCloseTo(c.angle, 2)
    })

    it(`hand-made layout turned 17 deg and moved: ${c.n} casters, lead ${c.lead} in still gives ${c.angle} deg`, () => {
      const pins = ring(c.n, 12 * IN, 17).map(([x, y]) => [x + 400, y - 250] as P)
      const t = tipping(supportPolygon(pins, c.lead * IN), 400, -250, 36 * IN)
      expect(t.angle).toBeCloseTo(c.angle, 2)
    })

    it(`unitStability on a built plate: ${c.n} casters, lead ${c.lead} in -> ${c.angle} deg (a load so heavy the plate's own weight is negligible)`, () => {
      const plate = plateWith({ casterCount: c.n, caster: { swivelLead: c.lead * IN } })
      const s = unitStability(plate, { loadWeight: 1e7, loadHeight: 36 * IN })
      expect(s.centreOfMassHeight / IN).toBeCloseTo(36, 3)
      expect(s.supportDistance / IN).toBeCloseTo(c.d, 3)
      expect(s.tippingAngle).toBeCloseTo(c.angle, 2)
    })
  }

  it('a lead larger than the kingpin polygon leaves no guaranteed support (follows from the criterion)', () => {
    const support = supportPolygon(ring(3, 12 * IN), 7 * IN)
    expect(support.polygon).toEqual([])
    expect(tipping(support, 0, 0, 36 * IN).distance).toBeLessThan(0)
  })
})

describe('weight and push (REFERENCES second round: W = m g, CGPM 1901; "Rolling stability": tips when F H > W d)', () => {
  const plate = plateWith({ casterCount: 3, caster: { swivelLead: 0 } })

  it('W = m g with standard gravity 9.80665 m/s2, the plate weight added to the load', () => {
    const s = unitStability(plate, { loadWeight: 100, loadHeight: 36 * IN })
    expect(s.totalWeight).toBeCloseTo(100 + plate.metrics.weight, 9)
    expect(s.weightNewtons).toBeCloseTo((100 + plate.metrics.weight) * G, 6)
  })

  it('F = W d / H: 3 casters on 12 in (d = 6 in, the inscribed radius R cos 60 deg), pushed at 1.5 m', () => {
    const s = unitStability(plate, { loadWeight: 100, loadHeight: 36 * IN, pushHeight: 1500 })
    const W = (100 + plate.metrics.weight) * G
    expect(s.tippingPush).toBeCloseTo((W * 6 * IN) / 1500, 1)
    // Pushed twice as high, half the push tips it.
    expect(unitStability(plate, { loadWeight: 100, loadHeight: 36 * IN, pushHeight: 3000 }).tippingPush).toBeCloseTo((W * 6 * IN) / 3000, 1)
  })

  it('combined centre of mass is the mass-weighted mean of the parts (statics)', () => {
    const s = unitStability(plate, { loadWeight: 50, loadHeight: 1000, counterweight: 30, counterweightHeight: 100 })
    const m = plate.metrics
    const plateHeight = m.floorGap + m.thickness / 2
    const expected = (50 * 1000 + 30 * 100 + m.weight * plateHeight) / (80 + m.weight)
    expect(s.centreOfMassHeight).toBeCloseTo(expected, 6)
    expect(s.tippingAngle).toBeCloseTo(Math.atan(6 * IN / expected) / DEG, 2)
  })

  it('rolling push 1-3 % of the weight (common practice, from memory)', () => {
    const s = unitStability(plate, { loadWeight: 100, loadHeight: 900 })
    const W = (100 + plate.metrics.weight) * G
    expect(s.rollingPush.low).toBeCloseTo(0.01 * W, 6)
    expect(s.rollingPush.high).toBeCloseTo(0.03 * W, 6)
  })
})

describe('load per caster by the n - 1 rule (REFERENCES: caster makers\' selection guidance; common practice)', () => {
  for (const [n, shared] of [[3, 3], [4, 3], [5, 4], [6, 5], [8, 7]] as const) {
    it(`${n} casters: the weight shared by ${shared}`, () => {
      const plate = plateWith({ casterCount: n, tubeDiameter: 1000, casterOffset: 400 })
      const s = unitStability(plate, { loadWeight: 300, loadHeight: 900, hardwareWeight: 12 })
      expect(s.loadPerCaster).toBeCloseTo((300 + 12 + plate.metrics.weight) / shared, 9)
    })
  }

  it('a caster over its rating is a finding', () => {
    const plate = plateWith({ casterCount: 4, unit: { load: { weight: 400 }, casterRating: 100 } })
    const a = analyseUnit(plate)
    expect(a.findings.map((f) => f.code)).toContain('caster-overload')
    const light = plateWith({ casterCount: 4, unit: { load: { weight: 100 }, casterRating: 100 } })
    expect(analyseUnit(light).findings.map((f) => f.code)).not.toContain('caster-overload')
  })
})

describe('steel counterweight (REFERENCES: 7850 kg/m3, EN 1991-1-1 Table A.4)', () => {
  it('a 2 x 4 x 4 in steel block (32 in3) weighs about 4.12 kg, 9.1 lb', () => {
    const kg = blockMass({ length: 4 * IN, width: 4 * IN, thickness: 2 * IN }, 7850)
    expect(kg).toBeCloseTo(4.12, 2)
    expect(kg / 0.45359237).toBeCloseTo(9.1, 1)
  })

  it('the saved unit defaults to steel blocks of that size', () => {
    const a = analyseUnit(plateWith({}))
    expect(a.block.density).toBe(7850)
    expect(a.block.mass).toBeCloseTo(4.12, 2)
  })
})

describe('a block passes a round opening when its smallest cross-section\'s diagonal is less than the opening (REFERENCES second round: geometry)', () => {
  const block = { length: 4 * IN, width: 4 * IN, thickness: 2 * IN }

  it('2 x 4 in section: diagonal 4.47 in', () => {
    expect(blockPassage(block) / IN).toBeCloseTo(Math.sqrt(20), 6)
    expect(blockPassage(block) / IN).toBeCloseTo(4.47, 2)
    expect(blockPasses(block, 4.5 * IN)).toBe(true)
    expect(blockPasses(block, 4.25 * IN)).toBe(false)
  })

  it('finding when loaded blocks cannot go in or come out through the access openings', () => {
    const small = plateWith({ tubeDiameter: 24 * IN, casterOffset: 9 * IN, access: { diameter: 4.25 * IN, offset: 6 * IN }, unit: { counterweight: { count: 2 } } })
    const codes = analyseUnit(small).findings.map((f) => f.code)
    expect(codes).toContain('counterweight-passage')
    const wide = plateWith({ tubeDiameter: 24 * IN, casterOffset: 9 * IN, access: { diameter: 4.5 * IN, offset: 6 * IN }, unit: { counterweight: { count: 2 } } })
    expect(analyseUnit(wide).findings.map((f) => f.code)).not.toContain('counterweight-passage')
    const none = plateWith({ tubeDiameter: 24 * IN, casterOffset: 9 * IN, access: { enabled: false }, unit: { counterweight: { count: 2 } } })
    expect(analyseUnit(none).findings.map((f) => f.code)).toContain('counterweight-passage')
  })
  // Blocks that fit, and every spot checked: tests/unit/stability/counterweight.test.ts.
})

describe('counterweight needed for a target angle or push', () => {
  const base = { tubeDiameter: 30 * IN, casterCount: 4, casterOffset: 11 * IN, access: { diameter: 5 * IN, offset: 7 * IN } }

  it('the number of blocks found reaches the target and one fewer does not (statics, recomputed per count)', () => {
    const plate = plateWith({ ...base, unit: { load: { weight: 40, height: 60 * IN }, targetAngle: 12 } })
    const a = analyseUnit(plate)
    expect(a.blocksForAngle).not.toBeNull()
    const k = a.blocksForAngle!
    expect(k).toBeGreaterThan(0)
    const at = (count: number) => analyseUnit(plateWith({ ...base, unit: { load: { weight: 40, height: 60 * IN }, targetAngle: 12, counterweight: { count } } })).stability.tippingAngle
    expect(at(k)).toBeGreaterThanOrEqual(12)
    expect(at(k - 1)).toBeLessThan(12)
  })

  it('push check by the IEC 62368-1 analogy: 13 % of the weight, at most 100 N', () => {
    const plate = plateWith({ ...base, unit: { load: { weight: 40, height: 60 * IN } } })
    const a = analyseUnit(plate)
    expect(a.checkPush).toBeCloseTo(Math.min(0.13 * a.stability.weightNewtons, 100), 9)
    const heavy = analyseUnit(plateWith({ ...base, unit: { load: { weight: 400, height: 60 * IN } } }))
    expect(heavy.checkPush).toBe(100)
  })
})

describe('a root reaching the floor while the unit leans (geometry: a point r beyond the turning line, g above the floor, lands at atan(g / r))', () => {
  it('matches a hand computation over the outline for 3 casters without lead', () => {
    const plate = plateWith({ casterCount: 3, caster: { swivelLead: 0 } })
    const s = unitStability(plate, { loadWeight: 50, loadHeight: 900 })
    // The three sides lie 6 in from the centre, facing away from each kingpin (rotation 90: kingpins at 90, 210, 330 deg).
    let best = 90
    for (const facing of [270, 30, 150]) {
      const nx = Math.cos(facing * DEG)
      const ny = Math.sin(facing * DEG)
      const reach = Math.max(...plate.outline.map(([x, y]) => nx * x + ny * y)) - 6 * IN
      best = Math.min(best, Math.atan(plate.metrics.floorGap / reach) / DEG)
    }
    expect(s.rootTouchAngle).toBeCloseTo(best, 6)
    expect(floorTouch(supportPolygon(ring(3, 12 * IN), 0), plate.outline, plate.metrics.floorGap).angle).toBeCloseTo(best, 6)
  })
})

describe('the unit saved with each revision', () => {
  it('an old revision without a unit still parses, with the defaults', () => {
    const old = plateParamsSchema.parse({ tubeDiameter: 400 })
    expect(old.unit).toEqual(unitSchema.parse({}))
    expect(old.unit.counterweight.material).toBe('steel')
    expect(old.unit.targetAngle).toBe(10)
    expect(old.unit.pushHeight).toBe(1500)
  })

  it('refuses impossible values with field paths', () => {
    const r = plateParamsSchema.safeParse({ unit: { load: { weight: -1 }, counterweight: { count: 1.5 } } })
    expect(r.success).toBe(false)
    const paths = r.success ? [] : r.error.issues.map((i) => i.path.join('.'))
    expect(paths).toContain('unit.load.weight')
    expect(paths).toContain('unit.counterweight.count')
  })

  it('built mode: the tube by length and wall (annulus area x length x density, worked by hand)', () => {
    const plate = plateWith({ tubeDiameter: 12.5 * IN, tubeWall: 0.25 * IN, casterOffset: 170, unit: { load: { mode: 'built', tubeLength: 96 * IN, tubeDensity: 700, cladding: 5, props: 3, propsHeight: 1800 } } })
    const a = analyseUnit(plate)
    const D = 12.5 * 0.0254
    const d = 12 * 0.0254
    const tube = (Math.PI / 4) * (D * D - d * d) * 96 * 0.0254 * 700
    expect(a.load.tube).toBeCloseTo(tube, 6)
    expect(a.load.weight).toBeCloseTo(tube + 8, 6)
    const top = plate.metrics.floorGap + plate.metrics.thickness
    expect(a.load.height).toBeCloseTo(((tube + 5) * (top + 48 * IN) + 3 * 1800) / (tube + 8), 6)
  })
})

// Areas and lengths checked against outside values: MathWorld's circle-circle
// intersection, plain circle geometry, and two independent polygon engines
// from npm (clipper2-ts and polygon-clipping) run on the built outlines.

import { describe, expect, it } from 'vitest'
import { Clipper, FillRule, type PathD } from 'clipper2-ts'
import polygonClipping from 'polygon-clipping'
import { lensArea, unionArea } from '../../../geometry/math/circles'
import { buildPlate, plateOutlineShape } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'
import { presetParams } from '../../../geometry/presets'
import { circleRing, shoelace } from './helpers'

const toPathD = (ring: readonly (readonly [number, number])[]): PathD => ring.map(([x, y]) => ({ x, y }))

/** Net area by clipper2-ts: the outline minus the union of the holes, each flattened to 2048 sides. */
function clipperNetArea(plate: ReturnType<typeof buildPlate>): number {
  const holes = plate.holes.map((h) => toPathD(circleRing(h.x, h.y, h.diameter / 2)))
  const net = Clipper.differenceD([toPathD(plate.outline)], holes, FillRule.NonZero, 6)
  return Clipper.areaPathsD(net)
}

/** Net area by polygon-clipping, with its output measured by the shoelace formula (rings closed; holes wound the other way). */
function polygonClippingNetArea(plate: ReturnType<typeof buildPlate>): number {
  const outline = [plate.outline.map(([x, y]) => [x, y] as [number, number])]
  const holes = plate.holes.map((h) => [circleRing(h.x, h.y, h.diameter / 2)])
  const result = polygonClipping.difference(outline, ...holes)
  let area = 0
  for (const polygon of result) {
    polygon.forEach((ring, i) => {
      const a = Math.abs(shoelace(ring.slice(0, -1)))
      area += i === 0 ? a : -a
    })
  }
  return area
}

// A 2048-gon falls short of its circle by the factor sin(2 pi/n) n / (2 pi)
// (regular polygon area n R^2 sin(2 pi / n) / 2): about 1.6e-6, far inside these tolerances.
const REL = 2e-5

describe('circle-circle intersection (Weisstein, "Circle-Circle Intersection", MathWorld)', () => {
  it('gives the lens of two unit circles one radius apart: 1.228370', () => {
    expect(lensArea(1, 1, 1)).toBeCloseTo(1.22837, 6)
  })
  it('gives their union: 5.054816', () => {
    expect(unionArea([{ x: 0, y: 0, radius: 1 }, { x: 1, y: 0, radius: 1 }])).toBeCloseTo(5.054816, 6)
  })
  it('gives a full small circle when nested and nothing when apart', () => {
    expect(lensArea(3, 1, 1.5)).toBeCloseTo(Math.PI, 12)
    expect(lensArea(1, 1, 2.0001)).toBe(0)
  })
  it('agrees with clipper2-ts on unequal overlapping circles', () => {
    const a = circleRing(0, 0, 50)
    const b = circleRing(60, 10, 30)
    const engine = Clipper.areaPathsD(Clipper.intersectD([toPathD(a)], [toPathD(b)], FillRule.NonZero, 6))
    expect(lensArea(50, 30, Math.hypot(60, 10))).toBeCloseTo(engine, 1)
  })
})

describe('net plate area against independent polygon engines', () => {
  it.each(['default', 'gnarled-oak', 'banyan-sprawl', 'river-stone'])('%s: outline minus holes matches clipper2-ts', (name) => {
    const params = name === 'default' ? plateParamsSchema.parse({}) : presetParams(name)!
    const plate = buildPlate(params)
    const engine = clipperNetArea(plate)
    expect(Math.abs(plate.metrics.area - engine) / engine).toBeLessThan(REL)
  })

  it('subtracts overlapping holes once (the lens), matching polygon-clipping', () => {
    // Large access openings run into the pockets: the area must not count the shared part twice.
    const params = plateParamsSchema.parse({ access: { diameter: 152.4, offset: 120 } })
    const plate = buildPlate(params)
    expect(plate.findings.map((f) => f.code)).toContain('holes-overlap')
    const engine = polygonClippingNetArea(plate)
    expect(Math.abs(plate.metrics.area - engine) / engine).toBeLessThan(REL)
    // And the overlap really matters at this size: subtracting the plain sum would miss by more.
    const naive = shoelace(plate.outline) - plate.holes.reduce((s, h) => s + (Math.PI * h.diameter ** 2) / 4, 0)
    expect(Math.abs(naive - engine) / engine).toBeGreaterThan(100 * REL)
  })
})

describe('a plate that is a plain circle (standard circle geometry)', () => {
  // No lobes, no irregularity and a valley wide enough to hold every pocket with its minimum wood
  // (pocket reaches 170 + 98.4 + 19 = 287.7 mm; the valley line is at 158.75 + 150 = 308.75 mm):
  // the outline is the circle r = tube/2 + valley.
  const params = plateParamsSchema.parse({ lobes: { count: 0, irregularity: 0, valley: 150 } })
  const plate = buildPlate(params)
  const r = params.tubeDiameter / 2 + 150

  it('has area pi r^2 less the holes, within the chord tolerance', () => {
    const holes = plate.holes.reduce((s, h) => s + (Math.PI * h.diameter ** 2) / 4, 0)
    // Chords 0.1 mm inside the circle cost at most 0.1 mm times the circumference.
    expect(Math.abs(plate.metrics.area - (Math.PI * r * r - holes))).toBeLessThan(0.1 * 2 * Math.PI * r)
    expect(plate.metrics.area).toBeLessThan(Math.PI * r * r - holes)
  })
  it('has perimeter 2 pi r within the chord tolerance, and width and height 2r', () => {
    expect(plate.metrics.perimeter).toBeLessThan(2 * Math.PI * r)
    expect(plate.metrics.perimeter).toBeGreaterThan(2 * Math.PI * r * (1 - 1e-4))
    expect(plate.metrics.width).toBeCloseTo(2 * r, 1)
    expect(plate.metrics.height).toBeCloseTo(2 * r, 1)
    expect(plate.metrics.enclosingCircle.radius).toBeCloseTo(r, 1)
  })
})

describe('outline perimeter against the arc length of the curve', () => {
  it.each(['default', 'gnarled-oak', 'banyan-sprawl'])('%s: polygon perimeter is just under the integral of sqrt(r^2 + r\'^2)', (name) => {
    const params = name === 'default' ? plateParamsSchema.parse({}) : presetParams(name)!
    const plate = buildPlate(params)
    const shape = plateOutlineShape(params)
    // Arc length by the midpoint rule on 200 000 steps, with the point-to-point distance (exact for the tiny steps).
    const steps = 200_000
    let length = 0
    let prev = shape.pointAt(0)
    for (let i = 1; i <= steps; i++) {
      const p = shape.pointAt((2 * Math.PI * i) / steps)
      length += Math.hypot(p[0] - prev[0], p[1] - prev[1])
      prev = p
    }
    expect(plate.metrics.perimeter).toBeLessThanOrEqual(length + 1e-6)
    // A chord of length L and sagitta s is shorter than its arc by about 8 s^2 / (3 L): with
    // s <= 0.1 mm on chords of a few mm that is a few parts in 10 000, never more.
    expect((length - plate.metrics.perimeter) / length).toBeLessThan(5e-4)
  })

  it('agrees with the perimeter of the ring clipper2-ts rebuilds from the outline', () => {
    const plate = buildPlate(plateParamsSchema.parse({}))
    const rebuilt = Clipper.unionD([toPathD(plate.outline)], [], FillRule.NonZero, 6)
    expect(rebuilt).toHaveLength(1)
    const ring = rebuilt[0]!
    let length = 0
    for (let i = 0; i < ring.length; i++) {
      const a = ring[i]!
      const b = ring[(i + 1) % ring.length]!
      length += Math.hypot(b.x - a.x, b.y - a.y)
    }
    expect(plate.metrics.perimeter).toBeCloseTo(length, 1)
    expect(Clipper.areaD(ring)).toBeCloseTo(shoelace(plate.outline), 0)
  })
})

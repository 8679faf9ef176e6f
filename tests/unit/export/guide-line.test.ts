// The router pattern line for a guide bushing. Offsets from router pattern
// practice (REFERENCES.md: the pattern is offset by (bushing outside diameter -
// bit diameter) / 2; common practice). Distances are measured here by plain
// point-to-segment geometry, never by the code under test.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { Hole, Plate, Point } from '../../../geometry/types'
import { buildPlate, plateParamsSchema, PRESETS } from '../../../geometry/index'
import { guideLine, guideOffset, guidePattern, routedOpenings } from '../../../geometry/export/guide-line'
import { acceptedParams, findSelfIntersection, segmentsIntersect } from '../geometry/helpers'
import { distanceToPolygon, fixturePlate } from './fixture'

const IN = 25.4 // mm per inch, exact (NIST SP 811)

/** Shortest distance from a point to any of the rings. */
function distanceToRings(p: Point, rings: Point[][]): number {
  return Math.min(...rings.map((r) => distanceToPolygon(p, r)))
}

/** Edges of two different rings that cross. */
function ringsCross(a: Point[], b: Point[]): boolean {
  for (let i = 0; i < a.length; i++) {
    for (let j = 0; j < b.length; j++) {
      if (segmentsIntersect(a[i]!, a[(i + 1) % a.length]!, b[j]!, b[(j + 1) % b.length]!)) return true
    }
  }
  return false
}

function preset(id: string): Plate {
  const p = PRESETS.find((x) => x.id === id)
  if (!p) throw new Error(`no preset ${id}`)
  return buildPlate(plateParamsSchema.parse(p.input))
}

/** Index ranges of the outline covered by the unreachable runs (matched by point identity). */
function markedPoints(plate: Pick<Plate, 'outline'>, runs: { holeId: string | null; points: Point[] }[]): Set<string> {
  const key = (p: Point) => `${p[0]},${p[1]}`
  const set = new Set<string>()
  for (const run of runs) if (run.holeId === null) for (const p of run.points) set.add(key(p))
  return set
}

describe('guideOffset', () => {
  it('is (bushing - bit) / 2: 5/8 in bushing, 1/2 in bit -> 1/16 in; 1-1/4 in bushing, 1/4 in bit -> 1/2 in (router pattern practice)', () => {
    expect(guideOffset({ bushing: (5 / 8) * IN, bit: 0.5 * IN })).toBeCloseTo(IN / 16, 9)
    expect(guideOffset({ bushing: 1.25 * IN, bit: 0.25 * IN })).toBeCloseTo(12.7, 9)
  })

  it('refuses a bushing no wider than its bit, or a bit of no size', () => {
    expect(() => guideOffset({ bushing: 10, bit: 12 })).toThrow(/wider than the bit/)
    expect(() => guideOffset({ bushing: 10, bit: 0 })).toThrow(/wider than the bit/)
    expect(() => guideOffset({ bushing: Number.NaN, bit: 6 })).toThrow(/wider than the bit/)
  })
})

describe('guideLine', () => {
  it('on a 300 mm round plate is the 300 - 12.7 mm circle for a 1-1/4 in bushing and 1/4 in bit (hand value)', () => {
    const plate = fixturePlate({ radius: 300, amplitude: 0 })
    const rings = guideLine(plate, { bushing: 31.75, bit: 6.35 })
    expect(rings).toHaveLength(1)
    for (const [x, y] of rings[0]!) expect(Math.abs(Math.hypot(x, y) - 287.3)).toBeLessThan(0.005)
  })

  it('gives different lines for different bushings: 1/16 in and 1/2 in inside a 300 mm circle', () => {
    const plate = fixturePlate({ radius: 300, amplitude: 0 })
    const small = guideLine(plate, { bushing: 15.875, bit: 12.7 })[0]!
    const large = guideLine(plate, { bushing: 31.75, bit: 6.35 })[0]!
    expect(Math.hypot(...small[0]!)).toBeCloseTo(300 - 1.5875, 2)
    expect(Math.hypot(...large[0]!)).toBeCloseTo(300 - 12.7, 2)
  })

  it('on the banyan starting shape with a 1-1/4 in bushing and a 1/4 in bit: no crossing, every point 1/2 in from the cut line', () => {
    const plate = preset('banyan-sprawl')
    const rings = guideLine(plate, { bushing: 1.25 * IN, bit: 0.25 * IN })
    expect(rings.length).toBeGreaterThan(0)
    for (const ring of rings) {
      expect(findSelfIntersection(ring)).toBeNull()
      for (const p of ring) {
        const d = distanceToPolygon(p, plate.outline)
        expect(d).toBeGreaterThan(12.7 - 0.1)
        expect(d).toBeLessThan(12.7 + 0.1)
      }
    }
  })

  it('drops a root too narrow for the bushing, and the pattern marks that root as out of reach', () => {
    // A 200 mm disc with a 15 mm wide root reaching to 280 mm: a 12.7 mm offset from both sides leaves none of it.
    const plate = discWithRoot(15)
    const rings = guideLine(plate, { bushing: 31.75, bit: 6.35 })
    expect(rings).toHaveLength(1)
    expect(Math.max(...rings[0]!.map((p) => p[0]))).toBeLessThan(200)
    const { unreachable } = guidePattern(plate, { bushing: 31.75, bit: 6.35 })
    const outside = unreachable.filter((r) => r.holeId === null)
    expect(outside).toHaveLength(1)
    // The run covers both sides and the end of the root: at least 2 * 80 + 15 mm less the bit of each side still reached.
    expect(outside[0]!.length).toBeGreaterThan(2 * 60 + 15)
    const tip: Point = [280, 0]
    expect(Math.min(...outside[0]!.points.map((p) => Math.hypot(p[0] - tip[0], p[1] - tip[1])))).toBeLessThan(8)
    // A root 30 mm wide keeps a 4.6 mm sliver of pattern: nothing is out of reach but its square corners.
    const wide = guidePattern(discWithRoot(30), { bushing: 31.75, bit: 6.35 })
    expect(wide.unreachable.filter((r) => r.holeId === null).every((r) => r.length < 30)).toBe(true)
  })
})

describe('guidePattern openings', () => {
  it('grows each routed opening by the offset: a 127 mm pocket gets a 127 + 2 * 12.7 mm pattern hole (hand value)', () => {
    const plate = fixturePlate({ radius: 500, amplitude: 0, casterOffset: 250 })
    const pattern = guidePattern(plate, { bushing: 31.75, bit: 6.35 })
    const pocket = plate.holes.find((h) => h.kind === 'pocket')!
    const around = pattern.rings.filter((r) => r.every(([x, y]) => Math.hypot(x - pocket.x, y - pocket.y) < 100))
    expect(around).toHaveLength(1)
    for (const [x, y] of around[0]!) expect(Math.abs(Math.hypot(x - pocket.x, y - pocket.y) - (63.5 + 12.7))).toBeLessThan(0.02)
    expect(pattern.unreachable).toHaveLength(0)
  })

  it('leaves out openings marked for a hole saw or a drill', () => {
    const plate = fixturePlate({ radius: 500, amplitude: 0, casterOffset: 250 })
    const holes = plate.holes.map((h) => (h.kind === 'access' ? ({ ...h, method: 'hole-saw' as const, sawSize: h.diameter }) : h))
    const routed = routedOpenings({ holes })
    expect(routed.map((h) => h.kind).sort()).toEqual(['pocket', 'pocket', 'pocket'])
  })

  it('marks a web between an opening and the edge thinner than twice the offset', () => {
    // Pocket edge at 230 + 63.5 = 293.5 mm on a 300 mm plate: a 6.5 mm web, under 2 * 12.7 mm.
    const plate = fixturePlate({ radius: 300, amplitude: 0, casterOffset: 230 })
    const { unreachable } = guidePattern(plate, { bushing: 31.75, bit: 6.35 })
    const onEdge = unreachable.filter((r) => r.holeId === null)
    const onPockets = unreachable.filter((r) => r.holeId?.startsWith('pocket'))
    expect(onEdge).toHaveLength(3)
    expect(onPockets).toHaveLength(3)
    for (const run of onEdge) {
      // Each run faces a pocket: its middle point lies within 60 mm of the nearest pocket's rim.
      const mid = run.points[Math.floor(run.points.length / 2)]!
      const nearest = Math.min(...plate.holes.filter((h) => h.kind === 'pocket').map((h) => Math.hypot(mid[0] - h.x, mid[1] - h.y) - h.diameter / 2))
      expect(nearest).toBeLessThan(60)
    }
  })
})

describe('property: over random accepted plates and bushings', () => {
  const bushings = fc.record({ bushing: fc.double({ min: 10, max: 60, noNaN: true }), bitFraction: fc.double({ min: 0.1, max: 0.9, noNaN: true }) })

  it('the guide line never crosses itself or another ring and stays at its offset within 0.1 mm of the cut line', () => {
    fc.assert(
      fc.property(acceptedParams, bushings, (params, b) => {
        const plate = buildPlate(params)
        const options = { bushing: b.bushing, bit: b.bushing * b.bitFraction }
        const d = (options.bushing - options.bit) / 2
        const rings = guideLine(plate, options)
        for (let i = 0; i < rings.length; i++) {
          expect(findSelfIntersection(rings[i]!)).toBeNull()
          for (let j = i + 1; j < rings.length; j++) expect(ringsCross(rings[i]!, rings[j]!)).toBe(false)
          for (const p of rings[i]!) {
            const at = distanceToPolygon(p, plate.outline)
            expect(at).toBeGreaterThan(d - 0.1)
            expect(at).toBeLessThan(d + 0.1)
          }
        }
      }),
      { numRuns: 25 },
    )
  }, 180_000)

  it('every outline point the pattern does not bring back within 0.1 mm is marked, and only those', () => {
    let plansWithMarks = 0
    fc.assert(
      fc.property(acceptedParams, bushings, (params, b) => {
        const plate = buildPlate(params)
        const options = { bushing: b.bushing, bit: b.bushing * b.bitFraction }
        const d = (options.bushing - options.bit) / 2
        const pattern = guidePattern(plate, options)
        const runs = pattern.unreachable.filter((r) => r.holeId === null)
        if (runs.length > 0) plansWithMarks++
        const marked = markedPoints(plate, runs)
        // A run's two end points are the reached neighbours that close it off.
        const ends = new Set(runs.filter((r) => !r.closed).flatMap((r) => [r.points[0]!, r.points.at(-1)!]).map((p) => `${p[0]},${p[1]}`))
        for (const p of plate.outline) {
          const key = `${p[0]},${p[1]}`
          const reached = pattern.rings.length > 0 && distanceToRings(p, pattern.rings) <= d + 0.1
          if (!reached) expect(marked.has(key), `outline point ${p} is neither reached nor marked`).toBe(true)
          else if (!ends.has(key)) expect(marked.has(key), `outline point ${p} is reached but marked`).toBe(false)
        }
      }),
      { numRuns: 25 },
    )
    // Not a vacuous property: some of the random plates do have stretches out of reach.
    expect(plansWithMarks).toBeGreaterThanOrEqual(3)
  }, 180_000)
})

/** A 200 mm disc (1 degree steps) with a straight root of the given width reaching out to x = 280 mm. */
function discWithRoot(width: number): Plate {
  const half = width / 2
  const ring: Point[] = []
  const a0 = Math.asin(half / 200)
  const r0 = Math.sqrt(200 * 200 - half * half)
  ring.push([r0, half])
  for (let deg = 1; deg < 360; deg++) {
    const a = (deg * Math.PI) / 180
    if (a <= a0 || a >= 2 * Math.PI - a0) continue
    ring.push([200 * Math.cos(a), 200 * Math.sin(a)])
  }
  ring.push([r0, -half], [280, -half], [280, half])
  const base = fixturePlate({ radius: 200, amplitude: 0, casters: 3, casterOffset: 90, pocketDiameter: 60 })
  return { ...base, outline: ring, holes: [] }
}

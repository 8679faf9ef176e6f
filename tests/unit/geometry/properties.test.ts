// Properties over thousands of random parameter sets the schema accepts.

import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { buildPlate, plateOutlineShape } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'
import { sampleOutline } from '../../../geometry/outline/sample'
import { deriveForTube } from '../../../geometry/presets'
import { acceptedParams, allNumbers, findSelfIntersection, shoelace } from './helpers'

function distanceToRing(ring: readonly (readonly [number, number])[], px: number, py: number): number {
  let best = Infinity
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % ring.length]!
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    const len2 = dx * dx + dy * dy
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((px - a[0]) * dx + (py - a[1]) * dy) / len2)) : 0
    best = Math.min(best, Math.hypot(a[0] + t * dx - px, a[1] + t * dy - py))
  }
  return best
}

/** Distance from a point to the ring, looking only at the edges within a few samples of its angle (sorted angles of the ring's vertices). */
function nearbyDistance(ring: readonly (readonly [number, number])[], thetas: Float64Array, px: number, py: number): number {
  let t = Math.atan2(py, px)
  if (t < 0) t += 2 * Math.PI
  let lo = 0
  let hi = thetas.length - 1
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1
    if (thetas[mid]! <= t) lo = mid
    else hi = mid - 1
  }
  let best = Infinity
  for (let k = lo - 24; k <= lo + 24; k++) {
    const i = ((k % ring.length) + ring.length) % ring.length
    const a = ring[i]!
    const b = ring[(i + 1) % ring.length]!
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    const len2 = dx * dx + dy * dy
    const u = len2 > 0 ? Math.max(0, Math.min(1, ((px - a[0]) * dx + (py - a[1]) * dy) / len2)) : 0
    best = Math.min(best, Math.hypot(a[0] + u * dx - px, a[1] + u * dy - py))
  }
  return best
}

function windingNumber(ring: readonly (readonly [number, number])[], px: number, py: number): number {
  let w = 0
  for (let i = 0; i < ring.length; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % ring.length]!
    const side = (b[0] - a[0]) * (py - a[1]) - (px - a[0]) * (b[1] - a[1])
    if (a[1] <= py && b[1] > py && side > 0) w++
    else if (a[1] > py && b[1] <= py && side < 0) w--
  }
  return w
}

// Generous per-test limits: a 2-core machine shared with other work runs these in a few seconds each.
const LIMIT = 60_000

describe('buildPlate over random accepted parameters', () => {
  it('never throws, never yields NaN or Infinity, and gives a counter-clockwise ring without a repeated first point', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        const plate = buildPlate(params)
        const numbers = allNumbers({ ...plate, params: undefined })
        expect(numbers.every(Number.isFinite)).toBe(true)
        expect(plate.outline.length).toBeGreaterThanOrEqual(3)
        expect(shoelace(plate.outline)).toBeGreaterThan(0)
        const first = plate.outline[0]!
        const last = plate.outline[plate.outline.length - 1]!
        expect(first[0] === last[0] && first[1] === last[1]).toBe(false)
        expect(plate.metrics.area).toBeGreaterThan(0)
        for (const f of plate.findings) expect(['error', 'warning']).toContain(f.severity)
      }),
      { numRuns: 1000 },
    )
  }, LIMIT)

  it('never gives an outline that crosses itself', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        expect(findSelfIntersection(buildPlate(params).outline)).toBeNull()
      }),
      { numRuns: 1000 },
    )
  }, LIMIT)

  it('keeps every hole inside the outline with the minimum wood, or says otherwise in a finding', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        const plate = buildPlate(params)
        for (const hole of plate.holes) {
          const rabbet = plate.rabbets.find((r) => r.pocketId === hole.id)
          const radius = (rabbet ? rabbet.diameter : hole.diameter) / 2
          const inside = windingNumber(plate.outline, hole.x, hole.y) === 1
          const wood = inside ? distanceToRing(plate.outline, hole.x, hole.y) - radius : -Infinity
          if (wood >= params.minWood - 1e-9) continue
          const said = plate.findings.some(
            (f) => (f.code === 'edge-too-close' || f.code === 'hole-cuts-edge') && f.holeIds?.includes(hole.id),
          )
          expect(said, `${hole.id} has ${wood} mm of wood and no finding`).toBe(true)
        }
      }),
      { numRuns: 1000 },
    )
  }, LIMIT)

  it('gives the same plate for the same parameters, also after a JSON round trip', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        // Compared as JSON, as a stored revision would be: JSON has no negative zero.
        const again = plateParamsSchema.parse(JSON.parse(JSON.stringify(params)))
        expect(JSON.stringify(buildPlate(again))).toBe(JSON.stringify(buildPlate(params)))
      }),
      { numRuns: 1000 },
    )
  }, LIMIT)

  it('moves the lobes when only the seed changes (some irregularity, lobes without overrides)', () => {
    fc.assert(
      fc.property(
        acceptedParams.filter((p) => p.lobes.irregularity > 0.05 && p.lobes.count > 0 && p.lobes.overrides.length === 0),
        (params) => {
          const other = { ...params, lobes: { ...params.lobes, seed: (params.lobes.seed + 1) >>> 0 } }
          const angles = (p: typeof params) => buildPlate(p).lobeTips.map((t) => t.angle)
          expect(angles(other)).not.toEqual(angles(params))
        },
      ),
      { numRuns: 200 },
    )
  }, LIMIT)

  it('puts every pocket exactly on the caster circle', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        for (const h of buildPlate(params).holes.filter((x) => x.kind === 'pocket')) {
          expect(Math.abs(Math.hypot(h.x, h.y) - params.casterOffset)).toBeLessThan(1e-9 * params.casterOffset)
        }
      }),
      { numRuns: 1000 },
    )
  }, LIMIT)

  it('keeps every chord within 0.1 mm of the curve (CONTRACTS.md)', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        const shape = plateOutlineShape(params)
        const { points, thetas } = sampleOutline(shape)
        let worst = 0
        for (let i = 0; i < points.length; i++) {
          const a = points[i]!
          const b = points[(i + 1) % points.length]!
          const t0 = thetas[i]!
          const t1 = i + 1 < points.length ? thetas[i + 1]! : 2 * Math.PI
          const dx = b[0] - a[0]
          const dy = b[1] - a[1]
          const len = Math.hypot(dx, dy)
          for (let k = 1; k < 8; k++) {
            const p = shape.pointAt(t0 + ((t1 - t0) * k) / 8)
            worst = Math.max(worst, Math.abs(dx * (p[1] - a[1]) - dy * (p[0] - a[0])) / len)
          }
        }
        expect(worst).toBeLessThanOrEqual(0.1)
      }),
      { numRuns: 200 },
    )
  }, LIMIT)

  it('draws a path whose curves stay on the outline', () => {
    fc.assert(
      fc.property(acceptedParams, (params) => {
        const plate = buildPlate(params)
        const { points, thetas } = sampleOutline(plateOutlineShape(params))
        expect(points).toEqual(plate.outline)
        const path = plate.outlinePath
        expect(path).toMatch(/^M[-\d.e ]+(C[-\d.e ]+)+Z$/)
        const numbers = path.slice(1, -1).split(/[C ]/).map(Number)
        let x = numbers[0]!
        let y = numbers[1]!
        for (let i = 2; i + 5 < numbers.length + 1; i += 6) {
          const [c1x, c1y, c2x, c2y, ex, ey] = numbers.slice(i, i + 6) as [number, number, number, number, number, number]
          for (const t of [0.25, 0.5, 0.75]) {
            const u = 1 - t
            const bx = u * u * u * x + 3 * u * u * t * c1x + 3 * u * t * t * c2x + t * t * t * ex
            const by = u * u * u * y + 3 * u * u * t * c1y + 3 * u * t * t * c2y + t * t * t * ey
            // Curve and polygon are each within 0.1 mm of the true outline; allow both plus rounding.
            expect(nearbyDistance(plate.outline, thetas, bx, by)).toBeLessThan(0.15)
          }
          x = ex
          y = ey
        }
      }),
      { numRuns: 100 },
    )
  }, LIMIT)
})

describe('deriveForTube over random accepted parameters', () => {
  it('always gives accepted parameters, keeps the hardware and scales the look', () => {
    fc.assert(
      fc.property(acceptedParams, fc.double({ min: 101.6, max: 1244.6, noNaN: true }), (params, tube) => {
        const derived = deriveForTube(params, tube)
        expect(plateParamsSchema.safeParse(derived).success).toBe(true)
        expect(derived.tubeDiameter).toBeCloseTo(tube, 2)
        expect(derived.pocketDiameter).toBe(params.pocketDiameter)
        expect(derived.caster).toEqual(params.caster)
        expect(derived.minWood).toBe(params.minWood)
        expect(derived.casterCount).toBe(params.casterCount)
        const s = tube / params.tubeDiameter
        if (params.lobes.reach * s < 900) expect(derived.lobes.reach).toBeCloseTo(params.lobes.reach * s, 2)
      }),
      { numRuns: 1000 },
    )
  }, LIMIT)
})

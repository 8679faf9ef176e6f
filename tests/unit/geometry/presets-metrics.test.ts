import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'
import { PRESETS, deriveForTube, presetParams } from '../../../geometry/presets'
import { convexHull, enclosingCircle, fitsRectangle, minimumWidth } from '../../../geometry/math/polygon'

type P = [number, number]

describe('presets', () => {
  it('have distinct ids and parse', () => {
    expect(new Set(PRESETS.map((p) => p.id)).size).toBe(PRESETS.length)
    for (const p of PRESETS) expect(plateParamsSchema.safeParse(p.input).success).toBe(true)
    expect(presetParams('no-such-shape')).toBeUndefined()
  })
})

describe('deriveForTube', () => {
  const oak = presetParams('gnarled-oak')!

  it('scales the look with the trunk and keeps the hardware', () => {
    const big = deriveForTube(oak, oak.tubeDiameter * 1.5)
    expect(big.lobes.reach).toBeCloseTo(oak.lobes.reach * 1.5, 2)
    expect(big.lobes.width).toBeCloseTo(oak.lobes.width * 1.5, 2)
    expect(big.lobes.valley).toBeCloseTo(oak.lobes.valley * 1.5, 2)
    expect(big.pocketDiameter).toBe(oak.pocketDiameter)
    expect(big.caster).toEqual(oak.caster)
    expect(big.lobes.seed).toBe(oak.lobes.seed)
    // The pans are tucked under the new wall: rabbet edge (offset + 53.975 + 12.7) 1.5 to 2 mm inside
    // the outside radius (placeCasters rounds the offset down to 0.5 mm).
    const edge = big.casterOffset + big.pocketDiameter / 2 + big.rabbetWidth
    expect(big.tubeDiameter / 2 - edge).toBeGreaterThanOrEqual(1.5)
    expect(big.tubeDiameter / 2 - edge).toBeLessThan(2)
    expect(buildPlate(big).findings.filter((f) => f.severity === 'error')).toEqual([])
    expect(buildPlate(big).findings.map((f) => f.code)).not.toContain('pan-visible')
  })

  it('keeps the lobes in the same places, so the family reads as one design', () => {
    const a = buildPlate(oak).lobeTips.map((t) => t.angle)
    const b = buildPlate(deriveForTube(oak, 609.6)).lobeTips.map((t) => t.angle)
    b.forEach((angle, i) => expect(angle).toBeCloseTo(a[i]!, 9))
  })

  it('stops the caster offset at the least the centre hole allows on a small tube', () => {
    const small = deriveForTube(oak, 101.6)
    expect(plateParamsSchema.safeParse(small).success).toBe(true)
    expect(small.casterOffset).toBeGreaterThanOrEqual(oak.pocketDiameter / 2 + oak.rabbetWidth + oak.minWood + oak.centreHoleDiameter / 2)
  })
})

/** Smallest enclosing circle by brute force: every circle through 2 or 3 of the points, smallest that holds them all. */
function bruteCircle(points: P[]): number {
  let best = Infinity
  const holds = (x: number, y: number, r: number) => points.every((p) => Math.hypot(p[0] - x, p[1] - y) <= r + 1e-7)
  for (let i = 0; i < points.length; i++) {
    for (let j = i + 1; j < points.length; j++) {
      const a = points[i]!
      const b = points[j]!
      const x = (a[0] + b[0]) / 2
      const y = (a[1] + b[1]) / 2
      const r = Math.hypot(a[0] - x, a[1] - y)
      if (r < best && holds(x, y, r)) best = r
      for (let k = j + 1; k < points.length; k++) {
        const c = points[k]!
        const d = 2 * (a[0] * (b[1] - c[1]) + b[0] * (c[1] - a[1]) + c[0] * (a[1] - b[1]))
        if (Math.abs(d) < 1e-12) continue
        const a2 = a[0] ** 2 + a[1] ** 2
        const b2 = b[0] ** 2 + b[1] ** 2
        const c2 = c[0] ** 2 + c[1] ** 2
        const ux = (a2 * (b[1] - c[1]) + b2 * (c[1] - a[1]) + c2 * (a[1] - b[1])) / d
        const uy = (a2 * (c[0] - b[0]) + b2 * (a[0] - c[0]) + c2 * (b[0] - a[0])) / d
        const rr = Math.hypot(a[0] - ux, a[1] - uy)
        if (rr < best && holds(ux, uy, rr)) best = rr
      }
    }
  }
  return best
}

const pointSets = fc.array(fc.tuple(fc.integer({ min: -1000, max: 1000 }), fc.integer({ min: -1000, max: 1000 })), { minLength: 3, maxLength: 18 })

describe('plane geometry helpers against brute force', () => {
  it('smallest enclosing circle matches the best circle through 2 or 3 points', () => {
    fc.assert(
      fc.property(pointSets, (pts) => {
        const c = enclosingCircle(pts as P[])
        expect(c.radius).toBeCloseTo(bruteCircle(pts as P[]), 6)
      }),
      { numRuns: 300 },
    )
  })

  it('least width matches the narrowest of 36 000 directions', () => {
    fc.assert(
      fc.property(pointSets, (pts) => {
        // Collinear sets have no width to speak of; told apart by cross products, not by the hull routine.
        const [o] = pts
        if (pts.every(([x, y]) => pts.every(([u, v]) => (x - o![0]) * (v - o![1]) - (y - o![1]) * (u - o![0]) === 0))) return
        const hull = convexHull(pts as P[])
        // The brute force projects the raw points, not the code's hull: a set's extremes along a direction are its hull's.
        let brute = Infinity
        for (let i = 0; i < 36000; i++) {
          const a = (i * Math.PI) / 36000
          const proj = pts.map((p) => -p[0] * Math.sin(a) + p[1] * Math.cos(a))
          brute = Math.min(brute, Math.max(...proj) - Math.min(...proj))
        }
        const w = minimumWidth(hull).width
        expect(w).toBeLessThanOrEqual(brute + 1e-9)
        // The sampled directions miss the exact one by at most half a step: width error below 2000 * (pi / 72000).
        expect(brute - w).toBeLessThan(0.1)
      }),
      { numRuns: 100 },
    )
  })

  it('a rectangle just inside the 48 x 96 in sheet (PS 1-19) fits however it is drawn; one just larger does not', () => {
    const rect = (w: number, h: number, turn: number): P[] =>
      [[-w / 2, -h / 2], [w / 2, -h / 2], [w / 2, h / 2], [-w / 2, h / 2]].map(([x, y]) => [
        x! * Math.cos(turn) - y! * Math.sin(turn),
        x! * Math.sin(turn) + y! * Math.cos(turn),
      ])
    expect(fitsRectangle(rect(1200, 2400, 0.7), 1219.2, 2438.4)).toBe(true)
    expect(fitsRectangle(rect(1230, 2400, 0.7), 1219.2, 2438.4)).toBe(false)
    expect(fitsRectangle(rect(1200, 2450, 1.1), 1219.2, 2438.4)).toBe(false)
  })
})

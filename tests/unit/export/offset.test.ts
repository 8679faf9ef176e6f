// The guide-bushing offset checked against an independent polygon engine (clipper2-ts).
import { EndType, JoinType, areaD, inflatePathsD } from 'clipper2-ts'
import { describe, expect, it } from 'vitest'
import type { Point } from '../../../geometry/types'
import { offsetPolygon } from '../../../geometry/export/polyline'
import { bushingOffset } from '../../../geometry/export/template-pdf'
import { fixturePlate, shoelace } from './fixture'

describe('bushingOffset', () => {
  it('is (bushing outside diameter - bit diameter) / 2 (router pattern practice, common practice)', () => {
    // 5/8 in bushing with a 1/2 in bit: 1/16 in = 1.5875 mm
    expect(bushingOffset({ bushingDiameter: 15.875, bitDiameter: 12.7 })).toBeCloseTo(1.5875, 9)
    expect(() => bushingOffset({ bushingDiameter: 10, bitDiameter: 12 })).toThrow(/wider than the bit/)
  })
})

describe('offsetPolygon', () => {
  it('grows a circle to the circle of radius r + d', () => {
    const circle = fixturePlate({ radius: 300, amplitude: 0 }).outline
    const grown = offsetPolygon(circle, 5)
    for (const [x, y] of grown) expect(Math.hypot(x, y)).toBeCloseTo(305, 2)
  })

  it('shrinks a circle to the circle of radius r - d for a negative distance', () => {
    const circle = fixturePlate({ radius: 300, amplitude: 0 }).outline
    for (const [x, y] of offsetPolygon(circle, -5)) expect(Math.hypot(x, y)).toBeCloseTo(295, 2)
  })

  it('shrinks a lobed outline by the area clipper2-ts gives for the same negative offset', () => {
    const lobed = fixturePlate({ radius: 400, amplitude: 80, lobes: 5 }).outline
    for (const d of [1.5875, 6.35]) {
      const ours = Math.abs(shoelace(offsetPolygon(lobed, -d)))
      const theirs = inflatePathsD([lobed.map(([x, y]) => ({ x, y }))], -d, JoinType.Round, EndType.Polygon)
      const reference = Math.abs(theirs.reduce((s, p) => s + areaD(p), 0))
      expect(Math.abs(ours - reference) / reference).toBeLessThan(2e-5)
    }
  })

  it('matches clipper2-ts round-join offset area on a lobed outline', () => {
    const lobed = fixturePlate({ radius: 400, amplitude: 80, lobes: 5 }).outline
    for (const d of [1.5875, 6.35]) {
      const ours = Math.abs(shoelace(offsetPolygon(lobed, d)))
      const theirs = inflatePathsD([lobed.map(([x, y]) => ({ x, y }))], d, JoinType.Round, EndType.Polygon)
      const reference = Math.abs(theirs.reduce((s, p) => s + areaD(p), 0))
      expect(Math.abs(ours - reference) / reference).toBeLessThan(2e-5)
    }
  })

  it('stays a simple closed line on deep smooth lobes (no self-crossing)', () => {
    const deep = fixturePlate({ radius: 350, amplitude: 150, lobes: 6, segments: 2000 }).outline
    const grown = offsetPolygon(deep, 6.35)
    expect(crossings(grown)).toBe(0)
    expect(shoelace(grown)).toBeGreaterThan(shoelace(deep))
  })
})

/** Pairs of non-adjacent edges that cross (an O(n^2) sweep is fine at test sizes). */
function crossings(poly: Point[]): number {
  const n = poly.length
  const orient = (a: Point, b: Point, c: Point) => Math.sign((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]))
  let count = 0
  for (let i = 0; i < n; i++) {
    const a = poly[i]!
    const b = poly[(i + 1) % n]!
    for (let j = i + 2; j < n; j++) {
      if (i === 0 && j === n - 1) continue
      const c = poly[j]!
      const d = poly[(j + 1) % n]!
      if (orient(a, b, c) * orient(a, b, d) < 0 && orient(c, d, a) * orient(c, d, b) < 0) count++
    }
  }
  return count
}

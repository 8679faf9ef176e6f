// The clipper2-ts offset wrapper, checked against hand values (circle,
// rectangle: Steiner's formula for the area of a parallel body) and against an
// offset built independently with polygon-clipping: a polygon grown by d is
// the union of itself with a disk at every vertex and a band along every edge
// (the Minkowski sum with a disk); shrunk by d, it is the polygon less those
// disks and bands.
import polygonClipping, { type MultiPolygon, type Polygon } from 'polygon-clipping'
import { describe, expect, it } from 'vitest'
import type { Point } from '../../../geometry/types'
import { offsetRing, offsetRings, ringArea } from '../../../geometry/math/offset'
import { fixturePlate, shoelace } from './fixture'
import { findSelfIntersection } from '../geometry/helpers'

/** polygon-clipping is happier with coordinates on a fine grid (its own advice for near-coincident edges). */
const snap = (v: number) => Math.round(v * 1e4) / 1e4

function disk(x: number, y: number, r: number, n = 48): Point[] {
  // Circumscribed polygon (vertices at r / cos(pi / n)), so the disk is inside it: the band union never has gaps.
  const R = r / Math.cos(Math.PI / n)
  return Array.from({ length: n }, (_, i) => [snap(x + R * Math.cos((2 * Math.PI * (i + 0.5)) / n)), snap(y + R * Math.sin((2 * Math.PI * (i + 0.5)) / n))] as Point)
}

/** Disks at the vertices and rectangles along the edges: the set of points within d of the polygon's boundary. */
function boundaryBand(poly: Point[], d: number): Polygon[] {
  const parts: Polygon[] = []
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i]!
    const b = poly[(i + 1) % poly.length]!
    const len = Math.hypot(b[0] - a[0], b[1] - a[1])
    const nx = (-(b[1] - a[1]) / len) * d
    const ny = ((b[0] - a[0]) / len) * d
    parts.push([disk(a[0], a[1], d)])
    parts.push([[
      [a[0] + nx, a[1] + ny], [a[0] - nx, a[1] - ny], [b[0] - nx, b[1] - ny], [b[0] + nx, b[1] + ny],
    ].map(([x, y]) => [snap(x!), snap(y!)] as Point)])
  }
  return parts
}

function multiArea(mp: MultiPolygon): number {
  return mp.reduce((s, poly) => s + poly.reduce((t, ring, k) => t + (k === 0 ? 1 : -1) * Math.abs(shoelace(ring as Point[])), 0), 0)
}

/** The union of many small pieces, a few at a time (one big sweep trips over near-coincident edges). */
function unionAll(parts: Polygon[]): MultiPolygon {
  let acc: MultiPolygon = []
  for (let i = 0; i < parts.length; i += 8) acc = polygonClipping.union(acc, ...parts.slice(i, i + 8))
  return acc
}

function snapped(poly: Point[]): Point[] {
  return poly.map(([x, y]) => [snap(x), snap(y)] as Point)
}

function grownByPolygonClipping(poly: Point[], d: number): MultiPolygon {
  return polygonClipping.union([snapped(poly)], unionAll(boundaryBand(poly, d)))
}

function shrunkByPolygonClipping(poly: Point[], d: number): MultiPolygon {
  return polygonClipping.difference([snapped(poly)], unionAll(boundaryBand(poly, d)))
}

function totalArea(rings: Point[][]): number {
  return rings.reduce((s, r) => s + ringArea(r), 0)
}

describe('offsetRings (clipper2-ts, round joins)', () => {
  it('grows and shrinks a circle of 300 mm to radius 300 +/- d at every point (hand value)', () => {
    const circle = fixturePlate({ radius: 300, amplitude: 0 }).outline
    for (const d of [5, 12.7]) {
      const [grown] = offsetRing(circle, d)
      const [shrunk] = offsetRing(circle, -d)
      // 1440 inscribed chords of a 300 mm circle sag 0.0007 mm; the offset keeps a micrometre.
      for (const [x, y] of grown!) expect(Math.abs(Math.hypot(x, y) - (300 + d))).toBeLessThan(0.002)
      for (const [x, y] of shrunk!) expect(Math.abs(Math.hypot(x, y) - (300 - d))).toBeLessThan(0.002)
    }
  })

  it('grows a 200 x 100 mm rectangle by 10 mm to area 200*100 + 2*10*(200 + 100) + pi*10^2 (Steiner formula)', () => {
    const rect: Point[] = [[0, 0], [200, 0], [200, 100], [0, 100]]
    const grown = offsetRings([rect], 10)
    expect(grown).toHaveLength(1)
    const expected = 20000 + 6000 + Math.PI * 100
    // The corner arcs are chords within 0.01 mm of the circle: at most about a circumference * 0.01 short.
    expect(totalArea(grown)).toBeLessThanOrEqual(expected + 1e-6)
    expect(totalArea(grown)).toBeGreaterThan(expected - 2 * Math.PI * 10 * 0.01)
  })

  it('shrinks the same rectangle by 10 mm to the 180 x 80 mm rectangle with square corners (hand value)', () => {
    const rect: Point[] = [[0, 0], [200, 0], [200, 100], [0, 100]]
    const [inner] = offsetRings([rect], -10)
    expect(totalArea([inner!])).toBeCloseTo(180 * 80, 3)
    const xs = inner!.map((p) => p[0])
    const ys = inner!.map((p) => p[1])
    expect([Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)].map((v) => Number(v.toFixed(3)))).toEqual([10, 190, 10, 90])
  })

  it('grows a lobed outline to the area polygon-clipping gives for the union with disks and edge bands', () => {
    const lobed = fixturePlate({ radius: 300, amplitude: 90, lobes: 5, segments: 160 }).outline
    for (const d of [3.175, 12.7]) {
      const ours = totalArea(offsetRings([lobed], d))
      const theirs = multiArea(grownByPolygonClipping(lobed, d))
      // The 48-gon disks stand up to d (1/cos(pi/48) - 1) = 0.2 % proud at the convex vertices only.
      expect(Math.abs(ours - theirs) / theirs).toBeLessThan(2e-4)
    }
  })

  it('shrinks a lobed outline to the area polygon-clipping gives for the outline less the band along its edge', () => {
    const lobed = fixturePlate({ radius: 300, amplitude: 90, lobes: 5, segments: 160 }).outline
    for (const d of [3.175, 12.7]) {
      const ours = totalArea(offsetRings([lobed], -d))
      const theirs = multiArea(shrunkByPolygonClipping(lobed, d))
      expect(Math.abs(ours - theirs) / theirs).toBeLessThan(2e-4)
    }
  })

  it('drops a root narrower than twice the inward offset, as the independent erosion does', () => {
    // A 200 mm disk with a 15 mm wide, 80 mm long straight root: 12.7 mm in from both sides leaves nothing of the root.
    const root: Point[] = [...disk(0, 0, 200, 96).filter(([x, y]) => !(x > 0 && Math.abs(y) < 7.5))]
    const withRoot = addRoot(root)
    const ours = offsetRings([withRoot], -12.7)
    expect(ours).toHaveLength(1)
    expect(Math.max(...ours[0]!.map((p) => p[0]))).toBeLessThan(200)
    const theirs = shrunkByPolygonClipping(withRoot, 12.7)
    expect(theirs).toHaveLength(1)
    expect(Math.abs(totalArea(ours) - multiArea(theirs)) / multiArea(theirs)).toBeLessThan(2e-4)
  })

  it('returns rings that never cross themselves, outsides counter-clockwise', () => {
    const deep = fixturePlate({ radius: 350, amplitude: 150, lobes: 6, segments: 2000 }).outline
    for (const d of [6.35, -6.35, -30]) {
      for (const ring of offsetRings([deep], d)) {
        expect(findSelfIntersection(ring)).toBeNull()
        expect(ringArea(ring)).toBeGreaterThan(0)
      }
    }
  })

  it('refuses a distance that is not a number', () => {
    expect(() => offsetRings([[[0, 0], [1, 0], [0, 1]]], Number.NaN)).toThrow(/must be a number/)
  })
})

/** Splices a 15 x 80 mm root onto the right of a disk polygon whose points near +x were removed. */
function addRoot(ring: Point[]): Point[] {
  // The ring runs counter-clockwise from just above the cut at +x round to just below it.
  const start = ring.findIndex(([x, y]) => y >= 7.5 && x > 0)
  const ordered = [...ring.slice(start), ...ring.slice(0, start)]
  const r = Math.sqrt(200 * 200 - 7.5 * 7.5)
  return [[r, 7.5], ...ordered, [r, -7.5], [280, -7.5], [280, 7.5]] as Point[]
}

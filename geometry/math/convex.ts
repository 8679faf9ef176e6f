// Convex pieces and convex Minkowski sums: the fast road to a no-fit polygon.
// The Minkowski sum of two simple polygons is the union of the sums of their
// convex pieces, and two convex polygons sum in linear time (the hull of the
// vertex sums), where sweeping every edge of one along every edge of the other
// leaves the polygon engine n x m overlapping quads to union.

import type { Point } from '../types'
import { convexHull } from './polygon'

function cross(o: Point, a: Point, b: Point): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
}

/** Minkowski sum of two convex polygons: the hull of every vertex sum. */
export function convexSum(a: readonly Point[], b: readonly Point[]): Point[] {
  const sums: Point[] = []
  for (const p of a) for (const q of b) sums.push([p[0] + q[0], p[1] + q[1]])
  return convexHull(sums)
}

function isConvexCcw(ring: readonly Point[]): boolean {
  const n = ring.length
  for (let i = 0; i < n; i++) {
    if (cross(ring[i]!, ring[(i + 1) % n]!, ring[(i + 2) % n]!) < -1e-9) return false
  }
  return true
}

const key = (p: Point) => `${p[0]},${p[1]}`

/**
 * Merge triangles (counter-clockwise, sharing exact vertices) into convex
 * pieces by dropping inside edges while the merged piece stays convex
 * (Hertel and Mehlhorn: at most four times the fewest pieces).
 */
export function mergeConvex(triangles: readonly Point[][]): Point[][] {
  const pieces: (Point[] | null)[] = triangles.map((t) => [...t])
  let merged = true
  while (merged) {
    merged = false
    const owner = new Map<string, { piece: number; at: number }>()
    for (let i = 0; i < pieces.length; i++) {
      const p = pieces[i]
      if (!p) continue
      for (let k = 0; k < p.length; k++) owner.set(`${key(p[k]!)}>${key(p[(k + 1) % p.length]!)}`, { piece: i, at: k })
    }
    for (let i = 0; i < pieces.length && !merged; i++) {
      const p = pieces[i]
      if (!p) continue
      for (let k = 0; k < p.length; k++) {
        const a = p[k]!
        const b = p[(k + 1) % p.length]!
        const other = owner.get(`${key(b)}>${key(a)}`)
        if (!other || other.piece === i) continue
        const q = pieces[other.piece]!
        // Walk p from b round to a, then q from a round to b, leaving out the shared edge.
        const ring: Point[] = []
        for (let s = 1; s <= p.length; s++) ring.push(p[(k + s) % p.length]!)
        for (let s = 2; s < q.length; s++) ring.push(q[(other.at + s) % q.length]!)
        if (isConvexCcw(ring)) {
          pieces[i] = ring
          pieces[other.piece] = null
          merged = true
          break
        }
      }
    }
  }
  return pieces.filter((p): p is Point[] => p !== null)
}

// The one wrapper round clipper2-ts for polygon offsets: a true offset (every
// point of the result at the given distance from the input, arcs round convex
// corners), where moving vertices along averaged normals folds the line back on
// itself in tight bends. Plain [x, y] rings in millimetres in and out.

import {
  EndType,
  FillRule,
  JoinType,
  areaD,
  differenceD,
  inflatePathsD,
  ramerDouglasPeuckerD,
  triangulateD,
  unionD,
  type PathD,
  type PathsD,
} from 'clipper2-ts'
import type { Point } from '../types'
import { convexSum, mergeConvex } from './convex'

/** Decimal places clipper2-ts keeps (it works on integers): a micrometre. */
const PRECISION = 3
/** Largest gap between an offset arc and its chords, mm: far below the outline's own 0.1 mm chord error. */
export const OFFSET_ARC_TOLERANCE = 0.01

export interface OffsetOptions {
  /** Largest chord error on the arcs the offset adds, mm. Default 0.01. */
  arcTolerance?: number
  /** Corner joins: 'round' (default, a true offset) or 'miter' (square corners, never inside the true offset; no arcs added). */
  join?: 'round' | 'miter'
}

function toPath(ring: readonly Point[]): PathD {
  return ring.map(([x, y]) => ({ x, y }))
}

function fromPath(path: PathD): Point[] {
  return path.map((p) => [p.x, p.y] as Point)
}

function checkDistance(distance: number): void {
  if (!Number.isFinite(distance)) throw new RangeError(`Offset distance must be a number, got ${distance}.`)
}

/**
 * Offset a region bounded by closed rings: outward for a positive distance,
 * inward for a negative one. Counter-clockwise rings are outsides, clockwise
 * rings holes (the non-zero rule), so an outline with its openings offsets as
 * one piece of material. Round joins. Parts narrower than twice an inward
 * distance vanish and a region may split; the result is outsides
 * counter-clockwise, holes clockwise, none crossing itself or another.
 */
export function offsetRings(rings: readonly (readonly Point[])[], distance: number, options: OffsetOptions = {}): Point[][] {
  checkDistance(distance)
  const paths: PathsD = rings.filter((r) => r.length >= 3).map(toPath)
  if (paths.length === 0) return []
  if (distance === 0) return paths.map(fromPath)
  const join = options.join === 'miter' ? JoinType.Miter : JoinType.Round
  const out = inflatePathsD(paths, distance, join, EndType.Polygon, 2, PRECISION, options.arcTolerance ?? OFFSET_ARC_TOLERANCE)
  return out.filter((p) => p.length >= 3).map(fromPath)
}

/** One closed ring offset on its own, whatever its winding: positive grows it, negative shrinks it. */
export function offsetRing(ring: readonly Point[], distance: number, options: OffsetOptions = {}): Point[][] {
  const ccw = ringArea(ring) < 0 ? [...ring].reverse() : ring
  return offsetRings([ccw], distance, options)
}

/** Signed area, positive for a counter-clockwise ring. */
export function ringArea(ring: readonly Point[]): number {
  return areaD(toPath(ring))
}

// Booleans, Minkowski sums and thinning for nesting (geometry/nest): the same
// engine and precision as the offsets above, so a ring offset here and
// combined there lines up to the micrometre.

/** The union of regions bounded by closed rings (non-zero rule): outsides counter-clockwise, holes clockwise. */
export function unionRings(rings: readonly (readonly Point[])[]): Point[][] {
  const paths = rings.filter((r) => r.length >= 3).map(toPath)
  if (paths.length === 0) return []
  return unionD(paths, [], FillRule.NonZero, PRECISION).map(fromPath)
}

/** `subject` less `clip` (non-zero rule both): outsides counter-clockwise, holes clockwise. */
export function differenceRings(subject: readonly (readonly Point[])[], clip: readonly (readonly Point[])[]): Point[][] {
  const s = subject.filter((r) => r.length >= 3).map(toPath)
  if (s.length === 0) return []
  const c = clip.filter((r) => r.length >= 3).map(toPath)
  if (c.length === 0) return s.map(fromPath)
  return differenceD(s, c, FillRule.NonZero, PRECISION).map(fromPath)
}

/** Convex pieces covering a simple ring exactly (triangulated, then merged), each counter-clockwise. */
export function convexPieces(ring: readonly Point[]): Point[][] {
  const ccw = areaD(toPath(ring)) < 0 ? [...ring].reverse() : ring
  // Delaunay triangles are fatter, so more of them merge: fewer pieces, fewer sums.
  const { solution } = triangulateD([toPath(ccw)], PRECISION, true)
  const triangles = solution.map((t) => {
    const tri = fromPath(t)
    return areaD(t) < 0 ? tri.reverse() : tri
  })
  return mergeConvex(triangles)
}

/**
 * The outside of the Minkowski sum of two simple regions given by their
 * outer rings: every point a + b, a in `a`, b in `b`, as counter-clockwise
 * rings. Built as the union of the sums of their convex pieces (pass the
 * pieces in when they are already known).
 */
export function minkowskiSumRings(
  a: readonly Point[],
  b: readonly Point[],
  pieces: { a?: Point[][]; b?: Point[][] } = {},
): Point[][] {
  const pa = pieces.a ?? convexPieces(a)
  const pb = pieces.b ?? convexPieces(b)
  const sums: PathsD = []
  for (const x of pa) for (const y of pb) sums.push(toPath(convexSum(x, y)))
  const out: Point[][] = []
  // The sum of two filled regions has no holes of its own save pockets walled off completely,
  // which a part cannot reach anyway: keep the outsides.
  for (const ring of unionD(sums, [], FillRule.NonZero, PRECISION)) {
    if (areaD(ring) > 0) out.push(fromPath(ring))
  }
  return out
}

/**
 * A closed ring with fewer points, no point of the original further than
 * `epsilon` from the result: Ramer-Douglas-Peucker on the two halves between
 * the first point and the point furthest from it (a closed ring given whole
 * would be measured against a line of zero length).
 */
export function thinRing(ring: readonly Point[], epsilon: number): Point[] {
  const copy = () => ring.map((p) => [p[0], p[1]] as Point)
  if (ring.length < 4 || !(epsilon > 0)) return copy()
  const [x0, y0] = ring[0]!
  let far = 1
  let best = -1
  ring.forEach(([x, y], i) => {
    const d = (x - x0) ** 2 + (y - y0) ** 2
    if (d > best) {
      best = d
      far = i
    }
  })
  const path = toPath(ring)
  const first = ramerDouglasPeuckerD(path.slice(0, far + 1), epsilon)
  const second = ramerDouglasPeuckerD([...path.slice(far), path[0]!], epsilon)
  const closed = fromPath([...first, ...second.slice(1, -1)])
  return closed.length >= 3 ? closed : copy()
}

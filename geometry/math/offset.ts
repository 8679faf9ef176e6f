// The one wrapper round clipper2-ts for polygon offsets: a true offset (every
// point of the result at the given distance from the input, arcs round convex
// corners), where moving vertices along averaged normals folds the line back on
// itself in tight bends. Plain [x, y] rings in millimetres in and out.

import { EndType, JoinType, areaD, inflatePathsD, type PathD, type PathsD } from 'clipper2-ts'
import type { Point } from '../types'

/** Decimal places clipper2-ts keeps (it works on integers): a micrometre. */
const PRECISION = 3
/** Largest gap between an offset arc and its chords, mm: far below the outline's own 0.1 mm chord error. */
export const OFFSET_ARC_TOLERANCE = 0.01

export interface OffsetOptions {
  /** Largest chord error on the arcs the offset adds, mm. Default 0.01. */
  arcTolerance?: number
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
  const out = inflatePathsD(paths, distance, JoinType.Round, EndType.Polygon, 2, PRECISION, options.arcTolerance ?? OFFSET_ARC_TOLERANCE)
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

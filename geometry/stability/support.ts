// The support polygon of a unit on swivel casters and the statics of tipping
// it, from plain points: no plate, so the worked examples can be checked on
// hand-made kingpin layouts.
//
// Static tipping criterion (statics, e.g. Meriam & Kraige, Engineering
// Mechanics: Statics): the unit stands while its centre of mass stays over
// the support polygon; leaning towards an edge at a horizontal distance d,
// with the centre of mass at height h, it tips at atan(d / h). A swivel
// caster's wheel may sit anywhere up to the swivel lead e from its kingpin,
// so the polygon that is always there is the kingpins' polygon moved inward
// by e.

import type { Point } from '../types'
import { convexHull } from '../math/polygon'

const DEG = 180 / Math.PI

/** One side of the guaranteed support polygon: points p with n.p <= c stand over it. */
export interface SupportEdge {
  /** Unit outward normal. */
  nx: number
  ny: number
  /** Offset of the moved-in line along the normal, mm. */
  c: number
  /** The side as drawn, mm (on the moved-in polygon; on the kingpin side when the polygon vanishes). */
  from: Point
  to: Point
}

export interface Support {
  /** Kingpins, counter-clockwise, as their convex hull. */
  kingpins: Point[]
  /** The kingpin polygon moved inward by the swivel lead; empty when the lead swallows it. */
  polygon: Point[]
  edges: SupportEdge[]
}

function intersect(a: SupportEdge, b: SupportEdge): Point | null {
  const det = a.nx * b.ny - a.ny * b.nx
  if (Math.abs(det) < 1e-12) return null
  return [(a.c * b.ny - b.c * a.ny) / det, (a.nx * b.c - b.nx * a.c) / det]
}

/** The support polygon of wheels on kingpins at `kingpins` (mm), every wheel swivelled the worst way (moved inward by `lead`). */
export function supportPolygon(kingpins: readonly Point[], lead: number): Support {
  const hull = convexHull(kingpins)
  const edges: SupportEdge[] = []
  const n = hull.length
  if (n < 3) return { kingpins: hull, polygon: [], edges }
  for (let i = 0; i < n; i++) {
    const a = hull[i]!
    const b = hull[(i + 1) % n]!
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    const len = Math.sqrt(dx * dx + dy * dy)
    // Counter-clockwise: the outward normal is the edge turned clockwise.
    const nx = dy / len
    const ny = -dx / len
    const c = nx * a[0] + ny * a[1] - lead
    edges.push({ nx, ny, c, from: [a[0] - nx * lead, a[1] - ny * lead], to: [b[0] - nx * lead, b[1] - ny * lead] })
  }
  // Each corner of the moved-in polygon is where neighbouring moved-in sides meet.
  const corners: Point[] = []
  for (let i = 0; i < n; i++) {
    const p = intersect(edges[(i + n - 1) % n]!, edges[i]!)
    if (p) corners.push(p)
  }
  // A lead larger than the polygon's reach turns it inside out: nothing is guaranteed.
  const sound = corners.length === n && corners.every((p) => edges.every((e) => e.nx * p[0] + e.ny * p[1] <= e.c + 1e-6))
  if (sound) {
    for (let i = 0; i < n; i++) {
      edges[i]!.from = corners[i]!
      edges[i]!.to = corners[(i + 1) % n]!
    }
  }
  return { kingpins: hull, polygon: sound ? corners : [], edges }
}

export interface Tipping {
  /** Horizontal distance from the centre of mass to the nearest side, mm; negative when it stands outside. */
  distance: number
  /** atan(distance / height), degrees. */
  angle: number
  /** The nearest side (the line it tips about). */
  edge: SupportEdge | null
}

/** How far the centre of mass (x, y at `height` mm above the floor) is from tipping over the nearest side. */
export function tipping(support: Support, x: number, y: number, height: number): Tipping {
  let best: SupportEdge | null = null
  let distance = -Infinity
  for (const e of support.edges) {
    const d = e.c - (e.nx * x + e.ny * y)
    if (best === null || d < distance) {
      distance = d
      best = e
    }
  }
  if (!best) return { distance: 0, angle: 0, edge: null }
  return { distance, angle: Math.atan2(distance, Math.max(height, 1e-9)) * DEG, edge: best }
}

/**
 * The least leaning angle (degrees) at which a point of `outline`, `gap` mm
 * above the floor, reaches the floor while the unit turns about one side of
 * the support polygon: a point r beyond the side drops to the floor at
 * atan(gap / r). 90 when nothing reaches past any side.
 */
export function floorTouch(support: Support, outline: readonly Point[], gap: number): { angle: number; edge: SupportEdge | null; reach: number } {
  let angle = 90
  let edge: SupportEdge | null = null
  let reach = 0
  const g = Math.max(0, gap)
  for (const e of support.edges) {
    let r = -Infinity
    for (const p of outline) {
      const d = e.nx * p[0] + e.ny * p[1] - e.c
      if (d > r) r = d
    }
    if (r <= 0) continue
    const a = Math.atan2(g, r) * DEG
    if (a < angle) {
      angle = a
      edge = e
      reach = r
    }
  }
  return { angle, edge, reach }
}

export interface StanceLoads {
  /** kg on the worst-loaded caster over every three-caster stance whose triangle holds the centre of mass. */
  worst: number
  /** Index (into the kingpins as given) of that caster; -1 when no stance holds the centre of mass. */
  caster: number
  /** The three casters of that stance, as given; empty when none holds it. */
  stance: number[]
  /** Whether some stance holds the centre of mass at all. */
  held: boolean
}

/**
 * The worst single caster load when a rigid plate stands on any three of its
 * wheels (an uneven floor): for each three kingpins whose triangle holds the
 * centre of mass (x, y), the weight splits by the barycentric coordinates of
 * the centre of mass (three supports are statically determinate: the moments
 * about two axes and the sum of the forces fix them). The largest share over
 * every such stance is the design load. Three casters: their exact loads.
 * Fewer than three, or a centre of mass no triangle holds: the whole weight.
 * `mass` in kg; kingpins in mm (the wheels taken at their kingpins).
 */
export function stanceLoads(kingpins: readonly Point[], x: number, y: number, mass: number): StanceLoads {
  const n = kingpins.length
  let worst = -1
  let caster = -1
  let stance: number[] = []
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      for (let k = j + 1; k < n; k++) {
        const a = kingpins[i]!
        const b = kingpins[j]!
        const c = kingpins[k]!
        const area2 = (b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1])
        const span = Math.max(Math.hypot(b[0] - a[0], b[1] - a[1]), Math.hypot(c[0] - a[0], c[1] - a[1]), 1e-9)
        // A stance of three casters in a line carries nothing off that line: not a stance.
        if (Math.abs(area2) < 1e-9 * span * span) continue
        const la = ((b[0] - x) * (c[1] - y) - (c[0] - x) * (b[1] - y)) / area2
        const lb = ((c[0] - x) * (a[1] - y) - (a[0] - x) * (c[1] - y)) / area2
        const lc = 1 - la - lb
        // On a side counts as held (a square with the centre of mass on its diagonal: W/2 on two casters).
        const eps = 1e-9
        if (la < -eps || lb < -eps || lc < -eps) continue
        for (const [share, index] of [[la, i], [lb, j], [lc, k]] as const) {
          if (share > worst) {
            worst = share
            caster = index
            stance = [i, j, k]
          }
        }
      }
    }
  }
  if (worst < 0) return { worst: mass, caster: -1, stance: [], held: false }
  return { worst: worst * mass, caster, stance, held: true }
}

export interface Overturn {
  /** Horizontal distance from the centre of mass to the nearest side of the outline's convex hull, mm. */
  distance: number
  /** atan(distance / height), degrees. */
  angle: number
  /** That side, mm. */
  line: [Point, Point] | null
}

/**
 * Overturning for real: once a root is down, the unit stands on the convex
 * hull of what touches the floor, the outline's hull (the wheels stand inside
 * it). It overturns when the centre of mass passes that hull's nearest side:
 * atan(d / h), h the centre of mass above the floor.
 */
export function overturn(outline: readonly Point[], x: number, y: number, height: number): Overturn {
  const hull = convexHull(outline)
  const n = hull.length
  if (n < 3) return { distance: 0, angle: 0, line: null }
  let distance = Infinity
  let line: [Point, Point] | null = null
  for (let i = 0; i < n; i++) {
    const a = hull[i]!
    const b = hull[(i + 1) % n]!
    const len = Math.hypot(b[0] - a[0], b[1] - a[1])
    if (len < 1e-12) continue
    // Counter-clockwise hull: inside is to the left, so this is positive inside.
    const d = ((b[0] - a[0]) * (y - a[1]) - (b[1] - a[1]) * (x - a[0])) / len
    if (d < distance) {
      distance = d
      line = [a, b]
    }
  }
  return { distance, angle: Math.atan2(distance, Math.max(height, 1e-9)) * DEG, line }
}

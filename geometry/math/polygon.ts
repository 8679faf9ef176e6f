// Plain polygon measures on the sampled outline. Kept dependency-free: they run
// on every rebuild, and the tests check them against an independent engine.

import type { Point } from '../types'
import type { Circle } from './circles'

/** Signed area by the shoelace formula: positive for a counter-clockwise ring. */
export function signedArea(ring: readonly Point[]): number {
  let sum = 0
  const n = ring.length
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = ring[j]!
    const b = ring[i]!
    sum += a[0] * b[1] - b[0] * a[1]
  }
  return sum / 2
}

export function perimeter(ring: readonly Point[]): number {
  let sum = 0
  const n = ring.length
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = ring[j]!
    const b = ring[i]!
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    // sqrt rather than Math.hypot: hypot's overflow guard costs several times more and plate sizes cannot overflow.
    sum += Math.sqrt(dx * dx + dy * dy)
  }
  return sum
}

export interface Bounds {
  minX: number
  minY: number
  maxX: number
  maxY: number
}

export function bounds(ring: readonly Point[]): Bounds {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const p of ring) {
    const x = p[0]
    const y = p[1]
    if (x < minX) minX = x
    if (y < minY) minY = y
    if (x > maxX) maxX = x
    if (y > maxY) maxY = y
  }
  return { minX, minY, maxX, maxY }
}

/** Distance from (px, py) to the nearest point of the ring's edges. */
export function distanceToRing(ring: readonly Point[], px: number, py: number): number {
  let best = Infinity
  const n = ring.length
  for (let i = 0; i < n; i++) {
    const [ax, ay] = ring[i]!
    const [bx, by] = ring[(i + 1) % n]!
    const dx = bx - ax
    const dy = by - ay
    const len2 = dx * dx + dy * dy
    let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0
    t = t < 0 ? 0 : t > 1 ? 1 : t
    const ex = ax + t * dx - px
    const ey = ay + t * dy - py
    const d2 = ex * ex + ey * ey
    if (d2 < best) best = d2
  }
  return Math.sqrt(best)
}

export interface RingProbe {
  /** Distance to the nearest point of the ring's edges. */
  distance: number
  inside: boolean
}

/**
 * Distance to the ring and inside/outside for several points in one pass over
 * the edges: the checks probe every hole centre on each rebuild, and one pass
 * keeps the ring's vertices in cache.
 */
export function probeRing(ring: readonly Point[], probes: readonly { x: number; y: number }[]): RingProbe[] {
  const m = probes.length
  const best = new Float64Array(m).fill(Infinity)
  const crossings = new Uint8Array(m)
  const n = ring.length
  const pxs = Float64Array.from(probes, (p) => p.x)
  const pys = Float64Array.from(probes, (p) => p.y)
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = ring[j]!
    const b = ring[i]!
    const ax = a[0]
    const ay = a[1]
    const bx = b[0]
    const by = b[1]
    const dx = bx - ax
    const dy = by - ay
    const len2 = dx * dx + dy * dy
    for (let k = 0; k < m; k++) {
      const px = pxs[k]!
      const py = pys[k]!
      let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0
      t = t < 0 ? 0 : t > 1 ? 1 : t
      const ex = ax + t * dx - px
      const ey = ay + t * dy - py
      const d2 = ex * ex + ey * ey
      if (d2 < best[k]!) best[k] = d2
      if (by > py !== ay > py && px < (dx * (py - by)) / dy + bx) crossings[k] = crossings[k]! ^ 1
    }
  }
  return Array.from(best, (d2, k) => ({ distance: Math.sqrt(d2), inside: crossings[k] === 1 }))
}

/** Even-odd point-in-polygon test. */
export function containsPoint(ring: readonly Point[], px: number, py: number): boolean {
  let inside = false
  const n = ring.length
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const [xi, yi] = ring[i]!
    const [xj, yj] = ring[j]!
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

/** Convex hull (Andrew's monotone chain), counter-clockwise. */
export function convexHull(points: readonly Point[]): Point[] {
  const pts = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1])
  if (pts.length < 3) return pts
  const cross = (o: Point, a: Point, b: Point) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
  const lower: Point[] = []
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2]!, lower[lower.length - 1]!, p) <= 0) lower.pop()
    lower.push(p)
  }
  const upper: Point[] = []
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i]!
    while (upper.length >= 2 && cross(upper[upper.length - 2]!, upper[upper.length - 1]!, p) <= 0) upper.pop()
    upper.push(p)
  }
  lower.pop()
  upper.pop()
  return lower.concat(upper)
}

function circleFrom2(a: Point, b: Point): Circle {
  const x = (a[0] + b[0]) / 2
  const y = (a[1] + b[1]) / 2
  return { x, y, radius: Math.hypot(a[0] - x, a[1] - y) }
}

function circleFrom3(a: Point, b: Point, c: Point): Circle {
  const bx = b[0] - a[0]
  const by = b[1] - a[1]
  const cx = c[0] - a[0]
  const cy = c[1] - a[1]
  const d = 2 * (bx * cy - by * cx)
  if (Math.abs(d) < 1e-12) {
    // Collinear: the widest pair spans the circle.
    const pairs: [Point, Point][] = [[a, b], [a, c], [b, c]]
    return pairs.map(([p, q]) => circleFrom2(p, q)).reduce((m, k) => (k.radius > m.radius ? k : m))
  }
  const ux = (cy * (bx * bx + by * by) - by * (cx * cx + cy * cy)) / d
  const uy = (bx * (cx * cx + cy * cy) - cx * (bx * bx + by * by)) / d
  return { x: a[0] + ux, y: a[1] + uy, radius: Math.hypot(ux, uy) }
}

function inCircle(c: Circle, p: Point): boolean {
  return Math.hypot(p[0] - c.x, p[1] - c.y) <= c.radius * (1 + 1e-12) + 1e-9
}

/**
 * Convex hull of a simple polygon in linear time (Melkman's algorithm): the
 * outline is already a simple ring, so no sort is needed. Counter-clockwise.
 */
export function simplePolygonHull(ring: readonly Point[]): Point[] {
  const n = ring.length
  if (n < 3) return [...ring]
  const cross = (o: Point, a: Point, b: Point) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0])
  // A deque in a plain array with a moving bottom index.
  const dq: Point[] = new Array<Point>(2 * n + 1)
  let bot = n
  let top = n - 1
  const p0 = ring[0]!
  const p1 = ring[1]!
  let k = 2
  // Skip points collinear with the first two.
  while (k < n && cross(p0, p1, ring[k]!) === 0) k++
  if (k === n) return convexHull(ring)
  const p2 = ring[k]!
  if (cross(p0, p1, p2) > 0) {
    dq[++top] = p0
    dq[++top] = p1
  } else {
    dq[++top] = p1
    dq[++top] = p0
  }
  dq[++top] = p2
  dq[--bot] = p2
  for (let i = k + 1; i < n; i++) {
    const p = ring[i]!
    if (cross(dq[bot]!, dq[bot + 1]!, p) > 0 && cross(dq[top - 1]!, dq[top]!, p) > 0) continue
    while (top - bot >= 2 && cross(dq[top - 1]!, dq[top]!, p) <= 0) top--
    dq[++top] = p
    while (top - bot >= 2 && cross(p, dq[bot]!, dq[bot + 1]!) <= 0) bot++
    dq[--bot] = p
  }
  return dq.slice(bot, top)
}

/**
 * Smallest circle enclosing the points (Welzl's algorithm in its iterative
 * form, on the hull). The points are taken in a fixed scrambled order rather
 * than a random one, so the result never varies between runs.
 */
export function enclosingCircle(points: readonly Point[], hullOf: (p: readonly Point[]) => Point[] = convexHull): Circle {
  const hull = hullOf(points)
  if (hull.length === 0) return { x: 0, y: 0, radius: 0 }
  const n = hull.length
  // A stride coprime with n visits every point once in a well-mixed order.
  let stride = Math.max(1, Math.floor(n * 0.618))
  while (gcd(stride, n) !== 1) stride++
  const pts: Point[] = []
  for (let i = 0, k = 0; i < n; i++, k = (k + stride) % n) pts.push(hull[k]!)
  let c: Circle = { x: pts[0]![0], y: pts[0]![1], radius: 0 }
  for (let i = 1; i < n; i++) {
    const p = pts[i]!
    if (inCircle(c, p)) continue
    c = { x: p[0], y: p[1], radius: 0 }
    for (let j = 0; j < i; j++) {
      const q = pts[j]!
      if (inCircle(c, q)) continue
      c = circleFrom2(p, q)
      for (let k = 0; k < j; k++) {
        const r = pts[k]!
        if (!inCircle(c, r)) c = circleFrom3(p, q, r)
      }
    }
  }
  return c
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b)
}

/**
 * Least width of a convex polygon over all directions, by rotating calipers:
 * it is always attained with one hull edge lying flat (Toussaint 1983), so
 * each edge is tried with its farthest vertex, found by a pointer that only
 * moves forward. Returns the width and the direction (radians) of that edge.
 */
export function minimumWidth(hull: readonly Point[]): { width: number; angle: number } {
  const n = hull.length
  if (n < 3) return { width: 0, angle: 0 }
  let best = Infinity
  let angle = 0
  let k = 1
  for (let i = 0; i < n; i++) {
    const a = hull[i]!
    const b = hull[(i + 1) % n]!
    const ex = b[0] - a[0]
    const ey = b[1] - a[1]
    const len = Math.sqrt(ex * ex + ey * ey)
    if (len === 0) continue
    const dist = (p: Point) => Math.abs(ex * (p[1] - a[1]) - ey * (p[0] - a[0])) / len
    while (dist(hull[(k + 1) % n]!) >= dist(hull[k % n]!) && (k + 1) % n !== i) k++
    const w = dist(hull[k % n]!)
    if (w < best) {
      best = w
      angle = Math.atan2(ey, ex)
    }
  }
  return { width: best, angle }
}

function extents(hull: readonly Point[], a: number): [number, number] {
  const c = Math.cos(a)
  const s = Math.sin(a)
  let minU = Infinity
  let maxU = -Infinity
  let minV = Infinity
  let maxV = -Infinity
  for (const p of hull) {
    const u = p[0] * c + p[1] * s
    const v = -p[0] * s + p[1] * c
    if (u < minU) minU = u
    if (u > maxU) maxU = u
    if (v < minV) minV = v
    if (v > maxV) maxV = v
  }
  return [maxU - minU, maxV - minV]
}

/** Room a fit may overshoot by, mm: floating-point noise only, far under anything a cutter or a tape measure sees. */
export const FIT_EPSILON = 1e-6

/**
 * A turn (degrees counter-clockwise) at which the shape's bounding box fits
 * `width` along x and `height` along y, or null when no orientation tried
 * fits: the narrowest direction, every hull edge's direction and half-degree
 * steps, each both ways round. The sheet check (geometry/checks/cutting.ts)
 * and the nester (geometry/nest/nest.ts) both ask this, so they agree on what
 * fits a sheet.
 */
export function fitTurn(points: readonly Point[], width: number, height: number): number | null {
  const hull = simplePolygonHull(points)
  if (hull.length < 3) return null
  const angles: number[] = [0, minimumWidth(hull).angle]
  for (let i = 0; i < hull.length; i++) {
    const p = hull[i]!
    const q = hull[(i + 1) % hull.length]!
    angles.push(Math.atan2(q[1] - p[1], q[0] - p[0]))
  }
  for (let i = 1; i < 360; i++) angles.push((i * Math.PI) / 360)
  for (const a of angles) {
    // extents(a) measures along a (u) and square to it (v): turning by -a lays u along x.
    const [u, v] = extents(hull, a)
    const deg = (-a * 180) / Math.PI
    if (u <= width + FIT_EPSILON && v <= height + FIT_EPSILON) return deg
    if (v <= width + FIT_EPSILON && u <= height + FIT_EPSILON) return deg + 90
  }
  return null
}

/**
 * Whether a shape fits a sheet of the given size in some orientation. Two
 * exact answers settle nearly every plate at once: narrower than the sheet
 * nowhere means no fit; narrow enough somewhere while no longer anywhere
 * than the sheet's length (the enclosing circle's diameter bounds every
 * extent) means a fit. Otherwise orientations are tried in half-degree steps
 * and at every hull edge's direction; a fit is accepted only when measured.
 */
export function fitsRectangle(points: readonly Point[], width: number, height: number, enclosingDiameter?: number): boolean {
  const hull = simplePolygonHull(points)
  const short = Math.min(width, height)
  const long = Math.max(width, height)
  const narrowest = minimumWidth(hull)
  if (narrowest.width > short) return false
  const diameter = enclosingDiameter ?? 2 * enclosingCircle(hull).radius
  if (diameter <= long) return true
  const angles: number[] = [narrowest.angle]
  for (let i = 0; i < 360; i++) angles.push((i * Math.PI) / 360)
  for (let i = 0; i < hull.length; i++) {
    const p = hull[i]!
    const q = hull[(i + 1) % hull.length]!
    angles.push(Math.atan2(q[1] - p[1], q[0] - p[0]))
  }
  for (const a of angles) {
    const [a1, a2] = extents(hull, a)
    if (Math.min(a1, a2) <= short && Math.max(a1, a2) <= long) return true
  }
  return false
}

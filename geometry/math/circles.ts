// Exact circle arithmetic for holes: every hole is a true circle, so overlaps
// and net areas are computed in closed form rather than on flattened polygons.

export interface Circle {
  x: number
  y: number
  radius: number
}

/** Distance between the centres. */
export function centreDistance(a: Circle, b: Circle): number {
  return Math.hypot(a.x - b.x, a.y - b.y)
}

/** Shortest distance between the two circles' edges: negative when they overlap, and for nested circles the gap inside the larger. */
export function edgeGap(a: Circle, b: Circle): number {
  const d = centreDistance(a, b)
  const inner = Math.abs(a.radius - b.radius)
  if (d < inner) return -(Math.min(a.radius, b.radius) + d)
  return d - a.radius - b.radius
}

/**
 * Area common to two circles of radii r1, r2 whose centres are d apart
 * (the lens of Weisstein, "Circle-Circle Intersection", MathWorld).
 */
export function lensArea(r1: number, r2: number, d: number): number {
  if (r1 <= 0 || r2 <= 0 || d >= r1 + r2) return 0
  if (d <= Math.abs(r1 - r2)) {
    const r = Math.min(r1, r2)
    return Math.PI * r * r
  }
  const clamp = (v: number) => Math.min(1, Math.max(-1, v))
  const a1 = Math.acos(clamp((d * d + r1 * r1 - r2 * r2) / (2 * d * r1)))
  const a2 = Math.acos(clamp((d * d + r2 * r2 - r1 * r1) / (2 * d * r2)))
  const k = (-d + r1 + r2) * (d + r1 - r2) * (d - r1 + r2) * (d + r1 + r2)
  return r1 * r1 * a1 + r2 * r2 * a2 - 0.5 * Math.sqrt(Math.max(0, k))
}

/**
 * Area covered by a set of circles, exactly, for any overlap (three or more
 * sharing a spot included). By Green's theorem the area is half the integral
 * of x dy - y dx round the union's boundary, and that boundary is made of the
 * arcs of each circle that no other circle covers; an arc of circle (cx, cy, r)
 * from t1 to t2 contributes (r^2 (t2 - t1) + cx r (sin t2 - sin t1) - cy r (cos t1 - cos t2)) / 2.
 * Gaps enclosed by a ring of circles come out negative by the same sum, as they must.
 */
export function unionArea(circles: readonly Circle[]): number {
  const list = circles.filter((c) => c.radius > 0)
  const EPS = 1e-9
  let area = 0
  for (let i = 0; i < list.length; i++) {
    const a = list[i]!
    let hidden = false
    const covered: [number, number][] = []
    for (let j = 0; j < list.length && !hidden; j++) {
      if (j === i) continue
      const b = list[j]!
      const d = centreDistance(a, b)
      const same = d <= EPS && Math.abs(a.radius - b.radius) <= EPS
      // A circle inside another (or the later of two equal ones) adds no boundary.
      if (same ? j < i : d + a.radius <= b.radius + EPS) {
        hidden = true
        break
      }
      if (same || d >= a.radius + b.radius || d + b.radius <= a.radius) continue
      const mid = Math.atan2(b.y - a.y, b.x - a.x)
      const half = Math.acos(Math.min(1, Math.max(-1, (a.radius * a.radius + d * d - b.radius * b.radius) / (2 * a.radius * d))))
      covered.push([mid - half, mid + half])
    }
    if (hidden) continue
    if (covered.length === 0) {
      area += Math.PI * a.radius * a.radius
      continue
    }
    // Normalise into [0, 2 pi), split at the seam, merge, and integrate the gaps.
    const TWO_PI = 2 * Math.PI
    const spans: [number, number][] = []
    for (const [lo, hi] of covered) {
      const s = ((lo % TWO_PI) + TWO_PI) % TWO_PI
      const e = s + (hi - lo)
      if (e > TWO_PI) spans.push([s, TWO_PI], [0, e - TWO_PI])
      else spans.push([s, e])
    }
    spans.sort((p, q) => p[0] - q[0])
    const arc = (t1: number, t2: number) =>
      0.5 * (a.radius * a.radius * (t2 - t1) + a.x * a.radius * (Math.sin(t2) - Math.sin(t1)) - a.y * a.radius * (Math.cos(t2) - Math.cos(t1)))
    let at = 0
    for (const [s, e] of spans) {
      if (s > at) area += arc(at, s)
      at = Math.max(at, e)
    }
    if (at < TWO_PI) area += arc(at, TWO_PI)
  }
  return area
}

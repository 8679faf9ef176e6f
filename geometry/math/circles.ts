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
 * Area covered by a set of circles, by inclusion-exclusion over pairs. Exact
 * while no point lies in three circles at once; three holes sharing wood is
 * already an error finding, and the figure then errs high by the triple overlap.
 */
export function unionArea(circles: readonly Circle[]): number {
  let area = 0
  for (let i = 0; i < circles.length; i++) {
    const a = circles[i]!
    area += Math.PI * a.radius * a.radius
    for (let j = i + 1; j < circles.length; j++) {
      const b = circles[j]!
      area -= lensArea(a.radius, b.radius, centreDistance(a, b))
    }
  }
  return area
}

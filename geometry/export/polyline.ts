// Polygon helpers the exporters share: orientation, simplification to a chord
// tolerance and flattening of the outline's cubic path. Plain arrays of [x, y]
// in millimetres. Offsets live in geometry/math/offset.ts (clipper2-ts).

import type { Point } from '../types'

export function signedArea(points: Point[]): number {
  let a = 0
  for (let i = 0; i < points.length; i++) {
    const [x0, y0] = points[i]!
    const [x1, y1] = points[(i + 1) % points.length]!
    a += x0 * y1 - x1 * y0
  }
  return a / 2
}

export function counterClockwise(points: Point[]): Point[] {
  return signedArea(points) < 0 ? [...points].reverse() : points
}

function pointSegmentDistance(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0]
  const dy = b[1] - a[1]
  const len2 = dx * dx + dy * dy
  if (len2 === 0) return Math.hypot(p[0] - a[0], p[1] - a[1])
  const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2))
  return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy)
}

/** Douglas-Peucker on an open run; keeps both ends. */
function simplifyRun(points: Point[], tolerance: number): Point[] {
  if (points.length < 3) return points
  const keep = new Uint8Array(points.length)
  keep[0] = 1
  keep[points.length - 1] = 1
  const stack: [number, number][] = [[0, points.length - 1]]
  while (stack.length > 0) {
    const [first, last] = stack.pop()!
    let worst = -1
    let worstDistance = tolerance
    for (let i = first + 1; i < last; i++) {
      const d = pointSegmentDistance(points[i]!, points[first]!, points[last]!)
      if (d > worstDistance) {
        worstDistance = d
        worst = i
      }
    }
    if (worst >= 0) {
      keep[worst] = 1
      stack.push([first, worst], [worst, last])
    }
  }
  return points.filter((_, i) => keep[i] === 1)
}

/** Fewer vertices, every dropped vertex within `tolerance` of the simplified outline. */
export function simplifyClosed(polygon: Point[], tolerance: number): Point[] {
  if (tolerance <= 0 || polygon.length < 4) return polygon
  const first = polygon[0]!
  let far = 0
  let farDistance = -1
  polygon.forEach((p, i) => {
    const d = Math.hypot(p[0] - first[0], p[1] - first[1])
    if (d > farDistance) {
      farDistance = d
      far = i
    }
  })
  const a = simplifyRun(polygon.slice(0, far + 1), tolerance)
  const b = simplifyRun([...polygon.slice(far), first], tolerance)
  return [...a.slice(0, -1), ...b.slice(0, -1)]
}

type Cubic = [Point, Point, Point, Point]

function flattenCubic(c: Cubic, tolerance: number, out: Point[], depth = 0): void {
  const [p0, p1, p2, p3] = c
  // Control points within the tolerance of the chord bound the curve's distance from it.
  const flat =
    pointSegmentDistance(p1, p0, p3) <= tolerance && pointSegmentDistance(p2, p0, p3) <= tolerance
  if (flat || depth > 16) {
    out.push(p3)
    return
  }
  const mid = (a: Point, b: Point): Point => [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2]
  const p01 = mid(p0, p1)
  const p12 = mid(p1, p2)
  const p23 = mid(p2, p3)
  const p012 = mid(p01, p12)
  const p123 = mid(p12, p23)
  const m = mid(p012, p123)
  flattenCubic([p0, p01, p012, m], tolerance, out, depth + 1)
  flattenCubic([m, p123, p23, p3], tolerance, out, depth + 1)
}

/**
 * Flatten one closed SVG path (M, L, H, V, C, Q, Z, absolute or relative) to a
 * polygon whose chords stay within `tolerance` of the curves. Returns null for
 * anything else (several subpaths, arcs), so the caller can fall back to the
 * outline polygon.
 */
export function flattenPath(d: string, tolerance: number): Point[] | null {
  const tokens = d.match(/[a-zA-Z]|[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?/g)
  if (!tokens) return null
  const out: Point[] = []
  let i = 0
  let cmd = ''
  let cur: Point = [0, 0]
  let subpaths = 0
  const num = (): number => {
    const t = tokens[i++]
    const v = t === undefined ? NaN : Number(t)
    if (!Number.isFinite(v)) throw new Error('bad number')
    return v
  }
  try {
    while (i < tokens.length) {
      const t = tokens[i]!
      if (/^[a-zA-Z]$/.test(t)) {
        cmd = t
        i++
        if (cmd === 'Z' || cmd === 'z') continue
      } else if (cmd === '' || cmd === 'Z' || cmd === 'z') {
        return null
      }
      const rel = cmd === cmd.toLowerCase()
      const abs = (x: number, y: number): Point => (rel ? [cur[0] + x, cur[1] + y] : [x, y])
      switch (cmd.toUpperCase()) {
        case 'M': {
          subpaths++
          if (subpaths > 1) return null
          cur = abs(num(), num())
          out.push(cur)
          cmd = rel ? 'l' : 'L'
          break
        }
        case 'L':
          cur = abs(num(), num())
          out.push(cur)
          break
        case 'H':
          cur = [rel ? cur[0] + num() : num(), cur[1]]
          out.push(cur)
          break
        case 'V':
          cur = [cur[0], rel ? cur[1] + num() : num()]
          out.push(cur)
          break
        case 'C': {
          const c1 = abs(num(), num())
          const c2 = abs(num(), num())
          const end = abs(num(), num())
          flattenCubic([cur, c1, c2, end], tolerance, out)
          cur = end
          break
        }
        case 'Q': {
          const q = abs(num(), num())
          const end = abs(num(), num())
          const c1: Point = [cur[0] + (2 / 3) * (q[0] - cur[0]), cur[1] + (2 / 3) * (q[1] - cur[1])]
          const c2: Point = [end[0] + (2 / 3) * (q[0] - end[0]), end[1] + (2 / 3) * (q[1] - end[1])]
          flattenCubic([cur, c1, c2, end], tolerance, out)
          cur = end
          break
        }
        default:
          return null
      }
    }
  } catch {
    return null
  }
  const first = out[0]
  const last = out[out.length - 1]
  if (first && last && out.length > 1 && Math.hypot(first[0] - last[0], first[1] - last[1]) < 1e-9) out.pop()
  return out.length >= 3 ? out : null
}

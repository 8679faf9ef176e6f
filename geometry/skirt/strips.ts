// skirtStrips: stations round the plate's edge and, at each, the strip that
// lofts from the edge up onto the tube. Pure geometry on the built plate.
//
// The outline is star-shaped about the plate centre (it is a radius function),
// so a ray from the centre through a station meets the edge once: the run is
// that edge point's radius less the tube's outside radius.

import type { Plate, Point } from '../types'
import { skirtSchema, type SkirtProfile, type SkirtSettings, type SkirtSettingsInput } from './settings'

const DEG = Math.PI / 180
const MM_PER_INCH = 25.4

export interface SkirtStrip {
  /** 1-based station number, counter-clockwise from the clocking axis. */
  number: number
  /** Polar angle of the station's ray from the plate centre, degrees (0-360, counter-clockwise from +x). */
  angle: number
  /** Station on the plate edge (plate coordinates, mm). */
  at: Point
  /** Plate edge in to the tube's outside wall along the ray, mm. */
  run: number
  /** Plate top up to the strip's top on the tube, mm. */
  rise: number
  /** Along the strip's curve, edge to tube, mm. */
  length: number
  /** Angle of the line from the strip's foot to its top, up from the plate, degrees. */
  lean: number
  /** Angle between the ray and the edge's outward normal, degrees: how far the strip twists off square to the edge. */
  splay: number
  /** Distance along the unrolled tube from the clocking axis to where the strip lands, mm. */
  offsetAlongWrap: number
  /**
   * Its two long sides, mm: each from a foot corner (half a strip width along
   * the edge either side of the station) to its top corner on the tube (half a
   * width round the tube either side of the landing). A strip leaning across a
   * root's flank is longer on the side further out.
   */
  sides: [number, number]
  /** The longest of the two sides and the centre line: what to cut, mm. */
  longestSide: number
}

export interface CutListRow {
  /** Cut length: each strip's longest side, rounded up to the shop's step (mm). */
  length: number
  count: number
  /** Station numbers in this group. */
  stations: number[]
}

export interface SkirtResult {
  settings: SkirtSettings
  strips: SkirtStrip[]
  /** The widest gap between neighbouring stations along the edge, mm. */
  largestGap: number
  /** Outline perimeter walked, mm. */
  perimeter: number
  /**
   * Where neighbouring stations stand further apart along the edge than a
   * strip is wide (only a fixed count can do this), the widest such gap: the
   * stations either side, the gap between them and the bare edge the strips
   * leave (gap less one strip width). Null when the strips cover the edge.
   */
  bareEdge: { after: number; before: number; gap: number; bare: number } | null
}

export interface SkirtOptions extends Partial<Omit<SkirtSettingsInput, 'profile'>> {
  profile?: SkirtProfile
}

/** Points of a strip's side profile, (0,0) at the foot on the plate edge, x toward the tube, y up; ends at (run, rise). */
export function profilePoints(run: number, rise: number, profile: SkirtProfile, n = 48): Point[] {
  const pts: Point[] = []
  for (let i = 0; i <= n; i++) pts.push(profileAt(run, rise, profile, i / n))
  return pts
}

/** One point of the profile at parameter t in [0, 1]. */
function profileAt(a: number, b: number, profile: SkirtProfile, t: number): Point {
  const line: Point = [a * t, b * t]
  if (profile === 'straight') return line
  // A quarter ellipse centred over the foot at (0, b): flat on the plate, upright at the tube.
  const th = (t * Math.PI) / 2
  const ell: Point = [a * Math.sin(th), b - b * Math.cos(th)]
  if (profile === 'quarter-ellipse') return ell
  return [(line[0] + ell[0]) / 2, (line[1] + ell[1]) / 2]
}

/** Length along the profile by composite Simpson's rule on the curve's speed (numeric, not a closed formula). */
export function profileLength(run: number, rise: number, profile: SkirtProfile): number {
  if (profile === 'straight') return Math.hypot(run, rise)
  const a = run
  const b = rise
  const speed = (t: number): number => {
    const th = (t * Math.PI) / 2
    const ex = (a * Math.PI * Math.cos(th)) / 2
    const ey = (b * Math.PI * Math.sin(th)) / 2
    if (profile === 'quarter-ellipse') return Math.hypot(ex, ey)
    return Math.hypot((a + ex) / 2, (b + ey) / 2)
  }
  const n = 128
  const h = 1 / n
  let sum = speed(0) + speed(1)
  for (let i = 1; i < n; i++) sum += speed(i * h) * (i % 2 ? 4 : 2)
  return (sum * h) / 3
}

interface Walk {
  points: Point[]
  /** Cumulative arc length at each vertex; cum[n] is the perimeter (closing edge). */
  cum: number[]
}

function walk(outline: readonly Point[]): Walk {
  const points = outline.slice()
  const cum = [0]
  for (let i = 0; i < points.length; i++) {
    const p = points[i]!
    const q = points[(i + 1) % points.length]!
    cum.push(cum[i]! + Math.hypot(q[0] - p[0], q[1] - p[1]))
  }
  return { points, cum }
}

function pointAt(w: Walk, s: number): { p: Point; i: number } {
  const per = w.cum[w.cum.length - 1]!
  s = ((s % per) + per) % per
  let lo = 0
  let hi = w.points.length
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (w.cum[mid]! <= s) lo = mid
    else hi = mid
  }
  const p = w.points[lo]!
  const q = w.points[(lo + 1) % w.points.length]!
  const seg = w.cum[lo + 1]! - w.cum[lo]!
  const t = seg > 0 ? (s - w.cum[lo]!) / seg : 0
  return { p: [p[0] + (q[0] - p[0]) * t, p[1] + (q[1] - p[1]) * t], i: lo }
}

/** Greatest distance of the edge between arc positions s0 and s1 from their chord. */
function standOff(w: Walk, s0: number, s1: number): number {
  const a = pointAt(w, s0)
  const b = pointAt(w, s1)
  const dx = b.p[0] - a.p[0]
  const dy = b.p[1] - a.p[1]
  const len = Math.hypot(dx, dy) || 1
  let worst = 0
  const n = w.points.length
  // Vertices strictly between the two positions (the edge is straight between vertices).
  let i = (a.i + 1) % n
  const steps = (b.i - a.i + n) % n
  for (let k = 0; k < steps; k++) {
    const v = w.points[i]!
    worst = Math.max(worst, Math.abs((v[0] - a.p[0]) * dy - (v[1] - a.p[1]) * dx) / len)
    i = (i + 1) % n
  }
  return worst
}

/** Arc position of the edge point on the clocking axis's ray (stations count from there). */
function startOnAxis(w: Walk, rotation: number): number {
  const a = rotation * DEG
  const d: Point = [Math.cos(a), Math.sin(a)]
  let best = 0
  let bestR = -Infinity
  const n = w.points.length
  for (let i = 0; i < n; i++) {
    const p = w.points[i]!
    const q = w.points[(i + 1) % n]!
    // Ray t*d meets segment p + u (q - p): solve by cross products.
    const ex = q[0] - p[0]
    const ey = q[1] - p[1]
    const den = d[0] * ey - d[1] * ex
    if (Math.abs(den) < 1e-12) continue
    const t = (p[0] * ey - p[1] * ex) / den
    const u = (p[0] * d[1] - p[1] * d[0]) / den
    if (u >= 0 && u <= 1 && t > bestR) {
      bestR = t
      best = w.cum[i]! + u * (w.cum[i + 1]! - w.cum[i]!)
    }
  }
  return best
}

/** Station arc positions: greedy steps of (width - overlap), shortened where the edge would stand off a flat strip by more than the flatness. */
function autoStations(w: Walk, start: number, pitch: number, flatness: number): number[] {
  const per = w.cum[w.cum.length - 1]!
  const least = Math.max(1, pitch / 16)
  const out = [start]
  let s = start
  let last = pitch
  while (s - start < per) {
    // Try a little past the last step first: the edge's turning changes gradually, so this saves most retries.
    let step = Math.min(pitch, last * 1.4, start + per - s)
    while (step > least && standOff(w, s, s + step) > flatness) step *= 0.9
    step = Math.max(step, Math.min(least, start + per - s))
    last = step
    s += step
    if (start + per - s < least * 0.5) break
    out.push(s)
  }
  // A last sliver shorter than a quarter pitch merges with its neighbour: split the final two gaps evenly.
  if (out.length > 3) {
    const last = out[out.length - 1]!
    if (start + per - last < pitch / 4) out[out.length - 1] = (out[out.length - 2]! + start + per) / 2
  }
  return out
}

/** A fixed count spread with the same density as the automatic stations: each automatic gap weighs one. */
function countStations(auto: number[], start: number, per: number, count: number): number[] {
  const knots = [...auto, start + per]
  const m = knots.length - 1
  const out: number[] = []
  for (let j = 0; j < count; j++) {
    const wgt = (j * m) / count
    const k = Math.min(m - 1, Math.floor(wgt))
    out.push(knots[k]! + (wgt - k) * (knots[k + 1]! - knots[k]!))
  }
  return out
}

/** Resolve the options (any subset of the settings) over a plate's saved skirt settings. */
export function resolveSkirt(plate: Plate, options: SkirtOptions = {}): SkirtSettings {
  const saved = (plate.params as { skirt?: SkirtSettings }).skirt
  return skirtSchema.parse({ ...(saved ?? {}), ...options })
}

export function skirtStrips(plate: Plate, options: SkirtOptions = {}): SkirtResult {
  const settings = resolveSkirt(plate, options)
  const w = walk(plate.outline)
  const per = w.cum[w.cum.length - 1]!
  const ro = plate.trunk.diameter / 2
  const rotation = plate.params.rotation
  const start = startOnAxis(w, rotation)
  const pitch = settings.stripWidth - settings.overlap
  const auto = autoStations(w, start, pitch, settings.flatness)
  const positions = settings.count ? countStations(auto, start, per, settings.count) : auto

  const stations = positions.map((s) => {
    const { p, i } = pointAt(w, s)
    const q0 = w.points[i]!
    const q1 = w.points[(i + 1) % w.points.length]!
    return { s, p, tangent: [q1[0] - q0[0], q1[1] - q0[1]] as Point }
  })
  const runs = stations.map((st) => Math.hypot(st.p[0], st.p[1]) - ro)
  const minRun = Math.min(...runs)
  const maxRun = Math.max(...runs)
  const high = settings.rootHeight ?? settings.height

  const half = settings.stripWidth / 2
  const strips: SkirtStrip[] = stations.map((st, k) => {
    const run = Math.max(0, runs[k]!)
    const t = maxRun > minRun ? (runs[k]! - minRun) / (maxRun - minRun) : 0
    const rise = settings.height + (high - settings.height) * t
    const angle = (((Math.atan2(st.p[1], st.p[0]) / DEG) % 360) + 360) % 360
    // Outward normal of a counter-clockwise edge is the tangent turned clockwise.
    const nx = st.tangent[1]
    const ny = -st.tangent[0]
    const rl = Math.hypot(st.p[0], st.p[1]) || 1
    const nl = Math.hypot(nx, ny) || 1
    const cos = Math.min(1, Math.max(-1, (nx * st.p[0] + ny * st.p[1]) / (nl * rl)))
    const fromAxis = (((angle - rotation) % 360) + 360) % 360
    // Each side: the foot corner on the edge to the top corner on the tube, in plan, then up by the rise.
    const landing = Math.atan2(st.p[1], st.p[0])
    const side = (dir: 1 | -1): number => {
      const foot = pointAt(w, positions[k]! + dir * half).p
      const top = landing + (dir * half) / ro
      return profileLength(Math.hypot(ro * Math.cos(top) - foot[0], ro * Math.sin(top) - foot[1]), rise, settings.profile)
    }
    const sides: [number, number] = [side(-1), side(1)]
    const length = profileLength(run, rise, settings.profile)
    return {
      number: k + 1,
      angle,
      at: st.p,
      run,
      rise,
      length,
      lean: Math.atan2(rise, run) / DEG,
      splay: Math.acos(cos) / DEG,
      offsetAlongWrap: ro * fromAxis * DEG,
      sides,
      longestSide: Math.max(length, ...sides),
    }
  })
  let largestGap = 0
  let widestAt = 0
  for (let k = 0; k < positions.length; k++) {
    const next = k + 1 < positions.length ? positions[k + 1]! : positions[0]! + per
    if (next - positions[k]! > largestGap) {
      largestGap = next - positions[k]!
      widestAt = k
    }
  }
  // Strips centred on their stations each cover half a width either side: a gap wider than a strip leaves bare edge.
  const bareEdge = largestGap > settings.stripWidth + 1e-6
    ? { after: widestAt + 1, before: ((widestAt + 1) % positions.length) + 1, gap: largestGap, bare: largestGap - settings.stripWidth }
    : null
  return { settings, strips, largestGap, perimeter: per, bareEdge }
}

/** The shop's usual cutting step: 1/8 in, or 5 mm in metric (from memory). */
export function cutStep(units: 'in' | 'mm'): number {
  return units === 'in' ? MM_PER_INCH / 8 : 5
}

/** Strips grouped by their longest side rounded UP to the step (a long strip trims; a short one is scrap), longest first. */
export function skirtCutList(strips: readonly Pick<SkirtStrip, 'number' | 'longestSide'>[], units: 'in' | 'mm'): CutListRow[] {
  const step = cutStep(units)
  const groups = new Map<number, CutListRow>()
  for (const s of strips) {
    const key = Math.ceil(s.longestSide / step - 1e-9)
    const row = groups.get(key) ?? { length: key * step, count: 0, stations: [] }
    row.count++
    row.stations.push(s.number)
    groups.set(key, row)
  }
  return [...groups.values()].sort((a, b) => b.length - a.length)
}

export interface SkirtTotals {
  count: number
  /** Sum of the cut lengths, mm. */
  runningLength: number
  /** Running length times strip width, mm2 (before any nesting waste). */
  sheetArea: number
}

export function skirtTotals(rows: readonly CutListRow[], stripWidth: number): SkirtTotals {
  const count = rows.reduce((n, r) => n + r.count, 0)
  const runningLength = rows.reduce((n, r) => n + r.count * r.length, 0)
  return { count, runningLength, sheetArea: runningLength * stripWidth }
}

// Turning the radius function into the two forms callers need: a polygon whose
// chords stay within a tolerance of the curve (for areas, checks, nesting and
// DXF), and SVG path data of cubic curves (for drawing and PDF).

import type { Point } from '../types'
import type { OutlineShape } from './shape'

const TWO_PI = 2 * Math.PI
/** Predicted sagitta allowed per chord, as a share of the tolerance. */
const PREDICT_FACTOR = 1
/** Midpoint deviation at which a chord is halved, as a share of the tolerance. */
const VERIFY_FACTOR = 0.5
const MAX_DEPTH = 10

export interface SampleOptions {
  /** Largest distance between the curve and a chord, mm. Default 0.1 (CONTRACTS.md). */
  tolerance?: number
}

function initialCount(shape: OutlineShape, least: number): number {
  // At least three samples across the narrowest lobe, so every lobe is seen before refining.
  return Math.min(8192, Math.max(least, Math.ceil((3 * TWO_PI) / shape.finestAngle)))
}

export interface SampledOutline {
  /** Counter-clockwise, first point not repeated. */
  points: Point[]
  /** The angle (radians, 0 to 2 pi) of each point. */
  thetas: Float64Array
  /** The curve a third of the way from each point to the next (x, y pairs): already evaluated while sampling, reused to check the path. */
  probes: Float64Array
}

/**
 * The outline as a counter-clockwise polygon. A uniform pass measures the
 * curve's bending by second differences (the sagitta of a chord over a span h
 * is |P''| h^2 / 8, and the second difference is |P''| h^2); each span is then
 * cut into enough equal pieces to bring that estimate within the tolerance,
 * and every piece is verified against the curve itself, because the estimate
 * is blind to bends narrower than the first pass's spacing. Random plates
 * (tests/unit/geometry/properties.test.ts) keep their worst chord near
 * two-thirds of the tolerance.
 */
export function sampleOutline(shape: OutlineShape, options: SampleOptions = {}): SampledOutline {
  const tolerance = options.tolerance ?? 0.1
  const n = initialCount(shape, 256)
  const h = TWO_PI / n
  const xs = new Float64Array(n)
  const ys = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const [x, y] = shape.pointAt(i * h)
    xs[i] = x
    ys[i] = y
  }
  const bend = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const a = (i + n - 1) % n
    const b = (i + 1) % n
    bend[i] = Math.hypot(xs[a]! - 2 * xs[i]! + xs[b]!, ys[a]! - 2 * ys[i]! + ys[b]!)
  }
  const chords = chordMaker(shape, tolerance)
  for (let i = 0; i < n; i++) {
    const next = (i + 1) % n
    const prev = (i + n - 1) % n
    chords.span(i * h, [xs[i]!, ys[i]!], (i + 1) * h, [xs[next]!, ys[next]!], Math.max(bend[prev]!, bend[i]!, bend[next]!))
  }
  const { points, thetas, probes } = chords
  return { points, thetas: Float64Array.from(thetas), probes: Float64Array.from(probes) }
}

/**
 * The chords of the outline between two of its points, by the rule above:
 * cut into enough equal pieces for the predicted sagitta, then each piece
 * emitted once the curve at a third and at two thirds of the way lies within
 * the tolerance of it (two probes catch an S-bend that a midpoint alone would
 * miss), otherwise split in three at those probes, so no evaluation is wasted.
 * Each chord emits its start point.
 */
function chordMaker(shape: OutlineShape, tolerance: number) {
  const predictTol = tolerance * PREDICT_FACTOR
  const verifyTol = tolerance * VERIFY_FACTOR
  const points: Point[] = []
  const thetas: number[] = []
  const probes: number[] = []
  const refine = (ta: number, a: Point, tb: number, b: Point, depth: number): void => {
    const t1 = ta + (tb - ta) / 3
    const t2 = ta + (2 * (tb - ta)) / 3
    const p1 = shape.pointAt(t1)
    const p2 = shape.pointAt(t2)
    const dx = b[0] - a[0]
    const dy = b[1] - a[1]
    const len = Math.sqrt(dx * dx + dy * dy)
    const dev = len > 0
      ? Math.max(Math.abs(dx * (p1[1] - a[1]) - dy * (p1[0] - a[0])), Math.abs(dx * (p2[1] - a[1]) - dy * (p2[0] - a[0]))) / len
      : 0
    if (dev <= verifyTol || depth >= MAX_DEPTH) {
      points.push(a)
      thetas.push(ta)
      probes.push(p1[0], p1[1])
      return
    }
    refine(ta, a, t1, p1, depth + 1)
    refine(t1, p1, t2, p2, depth + 1)
    refine(t2, p2, tb, b, depth + 1)
  }
  /** One span of the first uniform pass, `bend` the largest second difference at and beside its ends. */
  const span = (ta: number, a: Point, tb: number, b: Point, bend: number): void => {
    const pieces = Math.min(64, Math.max(1, Math.ceil(Math.sqrt(bend / 8 / predictTol))))
    for (let k = 1; k <= pieces; k++) {
      const t = ta + ((tb - ta) * k) / pieces
      const p: Point = k === pieces ? b : shape.pointAt(t)
      refine(ta + ((tb - ta) * (k - 1)) / pieces, a, t, p, 0)
      a = p
    }
  }
  return { points, thetas, probes, span }
}

/**
 * The outline between the angles `from` and `to` (radians, `from` < `to` <
 * `from` + 2 pi), both ends included, by the same rule and first spacing as
 * `sampleOutline`. A drag that changes one lobe samples only the arc that lobe
 * spans and keeps the rest of the last whole outline.
 */
export function sampleArc(shape: OutlineShape, from: number, to: number, options: SampleOptions = {}): { points: Point[]; thetas: Float64Array } {
  const tolerance = options.tolerance ?? 0.1
  const m = Math.max(2, Math.ceil((to - from) / (TWO_PI / initialCount(shape, 256))))
  const h = (to - from) / m
  // Samples -1 to m + 1: the two outside the arc only give the bend at its ends.
  const xs = new Float64Array(m + 3)
  const ys = new Float64Array(m + 3)
  for (let i = 0; i < m + 3; i++) {
    const [x, y] = shape.pointAt(from + (i - 1) * h)
    xs[i] = x
    ys[i] = y
  }
  const bend = new Float64Array(m + 3)
  for (let i = 1; i <= m + 1; i++) bend[i] = Math.hypot(xs[i - 1]! - 2 * xs[i]! + xs[i + 1]!, ys[i - 1]! - 2 * ys[i]! + ys[i + 1]!)
  bend[0] = bend[1]!
  bend[m + 2] = bend[m + 1]!
  const chords = chordMaker(shape, tolerance)
  for (let j = 0; j < m; j++) {
    chords.span(from + j * h, [xs[j + 1]!, ys[j + 1]!], j + 1 === m ? to : from + (j + 1) * h, [xs[j + 2]!, ys[j + 2]!], Math.max(bend[j]!, bend[j + 1]!, bend[j + 2]!))
  }
  chords.points.push([xs[m + 1]!, ys[m + 1]!])
  chords.thetas.push(to)
  return { points: chords.points, thetas: Float64Array.from(chords.thetas) }
}

export function samplePolygon(shape: OutlineShape, options: SampleOptions = {}): Point[] {
  return sampleOutline(shape, options).points
}

function fmt(v: number): string {
  return String(Math.round(v * 1000) / 1000)
}

/**
 * SVG path data of cubic Beziers through some of the vertices of the sampled
 * outline. Each span is the Hermite cubic matching the curve's position and
 * tangent at both ends (tangents from the neighbouring samples by a
 * second-order difference in the angle), so the path is smooth at every joint.
 * A span is kept only if it passes within half the tolerance of every sample
 * it skips and of the true curve between samples; otherwise it is
 * halved, down to one span per polygon edge, where the curve's midpoint is the
 * test and a straight chord the fallback.
 */
export function smoothPath(sampled: SampledOutline, shape: OutlineShape, options: SampleOptions = {}): string {
  const tol = (options.tolerance ?? 0.1) / 2
  const { points, thetas, probes } = sampled
  const n = points.length
  const theta = (i: number) => thetas[((i % n) + n) % n]! + TWO_PI * Math.floor(i / n)
  const at = (i: number) => points[((i % n) + n) % n]!
  const dx = new Float64Array(n)
  const dy = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const h1 = theta(i) - theta(i - 1)
    const h2 = theta(i + 1) - theta(i)
    const p0 = at(i - 1)
    const p1 = at(i)
    const p2 = at(i + 1)
    const w = h1 * h2 * (h1 + h2)
    dx[i] = (h1 * h1 * (p2[0] - p1[0]) + h2 * h2 * (p1[0] - p0[0])) / w
    dy[i] = (h1 * h1 * (p2[1] - p1[1]) + h2 * h2 * (p1[1] - p0[1])) / w
  }

  const parts: string[] = []
  const emit = (c1x: number, c1y: number, c2x: number, c2y: number, b: Point): void => {
    parts.push(`C${fmt(c1x)} ${fmt(c1y)} ${fmt(c2x)} ${fmt(c2y)} ${fmt(b[0])} ${fmt(b[1])}`)
  }
  const within = (a: Point, c1x: number, c1y: number, c2x: number, c2y: number, b: Point, t: number, p: Point): boolean => {
    const u = 1 - t
    const bx = u * u * u * a[0] + 3 * u * u * t * c1x + 3 * u * t * t * c2x + t * t * t * b[0]
    const by = u * u * u * a[1] + 3 * u * u * t * c1y + 3 * u * t * t * c2y + t * t * t * b[1]
    return Math.hypot(bx - p[0], by - p[1]) <= tol
  }

  // Tries the Hermite cubic from sample i to sample j against the samples between
  // them, or, for a single edge, against the curve's own midpoint.
  const span = (i: number, j: number): boolean => {
    const a = at(i)
    const b = at(j)
    const ia = ((i % n) + n) % n
    const ib = ((j % n) + n) % n
    const k = (theta(j) - theta(i)) / 3
    const c1x = a[0] + dx[ia]! * k
    const c1y = a[1] + dy[ia]! * k
    const c2x = b[0] - dx[ib]! * k
    const c2y = b[1] - dy[ib]! * k
    if (j - i === 1) {
      if (!within(a, c1x, c1y, c2x, c2y, b, 0.5, shape.pointAt((theta(i) + theta(j)) / 2))) {
        // A bend too sharp for the estimated tangents (a needle-thin lobe tip):
        // the straight chord, itself within the tolerance, drawn as a cubic.
        emit(a[0] + (b[0] - a[0]) / 3, a[1] + (b[1] - a[1]) / 3, a[0] + (2 * (b[0] - a[0])) / 3, a[1] + (2 * (b[1] - a[1])) / 3, b)
      } else {
        emit(c1x, c1y, c2x, c2y, b)
      }
      return true
    }
    for (let m = i + 1; m <= j; m++) {
      if (m < j && !within(a, c1x, c1y, c2x, c2y, b, (theta(m) - theta(i)) / (3 * k), at(m))) return false
      // Between two samples the cubic could bulge away unseen: test the true curve there too,
      // at the point the sampler evaluated a third of the way along that chord.
      const q = ((m - 1) % n + n) % n
      const third = theta(m - 1) + (theta(m) - theta(m - 1)) / 3
      if (!within(a, c1x, c1y, c2x, c2y, b, (third - theta(i)) / (3 * k), [probes[2 * q]!, probes[2 * q + 1]!])) return false
    }
    emit(c1x, c1y, c2x, c2y, b)
    return true
  }

  // Long spans first: the polygon's spacing already follows the bending, and a
  // cubic follows a smooth curve far more closely than a chord does.
  const fit = (i: number, j: number): void => {
    if (span(i, j)) return
    const m = (i + j) >> 1
    fit(i, m)
    fit(m, j)
  }
  const stride = 12
  for (let i = 0; i < n; i += stride) fit(i, Math.min(i + stride, n))
  const first = at(0)
  return `M${fmt(first[0])} ${fmt(first[1])}${parts.join('')}Z`
}

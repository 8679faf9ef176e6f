// What the editor draws while a handle is dragged: the plate's outline, holes
// and lobe tips for the params of this pointer move, without the findings,
// metrics and smooth path that buildPlate adds. A drag asks for this up to
// 60 times a second; the whole plate is built once more when the drag ends.

import type { PlateParams } from './params'
import type { Plate, Point } from './types'
import { roundFeatures, type RoundFeatures } from './features/holes'
import { casterMounts, tubeNotches } from './features/casters'
import { wrapAngle, type OutlineShape } from './outline/shape'
import { lobeTipsOf, plateOutlineShape } from './plate'
import { sampleArc, sampleOutline } from './outline/sample'

const DEG = Math.PI / 180
const TWO_PI = 2 * Math.PI
/** One empty list for every preview, so a drawing keyed on the findings sees no change between pointer moves. */
const NO_FINDINGS: Plate['findings'] = []

export interface PreviewOptions {
  /** Chord tolerance of the outline polygon, mm. Default 0.5: under a screen pixel at the zooms a whole plate is shown at. The editor passes about a screen pixel at its zoom. The bounds are the curve's own, whatever the tolerance. */
  tolerance?: number
}

/** A plate with the figures of the last whole build and the shape of the moment; `findings` are left empty until the drag ends. */
export interface PlatePreview extends Plate {
  preview: true
}

/** Plain data (numbers, strings, arrays, objects) equal all through. */
function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false
  if (Array.isArray(a) !== Array.isArray(b)) return false
  const ka = Object.keys(a)
  if (ka.length !== Object.keys(b).length) return false
  return ka.every(k => sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]))
}

/** The lobes, the unit on the plate and the skirt strips place no hole: when all else is the same, the holes of the last whole plate still stand. */
const NO_HOLES_FROM: ReadonlySet<string> = new Set(['lobes', 'unit', 'skirt'])
function sameFeatures(a: PlateParams, b: PlateParams): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)])
  for (const k of keys) {
    if (!NO_HOLES_FROM.has(k) && !sameData((a as unknown as Record<string, unknown>)[k], (b as unknown as Record<string, unknown>)[k])) return false
  }
  return true
}

/**
 * The outline's extent along one axis (0: x, 1: y), in one direction (1 or -1),
 * near sample i: golden-section search between its neighbours on the curve
 * itself. A chord cuts inside the curve, so the samples alone can read a
 * little short of the true extent, by up to the tolerance.
 */
function extentNear(pointAt: (theta: number) => [number, number], thetas: Float64Array, i: number, axis: 0 | 1, sign: 1 | -1): number {
  const n = thetas.length
  let lo = thetas[(i + n - 1) % n]!
  let hi = thetas[(i + 1) % n]!
  if (hi < lo) hi += 2 * Math.PI
  const g = (Math.sqrt(5) - 1) / 2
  const f = (t: number) => sign * pointAt(t)[axis]
  let a = hi - g * (hi - lo)
  let b = lo + g * (hi - lo)
  let fa = f(a)
  let fb = f(b)
  for (let k = 0; k < 10; k++) {
    if (fa > fb) {
      hi = b
      b = a
      fb = fa
      a = hi - g * (hi - lo)
      fa = f(a)
    }
    else {
      lo = a
      a = b
      fa = fb
      b = lo + g * (hi - lo)
      fb = f(b)
    }
  }
  return sign * Math.max(fa, fb, f(thetas[i]!))
}

/**
 * The plate for `params` as far as the drawing needs it during a drag. `base`
 * is the last plate built whole (the drag's start): its holes, mounts and
 * notches are reused when only the lobes changed, its metrics are kept except
 * the bounds, which the dimensions drawn beside the outline follow.
 */
export function previewPlate(params: PlateParams, base: Plate, options: PreviewOptions = {}): PlatePreview {
  const holesStand = sameFeatures(params, base.params)
  // Params alike but for the lobes, the unit and the skirt place the same holes: the drag start's stand.
  const features = holesStand ? wholeOf(base).features : roundFeatures(params)
  const shape = plateOutlineShape(params, features)
  const tolerance = options.tolerance ?? 0.5
  const lobe = holesStand ? onlyLobeChanged(params, base.params) : null
  const { points: outline, thetas } = (lobe !== null && keepingTheRest(base, shape, lobe, tolerance)) || sampleOutline(shape, { tolerance })
  // The samples at the extremes, then the curve's own extent near each: the dimensions drawn while
  // dragging read what the whole plate reads when the drag ends, whatever the chord tolerance.
  const at = [0, 0, 0, 0]
  outline.forEach(([x, y], i) => {
    if (x < outline[at[0]!]![0]) at[0] = i
    if (x > outline[at[1]!]![0]) at[1] = i
    if (y < outline[at[2]!]![1]) at[2] = i
    if (y > outline[at[3]!]![1]) at[3] = i
  })
  const minX = extentNear(shape.pointAt, thetas, at[0]!, 0, -1)
  const maxX = extentNear(shape.pointAt, thetas, at[1]!, 0, 1)
  const minY = extentNear(shape.pointAt, thetas, at[2]!, 1, -1)
  const maxY = extentNear(shape.pointAt, thetas, at[3]!, 1, 1)
  const lobeTips = lobeTipsOf(shape)
  const a = params.rotation * DEG
  const reach = params.tubeDiameter / 2
  const { pockets, rabbets, access, centre, index, fasteners } = features
  return {
    ...base,
    preview: true,
    params,
    outline,
    // Drawn from the polygon while dragging; no reader takes the path of a preview.
    outlinePath: '',
    lobeTips,
    ...(holesStand
      ? {}
      : {
          holes: [...pockets, ...access, centre, ...index],
          fasteners,
          rabbets,
          casterMounts: casterMounts(params, pockets),
          notches: tubeNotches(params, rabbets),
          trunk: { x: 0, y: 0, diameter: params.tubeDiameter, innerDiameter: params.tubeDiameter - 2 * params.tubeWall },
          axis: { angle: params.rotation, from: [-reach * Math.cos(a), -reach * Math.sin(a)], to: [reach * Math.cos(a), reach * Math.sin(a)] },
        }),
    findings: NO_FINDINGS,
    metrics: { ...base.metrics, bounds: { minX, minY, maxX, maxY } },
  }
}

/** The one lobe whose override alone differs between two params otherwise alike in their lobes, or null. */
function onlyLobeChanged(a: PlateParams, b: PlateParams): number | null {
  const { overrides: oa, ...restA } = a.lobes
  const { overrides: ob, ...restB } = b.lobes
  if (!sameData(restA, restB)) return null
  let changed: number | null = null
  for (const index of new Set([...oa, ...ob].map(o => o.index))) {
    if (sameData(oa.find(o => o.index === index), ob.find(o => o.index === index))) continue
    if (changed !== null) return null
    changed = index
  }
  return changed
}

interface Whole {
  features: RoundFeatures
  shape: OutlineShape
  /** The outline sampled at each tolerance asked for, with the angle of each point (rising from 0). */
  sampled: Map<number, { points: Point[]; thetas: Float64Array }>
}
const wholes = new WeakMap<Plate, Whole>()
/**
 * The whole plate's round features and outline shape, and its outline sampled
 * at the preview's tolerance, made once per plate and tolerance: a plate is
 * never changed, and the tolerance changes only with the zoom.
 */
function wholeOf(base: Plate): Whole {
  let whole = wholes.get(base)
  if (!whole) {
    const features = roundFeatures(base.params)
    whole = { features, shape: plateOutlineShape(base.params, features), sampled: new Map() }
    wholes.set(base, whole)
  }
  return whole
}
function sampledWhole(whole: Whole, tolerance: number): { points: Point[]; thetas: Float64Array } {
  let sampled = whole.sampled.get(tolerance)
  if (!sampled) {
    sampled = sampleOutline(whole.shape, { tolerance })
    whole.sampled.set(tolerance, sampled)
  }
  return sampled
}

/** Makes ready at a drag's start what every move of it reuses (the whole outline at the preview's tolerance), so the first move does not pay for it. */
export function preparePreview(base: Plate, options: PreviewOptions = {}): void {
  sampledWhole(wholeOf(base), options.tolerance ?? 0.5)
}

/** The number of angles in the rising list below `t`. */
function countBelow(thetas: Float64Array, t: number): number {
  let lo = 0
  let hi = thetas.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (thetas[mid]! < t) lo = mid + 1
    else hi = mid
  }
  return lo
}

/**
 * The outline when only lobe `index` changed: the radius function differs only
 * where that lobe spans, before or after the change, so the arc from the last
 * point of the whole plate's outline before that span to its first point after
 * it is sampled afresh, and every other point and chord of the whole outline
 * (sampled once at this tolerance) is kept as it was. Null when the span
 * covers most of the turn.
 */
function keepingTheRest(base: Plate, shape: OutlineShape, index: number, tolerance: number): { points: Point[]; thetas: Float64Array } | null {
  const whole = wholeOf(base)
  const outline = sampledWhole(whole, tolerance)
  const before = whole.shape.lobes.find(l => l.index === index)
  const after = shape.lobes.find(l => l.index === index)
  if (!before || !after) return null
  const centre = before.angle + wrapAngle(after.angle - before.angle)
  const from = Math.min(before.angle - before.halfWidth, centre - after.halfWidth)
  const to = Math.max(before.angle + before.halfWidth, centre + after.halfWidth)
  if (to - from > 1.5 * Math.PI) return null
  const { thetas } = outline
  const n = thetas.length
  const turn = (t: number) => ((t % TWO_PI) + TWO_PI) % TWO_PI
  // The kept point just before the span, and the one just after it.
  const last = (countBelow(thetas, turn(from)) + n - 1) % n
  const after0 = countBelow(thetas, turn(to))
  const first = (after0 < n && thetas[after0] === turn(to) ? after0 + 1 : after0) % n
  const kept = ((last - first + n) % n) + 1
  if (kept < 2 || kept >= n) return null
  const start = thetas[last]!
  const arc = sampleArc(shape, start, start + turn(thetas[first]! - start), { tolerance })
  // The arc's ends are the kept points `last` and `first` themselves: its own copies stand for them.
  const points = arc.points
  const angles = new Float64Array(points.length + kept - 2)
  arc.thetas.forEach((t, i) => { angles[i] = t % TWO_PI })
  for (let k = 1; k < kept - 1; k++) {
    const i = (first + k) % n
    angles[points.length] = thetas[i]!
    points.push(outline.points[i]!)
  }
  return { points, thetas: angles }
}

export function isPreview(plate: Plate): plate is PlatePreview {
  return (plate as Partial<PlatePreview>).preview === true
}

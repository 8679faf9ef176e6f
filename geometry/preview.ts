// What the editor draws while a handle is dragged: the plate's outline, holes
// and lobe tips for the params of this pointer move, without the findings,
// metrics and smooth path that buildPlate adds. A drag asks for this up to
// 60 times a second; the whole plate is built once more when the drag ends.

import type { PlateParams } from './params'
import type { Plate } from './types'
import { roundFeatures } from './features/holes'
import { casterMounts, tubeNotches } from './features/casters'
import { lobeTipsOf, plateOutlineShape } from './plate'
import { sampleOutline } from './outline/sample'

const DEG = Math.PI / 180
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
  const features = roundFeatures(params)
  const shape = plateOutlineShape(params, features)
  const { points: outline, thetas } = sampleOutline(shape, { tolerance: options.tolerance ?? 0.5 })
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

export function isPreview(plate: Plate): plate is PlatePreview {
  return (plate as Partial<PlatePreview>).preview === true
}

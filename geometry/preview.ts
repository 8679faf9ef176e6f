// What the editor draws while a handle is dragged: the plate's outline, holes
// and lobe tips for the params of this pointer move, without the findings,
// metrics and smooth path that buildPlate adds. A drag asks for this up to
// 60 times a second; the whole plate is built once more when the drag ends.

import type { PlateParams } from './params'
import type { Plate, LobeTip } from './types'
import { roundFeatures } from './features/holes'
import { casterMounts, tubeNotches } from './features/casters'
import { plateOutlineShape } from './plate'
import { sampleOutline } from './outline/sample'

const DEG = Math.PI / 180
/** One empty list for every preview, so a drawing keyed on the findings sees no change between pointer moves. */
const NO_FINDINGS: Plate['findings'] = []

export interface PreviewOptions {
  /** Chord tolerance of the outline polygon, mm. Default 0.5: under a screen pixel at the zooms a whole plate is shown at. */
  tolerance?: number
}

/** A plate with the figures of the last whole build and the shape of the moment; `findings` are left empty until the drag ends. */
export interface PlatePreview extends Plate {
  preview: true
}

/** Everything but the lobes: when it is unchanged, the holes of the last whole plate still stand. */
function featureKey(p: PlateParams): string {
  const { lobes: _lobes, unit: _unit, skirt: _skirt, ...rest } = p
  return JSON.stringify(rest)
}

/**
 * The plate for `params` as far as the drawing needs it during a drag. `base`
 * is the last plate built whole (the drag's start): its holes, mounts and
 * notches are reused when only the lobes changed, its metrics are kept except
 * the bounds, which the dimensions drawn beside the outline follow.
 */
export function previewPlate(params: PlateParams, base: Plate, options: PreviewOptions = {}): PlatePreview {
  const sameFeatures = featureKey(params) === featureKey(base.params)
  const features = roundFeatures(params)
  const shape = plateOutlineShape(params, features)
  const outline = sampleOutline(shape, { tolerance: options.tolerance ?? 0.5 }).points
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const [x, y] of outline) {
    if (x < minX) minX = x
    if (x > maxX) maxX = x
    if (y < minY) minY = y
    if (y > maxY) maxY = y
  }
  const lobeTips: LobeTip[] = shape.lobes.map((l) => {
    const radius = shape.radiusAt(l.angle)
    return { index: l.index, angle: (((l.angle / DEG) % 360) + 360) % 360, radius, x: radius * Math.cos(l.angle), y: radius * Math.sin(l.angle) }
  })
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
    ...(sameFeatures
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

// buildPlate: parameters in, a whole plate out. Pure and synchronous; it runs
// on every pointer move in the editor and again on the server for exports.

import type { PlateParams } from './params'
import type { LobeTip, Plate, Point } from './types'
import type { Circle } from './math/circles'
import { roundFeatures, type RoundFeatures } from './features/holes'
import { casterMounts, tubeBearing, tubeNotches } from './features/casters'
import { outlineShape, type OutlineShape } from './outline/shape'
import { sampleOutline, smoothPath } from './outline/sample'
import { floorStack } from './checks/floor'
import { plateFindings } from './checks/findings'
import { plateMetrics } from './metrics/metrics'
// Straight to the file, not the folder's index: geometry/stability never imports the plate back.
import { unitPlateFindings } from './stability/analyse'

const DEG = Math.PI / 180
/** Extra room (mm) kept round every clearance circle so the polygon's chords (up to 0.1 mm inside the curve) never eat into the minimum wood. */
const CHORD_ALLOWANCE = 0.2

export interface BuildOptions {
  /** Chord tolerance of the outline polygon and path, mm. Default 0.1. */
  tolerance?: number
}

/**
 * The outline's radius function for a plate, with the clearance circles it
 * encloses: each hole (a pocket by its rabbet) grown by the minimum wood.
 */
export function plateOutlineShape(params: PlateParams, features: RoundFeatures = roundFeatures(params)): OutlineShape {
  const { rabbets, access, centre, index } = features
  const minWood = params.minWood + CHORD_ALLOWANCE
  const clearances: Circle[] = [
    ...rabbets.map((rb) => ({ x: rb.x, y: rb.y, radius: rb.diameter / 2 + minWood })),
    ...[...access, centre, ...index].map((h) => ({ x: h.x, y: h.y, radius: h.diameter / 2 + minWood })),
  ]
  return outlineShape(params, clearances, { cutterRadius: params.cutting.bitDiameter / 2 })
}

/** Where each lobe's tip stands on the outline, with the lobe's own reach and width. */
export function lobeTipsOf(shape: OutlineShape): LobeTip[] {
  return shape.lobes.map((l) => {
    const radius = shape.radiusAt(l.angle)
    return { index: l.index, angle: (((l.angle / DEG) % 360) + 360) % 360, radius, x: radius * Math.cos(l.angle), y: radius * Math.sin(l.angle), reach: l.reach, width: l.width }
  })
}

export function buildPlate(params: PlateParams, options: BuildOptions = {}): Plate {
  const tolerance = options.tolerance ?? 0.1
  const features = roundFeatures(params)
  const { pockets, rabbets, access, centre, index, fasteners } = features
  const shape = plateOutlineShape(params, features)
  const sampled = sampleOutline(shape, { tolerance })
  const outline = sampled.points
  const outlinePath = smoothPath(sampled, shape, { tolerance })

  const lobeTips = lobeTipsOf(shape)

  const mounts = casterMounts(params, pockets)
  const notches = tubeNotches(params, rabbets)
  const bearing = tubeBearing(notches)
  const stack = floorStack(params)
  const holes = [...pockets, ...access, centre, ...index]
  const metrics = plateMetrics({
    outline,
    // The contract's area is the outline less `holes`; the rim fasteners (a few small
    // drilled holes) are left out of it so every reader computes the same figure.
    holes,
    tubeBearing: bearing,
    rabbets,
    pocketDiameter: params.pocketDiameter,
    thickness: stack.thickness,
    floorGap: stack.floorGap,
  })
  const findings = plateFindings({
    params,
    outline,
    pockets,
    rabbets,
    access,
    centre,
    index,
    casterMounts: mounts,
    fasteners,
    notches,
    tubeBearing: bearing,
    stack,
    shape,
    thetas: sampled.thetas,
    enclosingRadius: metrics.enclosingCircle.radius,
  })

  const a = params.rotation * DEG
  const reach = params.tubeDiameter / 2
  const axisEnd: Point = [reach * Math.cos(a), reach * Math.sin(a)]
  const plate: Plate = {
    params,
    outline,
    outlinePath,
    holes,
    fasteners,
    trunk: { x: 0, y: 0, diameter: params.tubeDiameter, innerDiameter: params.tubeDiameter - 2 * params.tubeWall },
    rabbets,
    casterMounts: mounts,
    notches,
    lobeTips,
    axis: { angle: params.rotation, from: [-axisEnd[0], -axisEnd[1]], to: axisEnd },
    findings,
    metrics,
  }
  // The unit's errors (it tips, a caster is overloaded, counterweight that cannot go in or fit) are the plate's errors too.
  if (params.unit) findings.push(...unitPlateFindings(plate, params.unit))
  return plate
}

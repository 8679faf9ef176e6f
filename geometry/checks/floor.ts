// How high the plate rides: the stack from the floor up through the caster, the
// pan and the plywood.
//
// The model. The pan is a steel cup turned mouth-down over its pocket: its rim
// rests on the rabbet floor (rabbetDepth below the top face) and its body rises
// above the plate, hidden inside the trunk (which is why the tube needs a notch
// where a pan reaches under its wall). The caster's top plate bolts to the
// underside of the pan's crown and the caster hangs down through the pocket.
// Heights above the plate's underside:
//
//   rabbet floor = T - rabbetDepth                  (T = layers * sheetThickness)
//   caster seat  = T - rabbetDepth + panDepth       (panDepth: rim underside to crown underside)
//   floor        = seat - overallHeight             (overallHeight: floor to top-plate face)
//
// so floor gap = overallHeight - (T - rabbetDepth + panDepth). A flat steel
// plate in the rabbet instead of a cup is panDepth = 0.
//
// Worked example (the default plate): T = 2 * 17.8562 = 35.7124 mm,
// rabbetDepth 9.525, panDepth 31.75, a 2 in caster 66.675 tall:
// seat = 35.7124 - 9.525 + 31.75 = 57.9374 mm; gap = 66.675 - 57.9374 = 8.7376 mm
// (about 11/32 in).

import type { PlateParams } from '../params'
import type { Finding } from '../types'

export interface FloorStack {
  /** Plate thickness, mm. */
  thickness: number
  /** Caster seat (underside of the pan's crown) above the plate's underside, mm. */
  seatHeight: number
  /** Plate underside above the floor, mm; negative means the plate would rest on the floor and lift the wheels. */
  floorGap: number
  /** Farthest reach of the swivelling wheel from the kingpin, in plan, at the height of the plate's underside; 0 when the wheel stays below the plate. */
  wheelReach: number
  /**
   * Radius the pocket must leave free round the kingpin: the corner of the
   * tread at that reach (the wheel is treadWidth wide, so its edge is
   * hypot(wheelReach, treadWidth / 2) out) plus the swivel clearance; 0 when
   * the wheel stays below the plate.
   */
  swivelRadius: number
}

export function floorStack(params: PlateParams): FloorStack {
  const c = params.caster
  const thickness = params.layers * params.sheetThickness
  const seatHeight = thickness - params.rabbetDepth + params.panDepth
  const floorGap = c.overallHeight - seatHeight
  const r = c.wheelDiameter / 2
  // The wheel is a disc of radius r standing on the floor with its axle
  // swivelLead from the kingpin; at height g its half-chord is sqrt(r^2 - (g - r)^2),
  // largest (r) at axle height. What sticks up into the pocket is what must swing clear.
  let wheelReach = 0
  if (floorGap < 2 * r) {
    const half = floorGap <= r ? r : Math.sqrt(Math.max(0, r * r - (floorGap - r) ** 2))
    wheelReach = c.swivelLead + half
  }
  const swivelRadius = wheelReach > 0 ? Math.hypot(wheelReach, c.treadWidth / 2) + c.swivelClearance : 0
  return { thickness, seatHeight, floorGap, wheelReach, swivelRadius }
}

/**
 * What the pan fasteners put below the plate's underside, mm (0 when nothing):
 *   rabbet floor (wood under the rim) = T - rabbetDepth
 *   a screw or bolt tip sticks out by  length - floor      (length: below the rim's underside)
 *   a T-nut's flange stands proud by   tnutFlange           (0 when let in flush)
 *   a nut in a counterbore sits inside the wood.
 * Worked example (defaults, screws): floor = 35.7124 - 9.525 = 26.1874 mm; a
 * 19.05 mm screw leaves 7.14 mm of wood under its tip: nothing projects.
 */
export function fastenerProjection(params: PlateParams): { projection: number; floor: number; tip: number; flange: number } {
  const fp = params.fasteners
  const floor = params.layers * params.sheetThickness - params.rabbetDepth
  const tip = fp.length - floor
  const flange = fp.kind === 'bolt-tnut' ? fp.tnutFlange : 0
  return { projection: Math.max(0, tip, flange), floor, tip, flange }
}

/**
 * Fasteners checked against the floor: anything below the plate must clear
 * the floor gap (with the least floor gap to spare); a screw must not come
 * through the underside; a bolt must reach its nut.
 */
export function fastenerFloorFindings(params: PlateParams, stack: FloorStack): Finding[] {
  const mm = (v: number) => `${Math.round(v * 10) / 10} mm`
  const fp = params.fasteners
  const { projection, floor, tip } = fastenerProjection(params)
  const found: Finding[] = []
  if (fp.kind === 'screw' && tip > 0) {
    found.push({
      code: 'fastener-through',
      severity: 'warning',
      message: `The pan screws reach ${mm(fp.length)} below the rim, through the ${mm(floor)} of wood under it: their tips come ${mm(tip)} out of the underside. Use shorter screws, or bolts.`,
      field: 'fasteners.length',
      values: { length: fp.length, floor, tip },
    })
  }
  if (fp.kind !== 'screw') {
    const needed = floor - (fp.kind === 'bolt-counterbore' ? fp.counterboreDepth : 0)
    if (fp.length < needed) {
      found.push({
        code: 'fastener-short',
        severity: 'error',
        message: `The pan bolts reach ${mm(fp.length)} below the rim, short of the ${mm(needed)} to their nut: they hold nothing. Use longer bolts.`,
        field: 'fasteners.length',
        values: { length: fp.length, needed },
      })
    }
  }
  if (projection > 0 && stack.floorGap - projection < params.minFloorGap) {
    const drags = projection >= stack.floorGap
    found.push({
      code: 'fastener-below-plate',
      severity: drags ? 'error' : 'warning',
      message: drags
        ? `The pan fasteners stand ${mm(projection)} below the plate, as much as or more than the ${mm(stack.floorGap)} floor gap: they drag on the floor.`
        : `The pan fasteners stand ${mm(projection)} below the plate, leaving ${mm(stack.floorGap - projection)} to the floor, less than the ${mm(params.minFloorGap)} least floor gap.`,
      field: 'fasteners.length',
      values: { projection, floorGap: stack.floorGap, clearance: stack.floorGap - projection, minFloorGap: params.minFloorGap },
    })
  }
  return found
}

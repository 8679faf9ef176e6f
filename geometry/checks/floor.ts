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

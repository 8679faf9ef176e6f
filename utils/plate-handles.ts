// What dragging or nudging a canvas handle does to the params. Pure: takes a
// draft of the params and the plate built from them, changes the draft.
import type { Plate, PlateParams } from '~~/geometry/core'
import { plateOutlineShape } from '../geometry/plate'
import { nominalAngle } from '../geometry/roots'

export type HandleKind = 'lobe' | 'pocket'
export type HandleTarget = { kind: HandleKind; index: number }

const deg = (rad: number) => (rad * 180) / Math.PI
const clamp = (v: number, lo: number, hi: number) => Math.min(Math.max(v, lo), hi)
/** Angle folded into (-180, 180]. */
export const fold = (a: number) => {
  const r = ((a % 360) + 540) % 360 - 180
  return r === -180 ? 180 : r
}

/**
 * Moves lobe `index` so its tip follows the point: the lobe's override gets
 * the reach and the angle offset that close the gap between the tip and the
 * point. Applied on every pointer move, the remaining gap vanishes within a
 * few frames whatever the irregularity did to the lobe.
 */
export function moveLobeTip(draft: PlateParams, plate: Plate, index: number, point: { x: number; y: number }): void {
  const tip = plate.lobeTips.find(t => t.index === index)
  if (!tip) return
  const radius = Math.hypot(point.x, point.y)
  const angle = deg(Math.atan2(point.y, point.x))
  let o = draft.lobes.overrides.find(v => v.index === index)
  if (o?.reach === undefined || o.angle === undefined) {
    // A lobe not yet pulled starts from the reach and the angle its irregularity gave it:
    // starting from the plain values made the first nudge jump the tip sideways.
    const lobe = plateOutlineShape(draft).lobes.find(l => l.index === index)
    if (!o) {
      o = { index }
      draft.lobes.overrides.push(o)
    }
    if (lobe) {
      o.reach ??= lobe.reach
      o.angle ??= fold(deg(lobe.angle) - nominalAngle(draft, index))
    }
  }
  o.reach = Math.round(clamp((o.reach ?? 0) + (radius - tip.radius), 0, 900) * 10) / 10
  if (radius > 1) o.angle = Math.round(clamp(fold((o.angle ?? 0) + fold(angle - tip.angle)), -180, 180) * 10) / 10
}

/** Moves caster pocket `index` to the point: its distance sets the caster offset, its angle the rotation. */
export function movePocket(draft: PlateParams, index: number, point: { x: number; y: number }): void {
  const radius = Math.hypot(point.x, point.y)
  draft.casterOffset = Math.round(clamp(radius, 20, 1500) * 10) / 10
  if (radius > 1) {
    const angle = deg(Math.atan2(point.y, point.x)) - (index * 360) / draft.casterCount
    draft.rotation = Math.round(fold(angle) * 10) / 10
  }
}

/** Where a handle is now, in plate coordinates. */
export function handlePoint(plate: Plate, kind: HandleKind, index: number): { x: number; y: number } | null {
  if (kind === 'lobe') {
    const tip = plate.lobeTips.find(t => t.index === index)
    return tip ? { x: tip.x, y: tip.y } : null
  }
  const pocket = plate.holes.filter(h => h.kind === 'pocket')[index]
  return pocket ? { x: pocket.x, y: pocket.y } : null
}

export function moveHandle(draft: PlateParams, plate: Plate, kind: HandleKind, index: number, point: { x: number; y: number }): void {
  if (kind === 'lobe') moveLobeTip(draft, plate, index, point)
  else movePocket(draft, index, point)
}

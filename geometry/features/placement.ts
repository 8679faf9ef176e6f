// Choosing where the pans and access openings go for a tube: used by the
// starting shapes, by sizing a design to another tube and by the new-design
// form, so every fresh plate hides its casters wherever the tube allows it.

import { minCasterOffset, type PlateParams } from '../params'

/** The default of `panTuck`: how far inside the tube's outside wall a pan's rabbet is tucked, mm, room for a tube that is not quite round (common practice, from memory). */
export const PAN_TUCK = 1.5

export interface CasterPlacement {
  /** The caster offset chosen, mm, on a 0.5 mm step. */
  offset: number
  /** True when the pans and their rabbets sit inside the tube's outside wall at that offset. */
  hidden: boolean
  /** Largest offset that keeps the pans hidden, mm (may be below `least`). */
  hiddenMax: number
  /** Least offset at which the pans clear the centre hole and each other by the minimum wood, mm. */
  least: number
}

/** Radius of a pan's rabbet ring, mm: what must hide inside the trunk. */
export function panRadius(p: Pick<PlateParams, 'pocketDiameter' | 'rabbetWidth'>): number {
  return p.pocketDiameter / 2 + p.rabbetWidth
}

/**
 * The caster offset that hides the pans: as far out as the tube's outside
 * wall allows (a wider stance rolls steadier), but never so far in that the
 * pans crowd the centre hole or each other. When the tube is too slim for
 * both, the pans go as far in as they can and `hidden` is false.
 */
export function placeCasters(p: PlateParams): CasterPlacement {
  const R = panRadius(p)
  const n = p.casterCount
  // Neighbouring pocket centres stand 2 d sin(pi / n) apart; the rabbets need the minimum wood between them.
  const spacing = (2 * R + p.minWood) / (2 * Math.sin(Math.PI / n))
  const least = Math.max(minCasterOffset(p), spacing)
  const hiddenMax = p.tubeDiameter / 2 - R - (p.panTuck ?? PAN_TUCK)
  if (hiddenMax >= least) {
    return { offset: Math.max(20, Math.floor(hiddenMax * 2) / 2), hidden: true, hiddenMax, least }
  }
  return { offset: Math.min(1500, Math.ceil(least * 2) / 2), hidden: false, hiddenMax, least }
}

/**
 * An access-opening offset for the given caster offset: inside the tube's
 * inside wall, clear of the centre hole, as far from the pans as it can get
 * (searched on a 0.5 mm step). Null when no offset keeps the opening inside
 * the tube's inside wall with the minimum wood to the centre hole, the pans
 * and its neighbours.
 */
export function placeAccess(p: PlateParams, casterOffset: number, diameter: number): number | null {
  const n = p.casterCount
  const r = diameter / 2
  const ri = p.tubeDiameter / 2 - p.tubeWall
  const R = panRadius(p)
  const lo = p.centreHoleDiameter / 2 + p.minWood + r
  // Stay a millimetre inside the inside wall: the wall check is strict.
  const hi = ri - r - 1
  if (hi < lo) return null
  const half = Math.PI / n
  let best = lo
  let bestGap = -Infinity
  for (let a = lo; a <= hi + 1e-9; a += 0.5) {
    const toPan = Math.sqrt(a * a + casterOffset * casterOffset - 2 * a * casterOffset * Math.cos(half)) - R - r
    const toNeighbour = 2 * a * Math.sin(half) - 2 * r
    const gap = Math.min(toPan, toNeighbour)
    if (gap > bestGap + 1e-9) {
      bestGap = gap
      best = a
    }
  }
  if (bestGap < p.minWood) return null
  return Math.round(best * 2) / 2
}

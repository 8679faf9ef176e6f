// The round features of a plate: pockets with their rabbet rings, access
// openings, the centre hole and the index holes. Positions follow the clocking:
// caster k sits at rotation + k * 360 / n, openings halfway between casters.

import type { PlateParams } from '../params'
import type { Hole, Rabbet } from '../types'

const DEG = Math.PI / 180

/**
 * Hole-saw diameters in inches, 3/4 to 6 in: eighths up to 3-5/8, then the
 * common quarter and half steps. Common practice from memory, not a maker's
 * catalogue; the sizes sold vary a little between brands.
 */
export const HOLE_SAW_INCHES: readonly number[] = [
  0.75, 0.875, 1, 1.125, 1.25, 1.375, 1.5, 1.625, 1.75, 1.875, 2, 2.125, 2.25, 2.375, 2.5, 2.625, 2.75,
  2.875, 3, 3.125, 3.25, 3.375, 3.5, 3.625, 3.75, 4, 4.125, 4.25, 4.5, 4.75, 5, 5.25, 5.5, 6,
]

/**
 * The nearest hole-saw diameter, in mm; a tie goes to the larger saw (more room
 * for a hand). Diameters beyond the largest saw by more than half its last step
 * are left as given: they are cut with a router and a pattern.
 */
export function snapToHoleSaw(diameterMm: number): number {
  const largest = HOLE_SAW_INCHES[HOLE_SAW_INCHES.length - 1]! * 25.4
  if (diameterMm > largest + 0.25 * 25.4) return diameterMm
  let best = HOLE_SAW_INCHES[0]! * 25.4
  for (const inches of HOLE_SAW_INCHES) {
    const mm = (inches * 254) / 10
    if (Math.abs(mm - diameterMm) <= Math.abs(best - diameterMm) + 1e-9) best = mm
  }
  return best
}

export function casterAngle(params: PlateParams, k: number): number {
  return params.rotation + (k * 360) / params.casterCount
}

export interface RoundFeatures {
  pockets: Hole[]
  rabbets: Rabbet[]
  access: Hole[]
  centre: Hole
  /** Index holes that survive; one landing inside a pocket's rabbet is left out, since the pocket's own centre lies on the same axis and marks it. */
  index: Hole[]
}

export function roundFeatures(params: PlateParams): RoundFeatures {
  const n = params.casterCount
  const pockets: Hole[] = []
  const rabbets: Rabbet[] = []
  for (let k = 0; k < n; k++) {
    const a = casterAngle(params, k) * DEG
    const x = params.casterOffset * Math.cos(a)
    const y = params.casterOffset * Math.sin(a)
    const id = `pocket-${k}`
    pockets.push({ id, kind: 'pocket', x, y, diameter: params.pocketDiameter })
    rabbets.push({ pocketId: id, x, y, diameter: params.pocketDiameter + 2 * params.rabbetWidth, depth: params.rabbetDepth })
  }

  const access: Hole[] = []
  if (params.access.enabled) {
    const diameter = params.access.snapToHoleSaw ? snapToHoleSaw(params.access.diameter) : params.access.diameter
    for (let k = 0; k < n; k++) {
      const a = (casterAngle(params, k) + 180 / n) * DEG
      access.push({
        id: `access-${k}`,
        kind: 'access',
        x: params.access.offset * Math.cos(a),
        y: params.access.offset * Math.sin(a),
        diameter,
      })
    }
  }

  const centre: Hole = { id: 'centre', kind: 'centre', x: 0, y: 0, diameter: params.centreHoleDiameter }

  const index: Hole[] = []
  const trunkRadius = params.tubeDiameter / 2
  for (let k = 0; k < 2; k++) {
    const a = (params.rotation + k * 180) * DEG
    const x = trunkRadius * Math.cos(a)
    const y = trunkRadius * Math.sin(a)
    const r = params.indexHoleDiameter / 2
    const swallowed = rabbets.some((rb) => Math.hypot(rb.x - x, rb.y - y) < rb.diameter / 2 + r)
    if (!swallowed) index.push({ id: `index-${k}`, kind: 'index', x, y, diameter: params.indexHoleDiameter })
  }
  return { pockets, rabbets, access, centre, index }
}

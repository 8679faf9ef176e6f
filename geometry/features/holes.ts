// The round features of a plate: pockets with their rabbet rings, access
// openings, the centre hole and the index holes. Positions follow the clocking:
// caster k sits at rotation + k * 360 / n, openings halfway between casters.

import type { PlateParams } from '../params'
import type { Fastener, Hole, Rabbet } from '../types'
import type { Circle } from '../math/circles'

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

/** How an opening of this diameter is cut: a hole saw when one of that size exists, otherwise routed round a pattern. */
export function openingMethod(diameterMm: number): Pick<Hole, 'method' | 'sawSize'> {
  for (const inches of HOLE_SAW_INCHES) {
    const mm = (inches * 254) / 10
    // Within a quarter millimetre: a saw's real cut already varies more than that.
    if (Math.abs(mm - diameterMm) <= 0.25) return { method: 'hole-saw', sawSize: mm }
  }
  return { method: 'routed' }
}

export function casterAngle(params: PlateParams, k: number): number {
  return params.rotation + (k * 360) / params.casterCount
}

export interface RoundFeatures {
  pockets: Hole[]
  rabbets: Rabbet[]
  access: Hole[]
  centre: Hole
  /** Always two, on the clocking axis where they find room (see placeIndexHole). */
  index: Hole[]
  fasteners: Fastener[]
}

/**
 * Wood kept between an index hole and any other hole, mm: a 1/8 in drilled
 * mark needs far less than the minimum wood round an opening; 1/4 in (or the
 * minimum wood if that is less) keeps the drill from breaking into the
 * neighbour (from memory).
 */
export function indexClearance(params: PlateParams): number {
  return Math.min(params.minWood, 6.35)
}

/**
 * Where an index hole goes. It belongs on the clocking axis at the tube's
 * outside wall (where the tube's own clocking mark meets the plate); if a
 * pan, opening or other hole is in the way it moves along the axis, out or in,
 * to the nearest free spot; only if the whole axis is taken does it turn to the
 * nearest free angle. It never disappears: when no spot is free (a plate
 * already full of errors) it stays at the wall and the overlap is reported.
 */
export function placeIndexHole(params: PlateParams, angleDeg: number, obstacles: readonly Circle[]): { x: number; y: number; angle: number } {
  const r = params.indexHoleDiameter / 2
  const gap = indexClearance(params)
  const ro = params.tubeDiameter / 2
  const free = (x: number, y: number) => obstacles.every((c) => Math.hypot(c.x - x, c.y - y) >= c.radius + r + gap - 1e-9)
  const reachOut = Math.max(50, 0.5 * ro)
  const inner = params.centreHoleDiameter / 2 + gap + r
  const search = (deg: number): { x: number; y: number } | null => {
    const a = deg * DEG
    const c = Math.cos(a)
    const s = Math.sin(a)
    // Out as far as reachOut, in as far as the centre hole: the whole axis within the plate.
    for (let step = 0; step <= Math.max(reachOut, ro - inner); step += 0.5) {
      if (step <= reachOut && free((ro + step) * c, (ro + step) * s)) return { x: (ro + step) * c, y: (ro + step) * s }
      const inward = ro - step
      if (step > 0 && inward >= inner && free(inward * c, inward * s)) return { x: inward * c, y: inward * s }
    }
    return null
  }
  const onAxis = search(angleDeg)
  if (onAxis) return { ...onAxis, angle: angleDeg }
  for (let turn = 1; turn < 180; turn++) {
    for (const deg of [angleDeg + turn, angleDeg - turn]) {
      const spot = search(deg)
      if (spot) return { ...spot, angle: deg }
    }
  }
  return { x: ro * Math.cos(angleDeg * DEG), y: ro * Math.sin(angleDeg * DEG), angle: angleDeg }
}

/** Diameter of the circle the pan-rim fasteners stand on: as given, or the middle of the rabbet ring. */
export function fastenerCircleDiameter(params: PlateParams): number {
  return params.fasteners.boltCircleDiameter ?? params.pocketDiameter + params.rabbetWidth
}

export function roundFeatures(params: PlateParams): RoundFeatures {
  const n = params.casterCount
  const pockets: Hole[] = []
  const rabbets: Rabbet[] = []
  const fasteners: Fastener[] = []
  const pocketCut = openingMethod(params.pocketDiameter)
  const boltRadius = fastenerCircleDiameter(params) / 2
  const nf = params.fasteners.count
  const through = params.fasteners.kind !== 'screw'
  for (let k = 0; k < n; k++) {
    const angle = casterAngle(params, k)
    const a = angle * DEG
    const x = params.casterOffset * Math.cos(a)
    const y = params.casterOffset * Math.sin(a)
    const id = `pocket-${k}`
    pockets.push({ id, kind: 'pocket', x, y, diameter: params.pocketDiameter, ...pocketCut })
    rabbets.push({ pocketId: id, x, y, diameter: params.pocketDiameter + 2 * params.rabbetWidth, depth: params.rabbetDepth })
    // Half a step off the radial line, so no fastener sits where the tube notch and the plate's edge come closest.
    for (let j = 0; j < nf; j++) {
      const b = (angle + ((j + 0.5) * 360) / nf) * DEG
      fasteners.push({ id: `fastener-${k}-${j}`, pocketId: id, x: x + boltRadius * Math.cos(b), y: y + boltRadius * Math.sin(b), diameter: params.fasteners.diameter, through })
    }
  }

  const access: Hole[] = []
  if (params.access.enabled) {
    const diameter = params.access.snapToHoleSaw ? snapToHoleSaw(params.access.diameter) : params.access.diameter
    const cut = openingMethod(diameter)
    for (let k = 0; k < n; k++) {
      const a = (casterAngle(params, k) + 180 / n) * DEG
      access.push({
        id: `access-${k}`,
        kind: 'access',
        x: params.access.offset * Math.cos(a),
        y: params.access.offset * Math.sin(a),
        diameter,
        ...cut,
      })
    }
  }

  const centre: Hole = { id: 'centre', kind: 'centre', x: 0, y: 0, diameter: params.centreHoleDiameter, method: 'drill' }

  const obstacles: Circle[] = [
    ...rabbets.map((rb) => ({ x: rb.x, y: rb.y, radius: rb.diameter / 2 })),
    ...[...access, centre].map((h) => ({ x: h.x, y: h.y, radius: h.diameter / 2 })),
  ]
  const index: Hole[] = []
  for (let k = 0; k < 2; k++) {
    const spot = placeIndexHole(params, params.rotation + k * 180, obstacles)
    const hole: Hole = { id: `index-${k}`, kind: 'index', x: spot.x, y: spot.y, diameter: params.indexHoleDiameter, method: 'drill' }
    index.push(hole)
    obstacles.push({ x: hole.x, y: hole.y, radius: hole.diameter / 2 })
  }
  return { pockets, rabbets, access, centre, index, fasteners }
}

// Caster top plates and the notches the tube needs over the pockets.

import type { PlateParams } from '../params'
import type { CasterMount, Hole, Point, TubeNotch } from '../types'
import { casterAngle } from './holes'

const DEG = Math.PI / 180

/**
 * Each top plate is centred on its kingpin (the pocket centre) and turned
 * square to the radial line: its width runs along the radius, its length
 * across it, so the bolt pattern lands the same way on every pan and the
 * bolts stay clear of the swivel raceway round the kingpin.
 */
export function casterMounts(params: PlateParams, pockets: readonly Hole[]): CasterMount[] {
  const c = params.caster
  return pockets.map((pocket, k) => {
    const angle = casterAngle(params, k)
    const a = angle * DEG
    const ux = Math.cos(a)
    const uy = Math.sin(a)
    // Tangent: the radial direction turned a quarter counter-clockwise.
    const tx = -uy
    const ty = ux
    const at = (u: number, t: number): Point => [pocket.x + u * ux + t * tx, pocket.y + u * uy + t * ty]
    const w = c.topPlateWidth / 2
    const l = c.topPlateLength / 2
    const corners = [at(-w, -l), at(w, -l), at(w, l), at(-w, l)]
    const bu = c.boltSpacingY / 2
    const bt = c.boltSpacingX / 2
    const bolts = [at(-bu, -bt), at(bu, -bt), at(bu, bt), at(-bu, bt)].map(([x, y]) => ({ x, y, diameter: c.boltDiameter }))
    return { pocketId: pocket.id, angle, corners, bolts }
  })
}

/**
 * Room above the pan's crown in a tube notch, mm: the crown's steel, the nuts
 * on the caster's bolts and a little play. 1/2 in, from memory.
 */
export const NOTCH_CLEARANCE = 12.7

/** How far the pan stands above the plate's top face, mm: from the rabbet floor up to the crown's underside, less the rabbet's depth. */
export function panRise(params: PlateParams): number {
  return Math.max(0, params.panDepth - params.rabbetDepth)
}

/** Largest angle (radians) either side of the centre line at which a circle of radius s crosses a circle of radius rho centred d from the origin. */
function halfAngleAt(s: number, d: number, rho: number): number {
  const cos = (s * s + d * d - rho * rho) / (2 * s * d)
  return Math.acos(Math.min(1, Math.max(-1, cos)))
}

/**
 * Where a pan (its rabbet circle, so the tube's cut edge lands on wood and not
 * on the steel rim) reaches under the tube wall, the tube needs a notch. The
 * notch must clear the pan through the whole wall, so its half-span is the
 * widest angle at which any radius between the wall's inside and outside
 * meets the rabbet circle: at one of the wall faces, or where a ray from the
 * centre grazes the circle if that lies within the wall. The rabbet circle,
 * not the pan's body, because the rim in the rabbet is steel: the tube's cut
 * edge must land on wood. Its height is what rises above the top face (the
 * pan) plus a clearance.
 */
export function tubeNotches(params: PlateParams, rabbetCircles: readonly { pocketId: string; x: number; y: number; diameter: number }[]): TubeNotch[] {
  const ro = params.tubeDiameter / 2
  const ri = ro - params.tubeWall
  const notches: TubeNotch[] = []
  rabbetCircles.forEach((rb, k) => {
    const d = Math.hypot(rb.x, rb.y)
    const rho = rb.diameter / 2
    const lo = Math.max(ri, d - rho)
    const hi = Math.min(ro, d + rho)
    if (lo >= hi || d === 0) return
    const candidates = [lo, hi]
    const graze = Math.sqrt(Math.max(0, d * d - rho * rho))
    if (graze > lo && graze < hi) candidates.push(graze)
    const half = rho >= d ? Math.PI : Math.max(...candidates.map((s) => halfAngleAt(s, d, rho)))
    const angle = casterAngle(params, k)
    const span = (2 * half) / DEG
    const fromAxis = (((angle - params.rotation) % 360) + 360) % 360
    notches.push({
      pocketId: rb.pocketId,
      angle,
      startAngle: angle - span / 2,
      endAngle: angle + span / 2,
      span,
      width: ro * 2 * half,
      offsetAlongWrap: ro * fromAxis * DEG,
      height: panRise(params) + NOTCH_CLEARANCE,
    })
  })
  return notches
}

/**
 * The share of the tube's foot (the ring between its outside and inside
 * diameters) left standing on wood: each notch removes bearing in proportion
 * to its angle (REFERENCES, "a form tube's foot"); overlapping notches count once.
 */
export function tubeBearing(notches: readonly TubeNotch[]): number {
  if (notches.length === 0) return 1
  const spans: [number, number][] = []
  for (const n of notches) {
    if (n.span >= 360) return 0
    const a = ((n.startAngle % 360) + 360) % 360
    const b = a + n.span
    if (b > 360) spans.push([a, 360], [0, b - 360])
    else spans.push([a, b])
  }
  spans.sort((p, q) => p[0] - q[0])
  let removed = 0
  let [lo, hi] = spans[0]!
  for (const [a, b] of spans.slice(1)) {
    if (a > hi) {
      removed += hi - lo
      lo = a
      hi = b
    } else hi = Math.max(hi, b)
  }
  removed += hi - lo
  return Math.max(0, 1 - removed / 360)
}

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

/**
 * Height of a notch where only a pan's rim lies under the tube wall, mm: the
 * rim sits flush in its rabbet (the rabbet depth is set to the rim), so what
 * stands up there is the heads of the rim's fasteners and a rim not quite
 * flush. 1/8 in, common practice from memory.
 */
export const RIM_RELIEF = 3.175

/** How far the pan stands above the plate's top face, mm: from the rabbet floor up to the crown's underside, less the rabbet's depth. */
export function panRise(params: PlateParams): number {
  return Math.max(0, params.panDepth - params.rabbetDepth)
}

/** Largest angle (radians) either side of the centre line at which a circle of radius s crosses a circle of radius rho centred d from the origin. */
function halfAngleAt(s: number, d: number, rho: number): number {
  const cos = (s * s + d * d - rho * rho) / (2 * s * d)
  return Math.acos(Math.min(1, Math.max(-1, cos)))
}

/** Half-angle (radians) of the ring of radii [lo, hi] round the centre that a circle of radius rho centred d out covers; null when they miss. */
function halfSpan(d: number, rho: number, lo: number, hi: number): number | null {
  const a = Math.max(lo, d - rho)
  const b = Math.min(hi, d + rho)
  if (a >= b || d === 0) return null
  if (rho >= d) return Math.PI
  const candidates = [a, b]
  const graze = Math.sqrt(Math.max(0, d * d - rho * rho))
  if (graze > a && graze < b) candidates.push(graze)
  return Math.max(...candidates.map((s) => halfAngleAt(s, d, rho)))
}

/**
 * The tube is notched only where a pan or its rim lies under its wall (the
 * ring between its inside and outside faces), and only as high as what is
 * under it. The pan's body (the pocket's circle, where the pan stands up from
 * its rim to its crown) needs the pan's rise plus a clearance for the crown
 * and the caster's nuts; where only the rim (the rabbet's circle) lies under
 * the wall, the rim is flush in its rabbet and the notch is a shallow relief
 * over the rim's fastener heads. The notch spans the rim's angles, so the
 * tube's cut edge lands on wood beyond the steel; `body` gives the taller
 * middle part's angles when the body reaches under the wall.
 */
export function tubeNotches(params: PlateParams, rabbetCircles: readonly { pocketId: string; x: number; y: number; diameter: number }[]): TubeNotch[] {
  const ro = params.tubeDiameter / 2
  const ri = ro - params.tubeWall
  const tall = panRise(params) + NOTCH_CLEARANCE
  const notches: TubeNotch[] = []
  rabbetCircles.forEach((rb, k) => {
    const d = Math.hypot(rb.x, rb.y)
    const half = halfSpan(d, rb.diameter / 2, ri, ro)
    if (half === null) return
    const bodyHalf = halfSpan(d, Math.min(rb.diameter, params.pocketDiameter) / 2, ri, ro)
    const angle = casterAngle(params, k)
    const span = (2 * half) / DEG
    const fromAxis = (((angle - params.rotation) % 360) + 360) % 360
    // A pan with no rise (a flat plate in the rabbet) stands no higher than its rim.
    const bodyHeight = Math.max(RIM_RELIEF, tall)
    notches.push({
      pocketId: rb.pocketId,
      angle,
      startAngle: angle - span / 2,
      endAngle: angle + span / 2,
      span,
      width: ro * 2 * half,
      offsetAlongWrap: ro * fromAxis * DEG,
      height: bodyHalf === null ? RIM_RELIEF : bodyHeight,
      rimHeight: RIM_RELIEF,
      body: bodyHalf === null ? null : { span: (2 * bodyHalf) / DEG, width: ro * 2 * bodyHalf },
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

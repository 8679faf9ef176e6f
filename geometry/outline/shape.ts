// The outline as one radius function r(theta) about the plate centre.
//
// Why a radius function: a closed curve r(theta) > 0 swept once round the
// centre is star-shaped, so it can never cross itself or curl, whatever the
// parameters; it is cheap to evaluate (the editor rebuilds it on every pointer
// move); and containment is easy to guarantee. Unions of circles smoothed
// afterwards leave small curls at the joins instead.
//
// The radius is built from three parts:
//  - a valley line just outside the trunk circle, wobbled by the seeded
//    irregularity;
//  - lobes on top of it, each a smooth bump of given reach and width;
//  - for every hole that must keep its minimum wood, the far side of its
//    clearance circle (hole radius + minimum wood) as seen from the centre.
// The parts are joined by a smooth maximum that is never below the true
// maximum, so the clearance circles always stay inside.

import type { PlateParams } from '../params'
import type { Circle } from '../math/circles'
import { mulberry32, signed } from '../math/prng'

const DEG = Math.PI / 180
const TWO_PI = 2 * Math.PI
/** Exponent of the p-norm that merges overlapping lobes: near a plain maximum, but smooth. */
const LOBE_NORM = 6
/** Wobble harmonics of the valley line: 2 to 5 bumps round the plate. */
const WOBBLE_HARMONICS = 4
/** The least valley the schema allows, mm: the wobble never takes the outline nearer the trunk than this. */
export const VALLEY_MIN = 6

export interface LobeShape {
  index: number
  /** Radians, counter-clockwise from +x. */
  angle: number
  /** Radians either side of the tip where the lobe meets the valley line. */
  halfWidth: number
  /** mm beyond the valley line. */
  reach: number
  /** The width asked for where the lobe leaves the valley line, mm (an arc length); halfWidth may be wider, to let the cutter round the crotch. */
  width: number
}

export interface OutlineOptions {
  /** Width of the smooth maximum's blend, mm; the outline stands at most blend/6 proud of the sharp maximum. Default 6 mm + 6 % of the trunk radius. */
  blend?: number
  /** Radius of the cutter, mm: a lobe's foot is widened where needed so the crotch it makes with the valley line is no tighter than this. Default 0 (no widening). */
  cutterRadius?: number
}

/** Start of the blunt profile's fall, as a share of the half-width: flat before, a quintic fall after. */
const BLUNT_SHOULDER = 0.25
/** Largest positive second derivative of each profile in t: (1 - t^2)^3 peaks at 4.8 (t^2 = 0.6); the quintic smootherstep at 10/sqrt(3), stretched by 1 / (1 - shoulder)^2. */
const POINTED_CURL = 4.8
const BLUNT_CURL = 10 / Math.sqrt(3) / ((1 - BLUNT_SHOULDER) * (1 - BLUNT_SHOULDER))
/**
 * Safety factor on the crotch estimate below: the estimate r^2 / r'' ignores
 * the slope and the wobble, so the foot is made wide enough for this many
 * cutter radii.
 */
const CROTCH_FACTOR = 1.5

export interface OutlineShape {
  /** Outline radius at an angle in radians. Always positive and finite. */
  radiusAt(theta: number): number
  /** The outline point at an angle in radians. */
  pointAt(theta: number): [number, number]
  lobes: LobeShape[]
  /** Narrowest angular detail (radians); sampling starts finer than this so no lobe slips between samples. */
  finestAngle: number
}

/** Angle difference folded into (-pi, pi]. */
export function wrapAngle(a: number): number {
  return a - TWO_PI * Math.round(a / TWO_PI)
}

/** Smooth maximum, C2, equal to max(a, b) once they differ by k or more, and never below it. */
function smoothMax(a: number, b: number, k: number): number {
  const h = k - Math.abs(a - b)
  if (h <= 0) return a > b ? a : b
  const u = h / k
  return (a > b ? a : b) + (u * u * u * k) / 6
}

interface Bulge {
  angle: number
  halfRange: number
  d: number
  q: number
}

/**
 * The clearance circle as a bulge of the outline. Near the centre a circle's
 * far side ends where rays from the centre graze it, with a sheer radial drop
 * behind; if that drop stood proud of the valley line the outline would get a
 * corner there. Such a circle is replaced by a larger one with the same far
 * point, centred closer in, whose grazing rays end below the valley line by at
 * least the blend width: it contains the original, so containment holds, and
 * the outline stays smooth. Solving |c'|^2 - q'^2 <= S^2 with q' = F - |c'|
 * gives |c'| <= (F^2 + S^2) / (2F).
 */
function bulgeFor(circle: Circle, floor: number): Bulge | null {
  const d = Math.hypot(circle.x, circle.y)
  const q = circle.radius
  const far = d + q
  if (far <= floor) return null
  const angle = Math.atan2(circle.y, circle.x)
  if (d <= q) return { angle, halfRange: Math.PI, d, q }
  const dd = Math.min(d, (far * far + floor * floor) / (2 * far))
  const qq = far - dd
  return { angle, halfRange: Math.asin(Math.min(1, qq / dd)), d: dd, q: qq }
}

export function outlineShape(params: PlateParams, clearances: readonly Circle[], options: OutlineOptions = {}): OutlineShape {
  const ro = params.tubeDiameter / 2
  const { count, reach, width, roundness, irregularity, seed, valley, phase, overrides } = params.lobes
  const random = mulberry32(seed)
  const blend = options.blend ?? 6 + 0.06 * ro
  const cutterRadius = options.cutterRadius ?? 0

  // Drawn first and always in the same order, so changing one lobe never reshuffles the others.
  const wobbleAmp: number[] = []
  const wobblePhase: number[] = []
  for (let j = 0; j < WOBBLE_HARMONICS; j++) {
    wobbleAmp.push(0.3 + 0.7 * random())
    wobblePhase.push(random() * TWO_PI)
  }
  const ampSum = wobbleAmp.reduce((s, a) => s + a, 0)
  // The wobble swings both ways; capped so the stated valley minimum still holds at its deepest.
  const wobbleDepth = Math.min(0.4 * irregularity * valley, valley - VALLEY_MIN)
  const baseRadius = ro + valley
  const rot = params.rotation * DEG

  const lobes: LobeShape[] = []
  const spacing = count > 0 ? TWO_PI / count : TWO_PI
  for (let k = 0; k < count; k++) {
    const ua = signed(random)
    const ur = signed(random)
    const uw = signed(random)
    const o = overrides.find((v) => v.index === k)
    const nominal = rot + phase * DEG + k * spacing
    const angle = o?.angle !== undefined ? nominal + o.angle * DEG : nominal + (irregularity * spacing * ua) / 6
    const lobeReach = o?.reach ?? reach * (1 + 0.5 * irregularity * ur)
    const lobeWidth = o?.width ?? width * (1 + 0.4 * irregularity * uw)
    // Where a lobe leaves the valley line its outline bends inward with a radius of about
    // r^2 / r'' (r the foot's radius, r'' = reach * curl / halfWidth^2): widen the foot
    // until that is at least the cutter's radius (times a margin), so a round bit can follow it.
    const curl = POINTED_CURL + roundness * (BLUNT_CURL - POINTED_CURL)
    const footRadius = baseRadius - wobbleDepth
    const leastHalf = cutterRadius > 0 ? Math.sqrt(Math.max(0, lobeReach) * curl * CROTCH_FACTOR * cutterRadius) / footRadius : 0
    const halfWidth = Math.min(Math.max(lobeWidth / (2 * baseRadius), leastHalf), 0.98 * Math.PI)
    lobes.push({ index: k, angle, halfWidth, reach: lobeReach, width: lobeWidth })
  }
  // Lobes shorter than a micrometre change nothing visible; dropping them keeps
  // the sampling coarse and keeps denormal numbers (slow on every CPU) out of the sums.
  const active = lobes.filter((l) => l.reach > 1e-3)
  const lobeAngle = Float64Array.from(active, (l) => l.angle)
  const lobeHalf = Float64Array.from(active, (l) => l.halfWidth)
  const lobeReach = Float64Array.from(active, (l) => l.reach)

  const floor = baseRadius - wobbleDepth - blend
  const bulges = clearances.map((c) => bulgeFor(c, floor)).filter((b): b is Bulge => b !== null)

  // Pointed: (1 - t^2)^3. Blunt: flat to the shoulder, then a quintic (C2) fall whose
  // inward curl at the foot stays bounded, unlike a high power of t.
  function lobeProfile(t: number): number {
    const s = t * t
    const p = 1 - s
    const pointed = p * p * p
    const a = t < 0 ? -t : t
    let blunt = 1
    if (a > BLUNT_SHOULDER) {
      const u = (a - BLUNT_SHOULDER) / (1 - BLUNT_SHOULDER)
      blunt = 1 - u * u * u * (10 - 15 * u + 6 * u * u)
    }
    return pointed + roundness * (blunt - pointed)
  }

  const cosRot = Math.cos(rot)
  const sinRot = Math.sin(rot)
  // Each harmonic a sin(j psi + phi) is kept as a sin(j psi) cos(phi) + a cos(j psi) sin(phi),
  // so one sine and cosine per evaluation serve all of them (by the angle-sum recurrence).
  const wobbleSin = wobbleAmp.map((a, j) => (wobbleDepth * a * Math.cos(wobblePhase[j]!)) / ampSum)
  const wobbleCos = wobbleAmp.map((a, j) => (wobbleDepth * a * Math.sin(wobblePhase[j]!)) / ampSum)
  const bulgeCos = bulges.map((b) => Math.cos(b.angle))
  const bulgeSin = bulges.map((b) => Math.sin(b.angle))
  const bulgeLimit = bulges.map((b) => (b.halfRange >= Math.PI ? -2 : Math.cos(b.halfRange)))

  function radiusFrom(theta: number, c: number, s: number): number {
    // psi = theta - rotation, harmonics 1..5 by recurrence.
    const c1 = c * cosRot + s * sinRot
    const s1 = s * cosRot - c * sinRot
    let cj = c1
    let sj = s1
    let r = baseRadius
    for (let j = 1; j <= 5; j++) {
      const slot = j - 2
      if (slot >= 0) r += wobbleSin[slot]! * sj + wobbleCos[slot]! * cj
      const cn = cj * c1 - sj * s1
      sj = sj * c1 + cj * s1
      cj = cn
    }

    let hits = 0
    let single = 0
    let sum = 0
    for (let k = 0; k < lobeAngle.length; k++) {
      const t = wrapAngle(theta - lobeAngle[k]!) / lobeHalf[k]!
      if (t <= -1 || t >= 1) continue
      const v = lobeReach[k]! * lobeProfile(t)
      if (v < 1e-9) continue
      hits++
      single = v
      sum += v ** LOBE_NORM
    }
    if (hits === 1) r += single
    else if (hits > 1) r += sum ** (1 / LOBE_NORM)

    for (let i = 0; i < bulges.length; i++) {
      const cd = c * bulgeCos[i]! + s * bulgeSin[i]!
      if (cd <= bulgeLimit[i]!) continue
      const b = bulges[i]!
      const sd = s * bulgeCos[i]! - c * bulgeSin[i]!
      const far = b.d * cd + Math.sqrt(Math.max(0, b.q * b.q - b.d * b.d * sd * sd))
      r = smoothMax(r, far, blend)
    }
    return r
  }

  function radiusAt(theta: number): number {
    return radiusFrom(theta, Math.cos(theta), Math.sin(theta))
  }

  function pointAt(theta: number): [number, number] {
    const c = Math.cos(theta)
    const s = Math.sin(theta)
    const r = radiusFrom(theta, c, s)
    return [r * c, r * s]
  }

  let finestAngle = TWO_PI / 64
  for (const l of active) finestAngle = Math.min(finestAngle, l.halfWidth)
  return { radiusAt, pointAt, lobes, finestAngle }
}

// The cautions shown beside every stability, load or weight figure, in the
// editor and on the build sheet (PRODUCT.md, "Safety"), and the words that
// say what the tipping figures mean on a real stage.

import type { UnitStability } from './stability'
import { STANDARD_GRAVITY } from './stability'

export const STABILITY_CAUTION_SHORT = 'Estimate only: the shop\'s qualified person, the venue\'s rules and local codes decide.'

export const STABILITY_CAUTIONS: readonly string[] = [
  'Every figure here is an estimate, not an engineering approval. The shop\'s qualified person, the venue\'s rules and local codes decide whether a unit is safe to build, load and roll.',
  'Assumed: a rigid unit on a level, hard floor; wheels that neither sink nor roll while the unit leans; every wheel swivelled the worst way (kingpins moved in by the swivel lead); the load centred on the plate at the centre-of-mass height entered; plywood, tube and steel at the stated densities.',
  '"Leaves its wheels": one side\'s wheels lift; a unit then rocks onto a root where one reaches the floor, and overturns only past the outline\'s outer edge. Off its wheels it no longer rolls.',
  'The check push (13 % of the weight, at most 100 N, at up to 1.5 m, never above the unit) and the 10° lean are borrowed by analogy from an equipment-stability standard (IEC 62368-1); no published rule for scenery was found.',
  'Caster loads: on an uneven floor a rigid plate can stand on any three of its wheels, so the load per caster is the worst caster over every three-wheel stance holding the centre of mass (wheels at their kingpins); the even share is for comparison. Use the maker\'s rating; allow for cable covers, ramps and lips.',
  'A raked stage uses up lean before anyone pushes (1:24 is 2.39°, 1:12 is 4.76°); stopping or starting a moving unit at a fraction a of g acts like a lean of atan(a).',
  'Steel counterweight is heavy: lift with care, lock every block in place, and take the blocks out before the unit is tipped, carried or stored.',
]

/** Stage rakes as rise over run, and their angles atan(1 / run) in degrees (geometry; rake ratios common practice). */
export const RAKES: readonly { label: string; run: number; angle: number }[] = [24, 12].map((run) => ({ label: `1:${run}`, run, angle: (Math.atan(1 / run) * 180) / Math.PI }))

/** What happens first as the unit leans, in words; `angle` formats degrees. */
export function tippingSequence(s: Pick<UnitStability, 'tippingAngle' | 'rootTouchAngle' | 'overturnAngle'>, angle: (deg: number) => string): string {
  if (s.tippingAngle <= 0) {
    return s.overturnAngle > 0
      ? `It stands outside its wheels' support: it leaves its wheels on its own and rests on a root; it overturns at ${angle(s.overturnAngle)}.`
      : 'It stands outside even its outline: it overturns on its own.'
  }
  if (s.rootTouchAngle >= 90 || s.overturnAngle <= s.tippingAngle + 1e-9) {
    return `No root reaches the floor to catch it: leaving its wheels at ${angle(s.tippingAngle)} is overturning.`
  }
  const first = s.rootTouchAngle < s.tippingAngle
    ? `A root reaches the floor at ${angle(s.rootTouchAngle)} of rock, before it would leave its wheels at ${angle(s.tippingAngle)}: rocked and let go, it comes back onto its wheels.`
    : `It leaves its wheels at ${angle(s.tippingAngle)} and falls a further ${angle(s.rootTouchAngle)} onto a root.`
  return `${first} Leaning further it rests on that root and overturns at ${angle(s.overturnAngle)}.`
}

/** The figures behind the rake and stop cautions: lean left on each rake, and the stop that lifts the wheels or overturns it (g-fraction tan(angle)). */
export function motionNotes(s: Pick<UnitStability, 'tippingAngle' | 'overturnAngle'>): {
  rakes: { label: string; angle: number; left: number; overturnLeft: number }[]
  /** Fractions of g and m/s2. */
  liftStop: { g: number; ms2: number }
  overturnStop: { g: number; ms2: number }
} {
  const frac = (deg: number) => (deg > 0 && deg < 90 ? Math.tan((deg * Math.PI) / 180) : deg >= 90 ? Infinity : 0)
  const lift = frac(s.tippingAngle)
  const over = frac(s.overturnAngle)
  return {
    rakes: RAKES.map((r) => ({ label: r.label, angle: r.angle, left: s.tippingAngle - r.angle, overturnLeft: s.overturnAngle - r.angle })),
    liftStop: { g: lift, ms2: lift * STANDARD_GRAVITY },
    overturnStop: { g: over, ms2: over * STANDARD_GRAVITY },
  }
}

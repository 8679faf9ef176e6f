// The cautions shown beside every stability, load or weight figure, in the
// editor and on the build sheet (PRODUCT.md, "Safety").

export const STABILITY_CAUTION_SHORT = 'Estimate only: the shop\'s qualified person, the venue\'s rules and local codes decide.'

export const STABILITY_CAUTIONS: readonly string[] = [
  'Every figure here is an estimate, not an engineering approval. The shop\'s qualified person, the venue\'s rules and local codes decide whether a unit is safe to build, load and roll.',
  'Assumed: a rigid unit on a level, hard floor; wheels that neither sink nor roll while the unit leans; every wheel swivelled the worst way (kingpins moved in by the swivel lead); the load centred on the plate at the centre-of-mass height entered; plywood, tube and steel at the stated densities.',
  'The check push (13 % of the weight, at most 100 N, at up to 1.5 m) and the 10° lean are borrowed by analogy from an equipment-stability standard (IEC 62368-1); no published rule for scenery was found.',
  'Caster loads assume one caster off the floor (an uneven deck) when there are four or more; use the maker\'s rating, and allow for rolling over cable covers, ramps and lips.',
  'Steel counterweight is heavy: lift with care, lock every block in place, and take the blocks out before the unit is tipped, carried or stored.',
]

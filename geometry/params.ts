// The plate's parameters: one zod schema shared by forms, the editor store and
// the server, so a value accepted anywhere is accepted everywhere. Lengths in
// millimetres, angles in degrees counter-clockwise from +x.
//
// Bounds are real-world limits, not design advice: a value outside them is
// not a plate anyone builds. Design problems inside the bounds (pockets too
// close together, a small floor gap ...) are reported as findings by
// buildPlate, never rejected here, so a designer can pass through a bad state
// while dragging a handle. Only contradictions that make the geometry
// meaningless are cross-field rules below.
//
// Sizes marked "from memory" are common shop practice, not a published table.

import { z } from 'zod'
import { unitSchema } from './stability/unit-params'
import { skirtSchema } from './skirt/settings'

/** Inches to millimetres, rounded to a micrometre so stored defaults read cleanly (3 in is 76.2, not 76.19999999999999). */
function inch(n: number): number {
  return Math.round(n * 25.4 * 1e6) / 1e6
}

/** Measure of one length field: millimetres within [min, max]. */
function length(min: number, max: number, fallback: number) {
  return z.number().finite().min(min).max(max).default(fallback)
}

const lobeOverrideSchema = z.object({
  /** Which lobe (0-based, counter-clockwise from the clocking axis). */
  index: z.number().int().min(0).max(23),
  /** Degrees added to the lobe's evenly spaced angle (in place of its irregular offset), so rotating the plate carries it along. */
  angle: z.number().finite().min(-180).max(180).optional(),
  /** Replaces the lobe's reach (mm beyond the valley line); no irregularity is added on top. */
  reach: z.number().finite().min(0).max(900).optional(),
  /** Replaces the lobe's width (mm where it leaves the valley line). */
  width: z.number().finite().min(10).max(1200).optional(),
})

const lobesSchema = z.object({
  /** Number of root lobes; 0 gives a plain rounded plate (a column or a rock). */
  count: z.number().int().min(0).max(24).default(6),
  /** How far a lobe tip stands out beyond the valley line, mm. Up to 900 mm: past that a plate no longer fits any sheet. */
  reach: length(0, 900, 110),
  /** Width of a lobe where it leaves the valley line, mm (an arc length). */
  width: length(10, 1200, 110),
  /** 0 gives tapering, pointed-looking roots; 1 gives blunt, flat-ended ones. */
  roundness: z.number().finite().min(0).max(1).default(0.5),
  /** 0 is perfectly regular; 1 varies each lobe's reach by up to +-50 %, its width by +-40 % and its angle by up to a sixth of the spacing either way, and wobbles the valley line in and out by up to 40 % of the valley. */
  irregularity: z.number().finite().min(0).max(1).default(0.35),
  /** Seed of the irregularity: the same seed always gives the same plate. */
  seed: z.number().int().min(0).max(0xffffffff).default(7),
  /** Distance from the trunk circle to the outline between lobes, mm. At least 6 mm (1/4 in) so the tube always bears fully on wood. */
  valley: length(6, 300, 25),
  /** Degrees from the clocking axis to the first lobe. 0 puts lobe 0 over caster 0. */
  phase: z.number().finite().min(-180).max(180).default(0),
  /** Per-lobe changes, e.g. one root pulled out further by a handle. */
  overrides: z.array(lobeOverrideSchema).max(24).default([]),
})

// The default hardware is a 2 in caster under a 4-1/4 in pocket: the largest
// pan that still tucks under the default 12-1/2 in tube's wall with three
// casters, the centre hole and access openings between them. Sizes from
// memory of common light scenery casters, not a maker's catalogue.
const casterSchema = z.object({
  /** Scenery casters run 2-5 in wheels (from memory); 1-1/2 to 8 in accepted. */
  wheelDiameter: length(inch(1.5), inch(8), inch(2)),
  /** Horizontal distance from the kingpin to the axle, mm; a fraction of the wheel diameter. Default 3/4 in for the 2 in wheel (from memory). */
  swivelLead: length(0, inch(6), inch(0.75)),
  /** Floor to the top of the caster's top plate (the mounting face), mm. A 2 in caster is about 2-5/8 in tall (from memory). */
  overallHeight: length(inch(1.5), inch(12), inch(2.625)),
  /** Width of the wheel's tread, mm: its edges sweep the widest circle as it swivels. */
  treadWidth: length(inch(0.25), inch(4), inch(0.75)),
  /** Room kept between the swivelling wheel and the pocket's wall, mm. Default 1/4 in (from memory). */
  swivelClearance: length(0, inch(2), inch(0.25)),
  /** Top plate side running along the radial line, mm. Default 2-1/4 in (from memory, with the 3 in length and the 2-3/8 x 1-1/2 in bolt pattern below; checked against each other in tests/unit/stability). */
  topPlateWidth: length(inch(1), inch(8), inch(2.25)),
  /** Top plate side running square to the radial line, mm. Default 3 in (from memory). */
  topPlateLength: length(inch(1), inch(10), inch(3)),
  /** Bolt centres along the top plate's length (square to the radial line), mm. */
  boltSpacingX: length(10, inch(9.5), inch(2.375)),
  /** Bolt centres along the top plate's width (along the radial line), mm. */
  boltSpacingY: length(10, inch(7.5), inch(1.5)),
  /** Mounting bolt diameter, mm: #8 screw to 5/8 in bolt. These go through the pan's steel crown, not the plywood. */
  boltDiameter: length(3, 16, inch(0.25)),
  /** Outside diameter of the swivel raceway (the ball track under the top plate), mm; bolts must land outside it. */
  racewayDiameter: length(10, inch(8), inch(1.5)),
})

/** How the pans' rims are held down. */
export const FASTENER_KINDS = ['screw', 'bolt-tnut', 'bolt-counterbore'] as const
export type FastenerKind = (typeof FASTENER_KINDS)[number]

/**
 * The screws or bolts that hold each pan's rim down into the rabbet floor:
 * wood screws (no hole cut; they stay in the wood above the bottom face), or
 * through-bolts in holes drilled right through, with a T-nut driven into the
 * underside or a nut in a counterbore from the underside. Revisions saved
 * before the kind existed read as screws.
 */
const fastenerSchema = z.object({
  kind: z.enum(FASTENER_KINDS).default('screw'),
  /** Fasteners per pan. */
  count: z.number().int().min(2).max(12).default(4),
  /** Screw shank or bolt hole diameter, mm: #6 screw to 1/2 in bolt. Default 1/4 in (from memory). */
  diameter: length(3, inch(0.5), inch(0.25)),
  /** Diameter of the circle they stand on, mm; left out, the middle of the rabbet ring. */
  boltCircleDiameter: z.number().finite().min(10).max(inch(20)).optional(),
  /** How far the screw or bolt reaches below the rabbet floor (the rim's underside), mm. Default 3/4 in (a #10 x 1 in screw through a 1/8 in rim less its head, from memory). */
  length: length(3, inch(8), inch(0.75)),
  /** How far a T-nut's flange stands proud of the underside, mm; 0 when it is let in flush. Default 1/16 in (from memory). */
  tnutFlange: length(0, inch(0.5), inch(1 / 16)),
  /** Counterbore for the nut and washer, from the underside, mm. Default 3/4 in across (a 1/4 in nut and washer, from memory), 3/8 in deep. */
  counterboreDiameter: length(inch(0.25), inch(2), inch(0.75)),
  counterboreDepth: length(0, inch(1.5), inch(0.375)),
  /**
   * Least wood between a fastener's hole and the pocket's edge or the
   * rabbet's edge, mm. The plate's own least wood (3/4 in) cannot fit in a
   * 1/2 in rim ring, so fasteners have their own: default 1/8 in (from memory;
   * about half a 1/4 in screw's diameter).
   */
  edgeWood: length(0, inch(1), inch(0.125)),
})
/** What the shop cuts with and on: the cutter sets the tightest inside bend, the sheet and its allowances the largest plate. */
const cuttingSchema = z.object({
  /** Router bit (or CNC end mill) diameter, mm; a round cutter leaves inside bends no tighter than its radius. Default 1/4 in. */
  bitDiameter: length(inch(0.0625), inch(1), inch(0.25)),
  /** Width of material the cut removes, mm; a CNC router's kerf is its bit (default 1/4 in). */
  kerf: length(0, inch(0.5), inch(0.25)),
  /** Unusable strip round the sheet's edge (damaged edges, hold-downs), mm. Default 1/2 in (from memory). */
  edgeMargin: length(0, inch(6), inch(0.5)),
  /** Sheet size, mm. Default 48 x 96 in (US Product Standard PS 1-19); metric 1220 x 2440. */
  sheetWidth: length(inch(12), inch(72), inch(48)),
  sheetLength: length(inch(12), inch(144), inch(96)),
  /** Least radius at a root's tip, mm: a sharper tip splinters and breaks off. Default 1/2 in (from memory). */
  minTipRadius: length(0, inch(6), inch(0.5)),
  /** Least width of a root halfway out along its reach, mm. Default 1-1/2 in (from memory). */
  minRootWidth: length(0, inch(12), inch(1.5)),
})

const accessSchema = z.object({
  /** One opening between each pair of neighbouring casters. */
  enabled: z.boolean().default(true),
  /** Opening diameter, mm: from a 3/4 in hole saw up to a 12 in router-pattern hole. */
  diameter: length(inch(0.75), inch(12), inch(2)),
  /** Plate centre to opening centre, mm. Default: between the default pans, inside the tube wall. */
  offset: length(0, 1500, 125),
  /** Round the diameter to the nearest common hole-saw size (3/4 to 6 in); larger openings stay as given (cut with a router and a pattern). */
  snapToHoleSaw: z.boolean().default(true),
})

const baseSchema = z.object({
  /** Measured outside diameter of the tube, mm. Form tubes run 6-48 in nominal (from memory); 4 in props to 49 in accepted. Default: a 12 in tube measuring 12-1/2 in outside. */
  tubeDiameter: length(inch(4), inch(49), inch(12.5)),
  /** Tube wall, mm. Form tubes are about 1/8-1/2 in (from memory); up to 1 in for built-up shells. */
  tubeWall: length(1, 25.4, inch(0.25)),
  /** Three casters always all touch an uneven floor; up to 8 round a big trunk. */
  casterCount: z.number().int().min(3).max(8).default(3),
  /** Plate centre to pocket centre (the caster's kingpin), mm. Default: the pans tucked just inside the default tube's outside wall. */
  casterOffset: length(20, 1500, 90.5),
  /** How far inside the tube's outside face the pans' rims are kept, mm: room for a tube that is not quite round. Default 1.5 mm (about 1/16 in), common practice from memory. */
  panTuck: length(0, inch(1), 1.5),
  /** Through-hole the pan drops into and the caster swivels in, mm: 1-1/2 to 16 in. Default a 4-1/4 in hole saw. */
  pocketDiameter: length(inch(1.5), inch(16), inch(4.25)),
  /** Width of the stepped ring round the pocket for the pan's rim, mm. */
  rabbetWidth: length(3, 50, inch(0.5)),
  /** Depth of that ring below the top face, mm; about 3/8 in lets a pan rim sit flush (from memory). Must be less than the plate thickness. */
  rabbetDepth: length(1, 30, inch(0.375)),
  /** Height of the pan above its rim: from the rim's underside (on the rabbet floor) up to the underside of the pan's crown, where the caster's top plate bolts on. 0 is a flat plate in the rabbet. */
  panDepth: length(0, 250, inch(1.25)),
  caster: casterSchema.prefault({}),
  fasteners: fastenerSchema.prefault({}),
  cutting: cuttingSchema.prefault({}),
  /** Clocking: the angle of the first caster and of the axis through the index holes. */
  rotation: z.number().finite().min(-360).max(360).default(90),
  lobes: lobesSchema.prefault({}),
  access: accessSchema.prefault({}),
  /** Centre hole for a pivot pin or a pencil, mm: 1 mm to 2 in. */
  centreHoleDiameter: length(1, inch(2), inch(0.25)),
  /** Index holes (registration marks on the clocking axis), mm. */
  indexHoleDiameter: length(1, inch(1), inch(0.125)),
  /** Least wood between any hole and the edge or another hole, mm: 1/8 in to 4 in. Default 3/4 in (from memory). */
  minWood: length(3, 100, inch(0.75)),
  /** Glued plywood layers. */
  layers: z.number().int().min(1).max(4).default(2),
  /** One sheet's actual thickness, mm. Default: plywood as the shop buys it, 23/32 in, sold as "3/4 in" (PS 1-19 performance category 23/32, 0.688-0.750 in). */
  sheetThickness: length(3, 40, inch(23 / 32)),
  /** Least acceptable gap between the plate's underside and the floor, mm: clears floor joints, tape and cable covers. Default 1/4 in (from memory). */
  minFloorGap: length(0, 100, inch(0.25)),
  /** What stands on the plate (load, counterweight, caster rating, push to check); see geometry/stability. */
  unit: unitSchema.prefault({}),
  skirt: skirtSchema.prefault({}),
})

type BaseParams = z.output<typeof baseSchema>

/** The least caster offset at which the pocket's rabbet clears the centre hole by the minimum wood. */
export function minCasterOffset(p: Pick<BaseParams, 'pocketDiameter' | 'rabbetWidth' | 'centreHoleDiameter' | 'minWood'>): number {
  return p.pocketDiameter / 2 + p.rabbetWidth + p.minWood + p.centreHoleDiameter / 2
}

/** Codes of the cross-field rules below; a page rebuilds the message from the code and its values in the reader's units. */
export type ParamRuleCode =
  | 'tube-wall-fills-tube'
  | 'rabbet-too-deep'
  | 'caster-offset-small'
  | 'caster-shorter-than-wheel'
  | 'swivel-lead-long'
  | 'bolts-too-long'
  | 'bolts-too-wide'
  | 'raceway-too-big'
  | 'no-such-lobe'
  | 'lobe-twice'

function crossFieldRules(p: BaseParams, ctx: z.RefinementCtx): void {
  // The message here is the millimetre fallback for API clients; `params` carries the code and the numbers (mm).
  const issue = (path: (string | number)[], code: ParamRuleCode, values: Record<string, number>, message: string) =>
    ctx.addIssue({ code: 'custom', path, message, params: { rule: code, values } })
  const fmt = (mm: number) => `${Math.round(mm * 10) / 10} mm`

  if (p.tubeWall * 2 >= p.tubeDiameter) {
    issue(['tubeWall'], 'tube-wall-fills-tube', { tubeWall: p.tubeWall, tubeDiameter: p.tubeDiameter }, `Tube wall ${fmt(p.tubeWall)} leaves no inside for a ${fmt(p.tubeDiameter)} tube.`)
  }
  const thickness = p.layers * p.sheetThickness
  if (p.rabbetDepth >= thickness) {
    issue(['rabbetDepth'], 'rabbet-too-deep', { rabbetDepth: p.rabbetDepth, thickness }, `Rabbet depth ${fmt(p.rabbetDepth)} must be less than the plate thickness ${fmt(thickness)}.`)
  }
  const least = minCasterOffset(p)
  if (p.casterOffset < least) {
    issue(['casterOffset'], 'caster-offset-small', { casterOffset: p.casterOffset, least }, `Caster offset ${fmt(p.casterOffset)} is too small for the pocket and its rabbet to clear the centre hole by the minimum wood; use at least ${fmt(least)}.`)
  }
  const c = p.caster
  if (c.overallHeight <= c.wheelDiameter) {
    issue(['caster', 'overallHeight'], 'caster-shorter-than-wheel', { overallHeight: c.overallHeight, wheelDiameter: c.wheelDiameter }, `Caster height ${fmt(c.overallHeight)} must be more than the wheel diameter ${fmt(c.wheelDiameter)}.`)
  }
  if (c.swivelLead >= c.wheelDiameter) {
    issue(['caster', 'swivelLead'], 'swivel-lead-long', { swivelLead: c.swivelLead, wheelDiameter: c.wheelDiameter }, `Swivel lead ${fmt(c.swivelLead)} should be less than the wheel diameter ${fmt(c.wheelDiameter)}.`)
  }
  if (c.boltSpacingX + c.boltDiameter > c.topPlateLength) {
    issue(['caster', 'boltSpacingX'], 'bolts-too-long', { spacing: c.boltSpacingX, plate: c.topPlateLength, most: c.topPlateLength - c.boltDiameter }, `Bolt spacing ${fmt(c.boltSpacingX)} does not fit on a top plate ${fmt(c.topPlateLength)} long.`)
  }
  if (c.boltSpacingY + c.boltDiameter > c.topPlateWidth) {
    issue(['caster', 'boltSpacingY'], 'bolts-too-wide', { spacing: c.boltSpacingY, plate: c.topPlateWidth, most: c.topPlateWidth - c.boltDiameter }, `Bolt spacing ${fmt(c.boltSpacingY)} does not fit on a top plate ${fmt(c.topPlateWidth)} wide.`)
  }
  if (c.racewayDiameter > Math.max(c.topPlateLength, c.topPlateWidth)) {
    issue(['caster', 'racewayDiameter'], 'raceway-too-big', { racewayDiameter: c.racewayDiameter, most: Math.max(c.topPlateLength, c.topPlateWidth) }, `Raceway ${fmt(c.racewayDiameter)} is larger than the top plate.`)
  }
  const seen = new Set<number>()
  p.lobes.overrides.forEach((o, i) => {
    if (o.index >= p.lobes.count) {
      issue(['lobes', 'overrides', i, 'index'], 'no-such-lobe', { lobe: o.index + 1, count: p.lobes.count }, `There is no lobe ${o.index + 1}: the plate has ${p.lobes.count} lobes.`)
    }
    if (seen.has(o.index)) {
      issue(['lobes', 'overrides', i, 'index'], 'lobe-twice', { lobe: o.index + 1 }, `Lobe ${o.index + 1} is changed twice.`)
    }
    seen.add(o.index)
  })
}

export const plateParamsSchema = baseSchema.superRefine(crossFieldRules)

export type PlateParams = z.output<typeof plateParamsSchema>
/** What a form or a stored revision may hand in: every field optional. */
export type PlateParamsInput = z.input<typeof plateParamsSchema>
export type LobeOverride = z.output<typeof lobeOverrideSchema>

export interface ParamIssue {
  /** Dotted field path, e.g. `caster.boltSpacingX` or `lobes.overrides.2.index`; empty for the whole object. */
  path: string
  /** Millimetre wording, for API answers; pages rebuild it from `code` and `values` in the reader's units. */
  message: string
  /** A cross-field rule (ParamRuleCode), or zod's own code (`too_small`, `too_big`, `invalid_type` ...). */
  code: string
  /** The numbers behind the message: lengths in mm; `minimum` / `maximum` for a bound. */
  values?: Record<string, number>
}

/** Field messages for forms and 422 answers; empty when the input is accepted. */
export function paramIssues(input: unknown): ParamIssue[] {
  const result = plateParamsSchema.safeParse(input)
  if (result.success) return []
  return result.error.issues.map((i): ParamIssue => {
    const path = i.path.map(String).join('.')
    if (i.code === 'custom') {
      const rule = i.params as { rule?: string; values?: Record<string, number> } | undefined
      return { path, message: i.message, code: rule?.rule ?? 'custom', ...(rule?.values ? { values: rule.values } : {}) }
    }
    if (i.code === 'too_small' && typeof i.minimum === 'number') return { path, message: i.message, code: i.code, values: { minimum: i.minimum } }
    if (i.code === 'too_big' && typeof i.maximum === 'number') return { path, message: i.message, code: i.code, values: { maximum: i.maximum } }
    return { path, message: i.message, code: i.code }
  })
}

/** The default plate, parsed. */
export function defaultParams(): PlateParams {
  return plateParamsSchema.parse({})
}

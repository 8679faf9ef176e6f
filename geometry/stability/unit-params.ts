// What stands on the plate, saved with each revision as `params.unit`: the
// load (given as a weight and a height, or built up from the tube, its
// cladding and props), the counterweight blocks, the caster rating and the
// push to check. Kilograms and millimetres, like the rest of the library.
//
// Every field but the caster rating has a default, so a revision saved
// before this existed still parses. Values marked "from memory" are common shop practice, not a
// published table; the push defaults are an analogy (see PUSH_ANALOGY).

import { z } from 'zod'

/** Inches to millimetres, rounded to a micrometre so stored defaults read cleanly. */
function inch(n: number): number {
  return Math.round(n * 25.4 * 1e6) / 1e6
}

/** Pounds to kilograms: 1 lb = 0.45359237 kg exactly (international yard and pound agreement, 1959). */
export const KG_PER_LB = 0.45359237

/** Densities of counterweight materials, kg/m3, with where each figure comes from. */
export const COUNTERWEIGHT_MATERIALS = {
  steel: { label: 'Steel', density: 7850, source: 'EN 1991-1-1 Table A.4 (77-78.5 kN/m3)' },
  'cast-iron': { label: 'Cast iron', density: 7200, source: 'EN 1991-1-1 Table A.4 (71-72.5 kN/m3), from memory' },
  lead: { label: 'Lead', density: 11340, source: 'handbook value for lead, from memory' },
} as const

export type CounterweightMaterial = keyof typeof COUNTERWEIGHT_MATERIALS

/**
 * The push to check, taken by analogy from a test used for equipment: a
 * horizontal push of 13 % of the weight, at most 100 N, at up to 1.5 m; and
 * a 10 degree tilt. IEC 62368-1 (equipment stability): an analogy, not a
 * rule for scenery. No rule for scenery was found published.
 */
export const PUSH_ANALOGY = {
  fraction: 0.13,
  maxNewtons: 100,
  height: 1500,
  tiltAngle: 10,
  source: 'IEC 62368-1 (equipment stability), used here as an analogy only: no published rule for scenery was found',
} as const

const mm = (min: number, max: number, fallback: number) => z.number().finite().min(min).max(max).default(fallback)
const kg = (max: number, fallback: number) => z.number().finite().min(0).max(max).default(fallback)

const loadSchema = z.object({
  /** `given`: one weight at one height. `built`: the tube by its length and wall, plus cladding and props. */
  mode: z.enum(['given', 'built']).default('given'),
  /** Weight standing on the plate, kg (given mode). */
  weight: kg(5000, 20),
  /** Its centre of mass above the floor, mm (given mode). Default 3 ft. */
  height: mm(0, 10000, inch(36)),
  /** Tube length standing on the plate, mm (built mode). Default 8 ft. */
  tubeLength: mm(0, 10000, inch(96)),
  /** Density of the tube's wall, kg/m3: spiral-wound paperboard about 700 (from memory). */
  tubeDensity: kg(3000, 700),
  /** Cladding spread along the tube (bark, foam, fabric), kg; its centre is the tube's. */
  cladding: kg(2000, 0),
  /** Props or dressing fixed to the unit, kg. */
  props: kg(2000, 0),
  /** Their centre of mass above the floor, mm. */
  propsHeight: mm(0, 10000, inch(60)),
})

const blockSchema = z.object({
  /** Block sizes, mm; the default 2 x 4 x 4 in steel block weighs about 4.12 kg. */
  length: mm(10, 1000, inch(4)),
  width: mm(10, 1000, inch(4)),
  thickness: mm(5, 500, inch(2)),
})

const counterweightSchema = z.object({
  material: z.enum(Object.keys(COUNTERWEIGHT_MATERIALS) as [CounterweightMaterial, ...CounterweightMaterial[]]).default('steel'),
  block: blockSchema.prefault({}),
  /** Blocks loaded; they lie flat on the plate inside the tube, in layers. */
  count: z.number().int().min(0).max(500).default(0),
  /** How many blocks high they may be stacked. */
  maxLayers: z.number().int().min(1).max(20).default(3),
})

export const unitSchema = z.object({
  load: loadSchema.prefault({}),
  counterweight: counterweightSchema.prefault({}),
  /**
   * Load rating of one caster, kg: only the maker's figure, typed in. No
   * default: a rating made up here would pass or fail casters on a number
   * nobody checked. Absent (or null) until the shop enters it.
   */
  casterRating: z.number().finite().min(0).max(5000).nullable().optional(),
  /** Casters, pans and their bolts, kg per caster: about 2 kg for a small caster in a steel pan (from memory, an estimate). */
  hardwarePerCaster: kg(50, 2),
  /** Height of the push to check, mm (default from the analogy: 1.5 m). */
  pushHeight: mm(10, 10000, PUSH_ANALOGY.height),
  /** Push to check: this fraction of the weight, at most `pushMax` newtons (13 % and 100 N by the analogy). */
  pushFraction: z.number().finite().min(0).max(1).default(PUSH_ANALOGY.fraction),
  pushMax: z.number().finite().min(0).max(10000).default(PUSH_ANALOGY.maxNewtons),
  /** Leaning angle the unit should stand, degrees (default from the analogy's tilt test). */
  targetAngle: z.number().finite().min(0).max(60).default(PUSH_ANALOGY.tiltAngle),
})

export type UnitParams = z.output<typeof unitSchema>
export type UnitParamsInput = z.input<typeof unitSchema>

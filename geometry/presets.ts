// Starting shapes, and sizing one shape to another tube. The preset names and
// numbers are our own; each is a sound plate as shipped: no error, the pans
// hidden under the trunk (placeCasters) except on the slim birch, whose tube
// is too slim for any pan that clears its caster, and which says so.

import { minCasterOffset, plateParamsSchema, type PlateParams, type PlateParamsInput } from './params'
import { panRadius, placeAccess, placeCasters } from './features/placement'
import { casterAngle, HOLE_SAW_INCHES, snapToHoleSaw } from './features/holes'
import { tubeBearing, tubeNotches } from './features/casters'
import { TUBE_BEARING } from './checks/pans'

export interface Preset {
  id: string
  name: string
  description: string
  input: PlateParamsInput
}

export const PRESETS: readonly Preset[] = [
  {
    id: 'gnarled-oak',
    name: 'Gnarled oak',
    description: 'Five heavy, uneven roots round a 16 in tube on four casters.',
    input: {
      tubeDiameter: 419.1,
      casterCount: 4,
      casterOffset: 141,
      access: { offset: 160 },
      lobes: { count: 5, reach: 170, width: 170, roundness: 0.35, irregularity: 0.8, seed: 1337, valley: 22 },
    },
  },
  {
    id: 'slim-birch',
    name: 'Slim birch',
    description: 'Three tidy, rounded feet under an 8 in tube.',
    input: {
      tubeDiameter: 215.9,
      casterOffset: 89,
      access: { enabled: false },
      lobes: { count: 3, reach: 70, width: 130, roundness: 0.8, irregularity: 0.1, seed: 21, valley: 20 },
    },
  },
  {
    id: 'banyan-sprawl',
    name: 'Banyan sprawl',
    description: 'Ten long, narrow roots reaching out from a 24 in tube on six casters.',
    input: {
      tubeDiameter: 622.3,
      casterCount: 6,
      casterOffset: 242.5,
      // 4-1/2 in openings (the largest saw that fits between the pans) pass a 2 x 4 x 4 in block end first: its 2 x 4 end needs 4.47 in.
      access: { offset: 134, diameter: 114.3 },
      lobes: { count: 10, reach: 230, width: 95, roundness: 0.2, irregularity: 0.6, seed: 4242, valley: 30 },
    },
  },
  {
    id: 'river-stone',
    name: 'River stone',
    description: 'A lumpy, rounded boulder base with three broad swells.',
    input: {
      tubeDiameter: 457.2,
      casterOffset: 160,
      // 5 in openings pass a 2 x 4 x 4 in block (its 2 x 4 end needs 4.47 in) and a hand.
      access: { offset: 157.5, diameter: 127 },
      lobes: { count: 3, reach: 60, width: 420, roundness: 1, irregularity: 0.9, seed: 99, valley: 35 },
    },
  },
  {
    id: 'plain-column',
    name: 'Plain column',
    description: 'A round plate for a column: no roots, an even rim.',
    input: {
      tubeDiameter: 317.5,
      lobes: { count: 0, irregularity: 0, valley: 40 },
    },
  },
]

/** The parsed parameters of a preset, or undefined for an unknown id. */
export function presetParams(id: string): PlateParams | undefined {
  const preset = PRESETS.find((p) => p.id === id)
  return preset ? plateParamsSchema.parse(preset.input) : undefined
}

// Rounded to a micrometre so derived values store as cleanly as typed ones.
const clamp = (v: number, lo: number, hi: number) => Math.round(Math.min(hi, Math.max(lo, v)) * 1000) / 1000

/** Bounds of the tube diameter field, mm (4 to 49 in). */
export const TUBE_DIAMETER_RANGE = { min: 101.6, max: 1244.6 } as const

/**
 * The same design on another tube. The look scales with the trunk (lobe
 * reach, width and valley, and per-lobe overrides); real hardware keeps its
 * size (pockets, rabbets, casters, holes, minimum wood, plywood). The caster
 * offset is chosen afresh to hide the pans under the new trunk where it can
 * (placeCasters), and the access openings are placed between them inside the
 * tube wall (placeAccess), at the parent's size or the largest smaller hole
 * saw that finds room; left out only when not even a 3/4 in saw does. The
 * new diameter is held within the field's bounds. The result always
 * satisfies the schema.
 */
export function deriveForTube(params: PlateParams, newTubeDiameter: number): PlateParams {
  const tube = clamp(newTubeDiameter, TUBE_DIAMETER_RANGE.min, TUBE_DIAMETER_RANGE.max)
  const s = tube / params.tubeDiameter
  const shift = (tube - params.tubeDiameter) / 2
  const lobes = params.lobes
  const candidate: PlateParams = {
    ...params,
    caster: { ...params.caster },
    access: { ...params.access, offset: clamp(params.access.offset + shift, 0, 1500) },
    tubeDiameter: tube,
    casterOffset: Math.max(clamp(params.casterOffset + shift, 20, 1500), Math.ceil(minCasterOffset(params) * 1000) / 1000),
    lobes: {
      ...lobes,
      reach: clamp(lobes.reach * s, 0, 900),
      width: clamp(lobes.width * s, 10, 1200),
      valley: clamp(lobes.valley * s, 6, 300),
      overrides: lobes.overrides.map((o) => ({
        ...o,
        ...(o.reach !== undefined ? { reach: clamp(o.reach * s, 0, 900) } : {}),
        ...(o.width !== undefined ? { width: clamp(o.width * s, 10, 1200) } : {}),
      })),
    },
  }
  // A tube wall thicker than the new tube allows is the one rule scaling can break.
  if (candidate.tubeWall * 2 >= tube) candidate.tubeWall = Math.max(1, tube / 4)
  const placement = placeCasters(candidate)
  candidate.casterOffset = Math.max(placement.offset, Math.ceil(minCasterOffset(params) * 1000) / 1000)
  if (!placement.hidden) candidate.casterOffset = standingOffset(candidate)
  if (candidate.access.enabled) {
    const diameter = candidate.access.snapToHoleSaw ? snapToHoleSaw(candidate.access.diameter) : candidate.access.diameter
    // The parent's opening where it fits, else the largest smaller hole saw that does (a smaller opening
    // still reaches the pan screws); only when not even the smallest saw finds room between the pans
    // inside the tube wall are the openings left out rather than cut into the pans.
    const sizes = [diameter, ...HOLE_SAW_INCHES.map((inches) => (inches * 254) / 10).filter((mm) => mm < diameter - 0.25).reverse()]
    let placed = false
    for (const size of sizes) {
      const offset = placeAccess(candidate, candidate.casterOffset, size)
      if (offset === null) continue
      candidate.access.offset = offset
      candidate.access.diameter = size
      placed = true
      break
    }
    if (!placed) candidate.access.enabled = false
  }
  return plateParamsSchema.parse(candidate)
}

/** The tube's share of foot on wood with the pans at this offset (the same notches the plate cuts). */
function bearingAt(p: PlateParams, offset: number): number {
  const diameter = p.pocketDiameter + 2 * p.rabbetWidth
  const rabbets = Array.from({ length: p.casterCount }, (_, k) => {
    const a = (casterAngle(p, k) * Math.PI) / 180
    return { pocketId: String(k), x: offset * Math.cos(a), y: offset * Math.sin(a), diameter }
  })
  return tubeBearing(tubeNotches(p, rabbets))
}

/**
 * When the pans cannot hide (too many or too large for the tube), the least
 * offset can leave the tube standing on almost nothing: each notch over a pan
 * eats its foot. Then the pans move out, 0.5 mm at a time, until the foot
 * bears at least the error limit (at the latest once the rabbets clear the
 * tube's outside wall, where no notch is needed), so the size shows its pans
 * but stays buildable.
 */
function standingOffset(p: PlateParams): number {
  const clear = p.tubeDiameter / 2 + panRadius(p)
  let offset = p.casterOffset
  while (offset < clear && bearingAt(p, offset) < TUBE_BEARING.error) offset += 0.5
  return Math.min(1500, offset)
}

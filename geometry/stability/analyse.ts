// The whole shop-math picture of one revision: the saved unit turned into
// masses and heights, the statics, the counterweight a target needs, and the
// findings (blocks that cannot go in or out, casters over their rating).
// buildPlate folds the errors among these into the plate's own findings
// (`unitPlateFindings`, without the search for blocks needed, so a rebuild
// stays cheap); the editor and the build sheet call analyseUnit for the
// figures.

import type { Finding, Plate } from '../types'
import { blockMass, blockPassage, layoutBlocks, materialDensity, type BlockLayout } from './counterweight'
import { supportPolygon, tipping } from './support'
import { STANDARD_GRAVITY, unitStability, type UnitInput, type UnitStability } from './stability'
import { COUNTERWEIGHT_MATERIALS, unitSchema, type UnitParams } from './unit-params'

export interface StabilityFinding extends Finding {
  /** The figures behind the message, in kg, mm, degrees and newtons. */
  values: Record<string, number>
}

export interface Formatters {
  length: (mm: number) => string
  mass: (kg: number) => string
  force: (n: number) => string
}

export const METRIC_FORMAT: Formatters = {
  length: (mm) => `${Math.round(mm)} mm`,
  mass: (kg) => `${kg.toFixed(1)} kg`,
  force: (n) => `${Math.round(n)} N`,
}

export interface LoadBreakdown {
  /** kg standing on the plate and its centre of mass above the floor, mm. */
  weight: number
  height: number
  /** Built mode only: the tube's own mass, kg (0 in given mode). */
  tube: number
}

export interface UnitAnalysis {
  unit: UnitParams
  input: UnitInput
  load: LoadBreakdown
  stability: UnitStability
  block: {
    mass: number
    density: number
    densitySource: string
    /** Diagonal of its smallest cross-section, mm. */
    passage: number
    /** The widest access opening, mm; 0 without openings. */
    opening: number
    passes: boolean
  }
  layout: BlockLayout
  /** The unit's own height above the floor, mm: the tube's top when built up, else estimated as a uniform column (twice the load's centre height above the plate). */
  unitHeight: number
  /** The push height asked for, mm; the one used (`stability.pushHeight`) is never above the unit's height. */
  pushHeightAsked: number
  /** Push to check at the push height, N (by the analogy), and whether the unit stands it. */
  checkPush: number
  pushPasses: boolean
  anglePasses: boolean
  /** Blocks in all (not extra) that reach the target angle / stand the check push; null when no number of blocks that fit does. */
  blocksForAngle: number | null
  blocksForPush: number | null
  /**
   * What would reach the target lean when it is missed: the caster offset,
   * mm, R = (h tan(theta) + e) / cos(pi / n) for n casters evenly on a circle
   * round the centre of mass (null with fewer than three casters), and the
   * blocks in all (`blocksForAngle`).
   */
  remedy: { casterOffset: number | null; blocks: number | null } | null
  /** The maker's rating of one caster, kg; null until typed. */
  casterRating: number | null
  findings: StabilityFinding[]
}

export interface AnalyseOptions {
  /** Search for the blocks needed for the target lean and the check push (lays out up to 500 blocks). Default true; buildPlate leaves it out. */
  search?: boolean
}

/** The load as one mass at one height: given, or built up from the tube, its cladding and props. */
export function resolveLoad(plate: Plate, unit: UnitParams): LoadBreakdown {
  const l = unit.load
  if (l.mode === 'given') return { weight: l.weight, height: l.height, tube: 0 }
  const top = plate.metrics.floorGap + plate.metrics.thickness
  const outer = plate.params.tubeDiameter / 2
  const inner = Math.max(0, outer - plate.params.tubeWall)
  const tube = Math.PI * (outer * outer - inner * inner) * l.tubeLength * 1e-9 * l.tubeDensity
  const tubeHeight = top + l.tubeLength / 2
  const weight = tube + l.cladding + l.props
  const height = weight > 0 ? ((tube + l.cladding) * tubeHeight + l.props * l.propsHeight) / weight : tubeHeight
  return { weight, height, tube }
}

const NO_BLOCKS: BlockLayout = { perLayer: 0, capacity: 0, spots: [], leftOver: 0, heightAboveTop: 0, x: 0, y: 0 }

function checkPushFor(unit: UnitParams, weightNewtons: number): number {
  return Math.min(unit.pushFraction * weightNewtons, unit.pushMax)
}

/** The unit's height above the floor, mm: the tube's top (or props above it) when built up; in given mode a uniform column's, twice the load's centre height above the plate's top. */
export function unitHeightOf(plate: Plate, unit: UnitParams, load: LoadBreakdown): number {
  const top = plate.metrics.floorGap + plate.metrics.thickness
  if (unit.load.mode === 'built') return Math.max(top + unit.load.tubeLength, unit.load.props > 0 ? unit.load.propsHeight : 0)
  return top + 2 * Math.max(0, load.height - top)
}

/** Caster offset (kingpin circle radius, mm) at which n casters evenly round the centre of mass stand a lean of `angle` degrees: R = (h tan(angle) + e) / cos(pi / n). */
export function casterOffsetFor(angle: number, height: number, lead: number, n: number): number | null {
  if (n < 3 || !(angle < 90)) return null
  return (height * Math.tan((angle * Math.PI) / 180) + lead) / Math.cos(Math.PI / n)
}

export function analyseUnit(plate: Plate, unitGiven?: UnitParams, format: Formatters = METRIC_FORMAT, options: AnalyseOptions = {}): UnitAnalysis {
  const unit = unitGiven ?? (plate.params as { unit?: UnitParams }).unit ?? unitSchema.parse({})
  const cw = unit.counterweight
  const density = materialDensity(cw.material)
  const mass = blockMass(cw.block, density)
  const top = plate.metrics.floorGap + plate.metrics.thickness
  // Without blocks and without the search, nothing reads the layout: skip it (buildPlate calls this on every rebuild).
  const layout = cw.count > 0 || options.search !== false ? layoutBlocks(plate, cw.block, cw.count, cw.maxLayers) : NO_BLOCKS
  const placed = layout.spots.length
  const load = resolveLoad(plate, unit)
  const casterCount = plate.holes.filter((h) => h.kind === 'pocket').length
  // A push is never checked above the unit itself.
  const unitHeight = unitHeightOf(plate, unit, load)
  const pushHeight = Math.min(unit.pushHeight, unitHeight)
  // No block fits a layer: the figures leave the blocks out (and a finding says so) rather than count them at the top face.
  const counted = layout.perLayer > 0 ? cw.count : 0
  const input: UnitInput = {
    loadWeight: load.weight,
    loadHeight: load.height,
    counterweight: counted * mass,
    counterweightHeight: top + layout.heightAboveTop,
    counterweightAt: { x: layout.x, y: layout.y },
    pushHeight,
    hardwareWeight: unit.hardwarePerCaster * casterCount,
  }
  // Blocks with no place are still counted as weight, on top of the stacks: what the shop said it loads.
  if (placed < cw.count && placed > 0) {
    const extraHeight = top + (cw.maxLayers + 0.5) * Math.min(cw.block.length, cw.block.width, cw.block.thickness)
    input.counterweightHeight = (placed * (top + layout.heightAboveTop) + (cw.count - placed) * extraHeight) / cw.count
  }
  const stability = unitStability(plate, input)
  const checkPush = checkPushFor(unit, stability.weightNewtons)
  const openings = plate.holes.filter((h) => h.kind === 'access')
  const opening = openings.reduce((m, h) => Math.max(m, h.diameter), 0)
  const passage = blockPassage(cw.block)

  // Blocks needed: add them one by one where the layout puts them and watch the figures.
  const search = options.search !== false
  const full = search ? layoutBlocks(plate, cw.block, 500, cw.maxLayers) : { spots: [] }
  const support = supportPolygon(stability.kingpins, stability.swivelLead)
  const base = stability.parts
  const baseMass = base.plate.kg + base.load.kg + base.hardware.kg
  const baseMz = base.plate.kg * base.plate.height + base.load.kg * base.load.height + base.hardware.kg * base.hardware.height
  const baseMx = stability.centreOfMass.x * stability.totalWeight - base.counterweight.kg * input.counterweightAt!.x
  const baseMy = stability.centreOfMass.y * stability.totalWeight - base.counterweight.kg * input.counterweightAt!.y
  let blocksForAngle: number | null = null
  let blocksForPush: number | null = null
  let mz = 0
  let mx = 0
  let my = 0
  const thick = Math.min(cw.block.length, cw.block.width, cw.block.thickness)
  for (let k = 0; search && k <= full.spots.length; k++) {
    if (k > 0) {
      const s = full.spots[k - 1]!
      mz += mass * (top + (s.layer + 0.5) * thick)
      mx += mass * s.x
      my += mass * s.y
    }
    const total = baseMass + k * mass
    const t = tipping(support, (baseMx + mx) / total, (baseMy + my) / total, (baseMz + mz) / total)
    const w = total * STANDARD_GRAVITY
    if (blocksForAngle === null && t.angle >= unit.targetAngle) blocksForAngle = k
    if (blocksForPush === null && (w * t.distance) / pushHeight >= checkPushFor(unit, w)) blocksForPush = k
    if (blocksForAngle !== null && blocksForPush !== null) break
  }

  const findings: StabilityFinding[] = []
  const L = format.length
  if (stability.supportDistance <= 0) {
    findings.push({
      code: 'unit-tips',
      severity: 'error',
      message: `The centre of mass stands ${L(-stability.supportDistance)} outside the wheels' support with every wheel swivelled the worst way: the unit leaves its wheels on its own${stability.overturnDistance > 0 ? ' and rests on a root' : ' and overturns'}. Move the casters out (caster offset) or add counterweight.`,
      field: 'casterOffset',
      values: { supportDistance: stability.supportDistance },
    })
  }
  if (cw.count > 0 && (openings.length === 0 || passage >= opening)) {
    // Blocks that cannot pass the openings can still be laid on the plate before the tube goes on.
    findings.push({
      code: 'counterweight-passage',
      severity: 'warning',
      message: openings.length === 0
        ? 'The plate has no access openings: the counterweight must go in before the tube is fixed on, and comes out only with the tube off.'
        : `A block needs an opening wider than ${L(passage)} (the diagonal of its smallest end); the access openings are ${L(opening)}: the counterweight must go in before the tube is fixed on, and comes out only with the tube off.`,
      field: openings.length === 0 ? 'access.enabled' : 'access.diameter',
      values: { passage, opening },
    })
  }
  if (cw.count > layout.capacity) {
    findings.push({
      code: 'counterweight-fit',
      severity: 'error',
      message: layout.perLayer === 0
        ? `No block fits inside the tube clear of the pans and the access openings: the figures leave out the ${cw.count} blocks loaded.`
        : `Only ${layout.capacity} blocks fit inside the tube (${layout.perLayer} a layer, ${cw.maxLayers} high), clear of the pans and the access openings; ${cw.count} are loaded.`,
      field: 'unit.counterweight.count',
      values: { capacity: layout.capacity, perLayer: layout.perLayer, count: cw.count },
    })
  }
  const rating = unit.casterRating ?? null
  if (rating !== null && stability.loadPerCaster > rating) {
    findings.push({
      code: 'caster-overload',
      severity: 'error',
      message: `The worst-loaded caster may carry ${format.mass(stability.loadPerCaster)} when the plate stands on three wheels (an uneven floor), more than its rating of ${format.mass(rating)}. Use casters rated higher, or more of them.`,
      field: 'unit.casterRating',
      values: { loadPerCaster: stability.loadPerCaster, rating, evenShare: stability.evenShare },
    })
  }
  const anglePasses = stability.tippingAngle >= unit.targetAngle
  const offsetNeeded = anglePasses ? null : casterOffsetFor(unit.targetAngle, stability.centreOfMassHeight, stability.swivelLead, casterCount)
  const remedy = anglePasses ? null : { casterOffset: offsetNeeded, blocks: blocksForAngle }
  if (stability.supportDistance > 0 && !anglePasses) {
    const ways = [
      offsetNeeded !== null ? `a caster offset of about ${L(offsetNeeded)} (now ${L(plate.params.casterOffset)})` : null,
      search ? (blocksForAngle !== null ? `${blocksForAngle} counterweight block${blocksForAngle === 1 ? '' : 's'}` : null) : 'counterweight (Blocks)',
    ].filter((w): w is string => !!w)
    findings.push({
      code: 'tipping-angle',
      severity: 'warning',
      message: `It leaves its wheels at a lean of ${stability.tippingAngle.toFixed(1)}°, less than the ${unit.targetAngle}° aimed for.${ways.length ? ` To reach it: ${ways.join(', or ')}.` : ''}`,
      field: offsetNeeded !== null ? 'casterOffset' : 'unit.counterweight.count',
      values: { tippingAngle: stability.tippingAngle, targetAngle: unit.targetAngle, ...(offsetNeeded !== null ? { casterOffset: offsetNeeded } : {}) },
    })
  }
  const pushPasses = stability.tippingPush >= checkPush
  if (stability.supportDistance > 0 && !pushPasses) {
    findings.push({
      code: 'tipping-push',
      severity: 'warning',
      message: `A push of ${format.force(stability.tippingPush)} at ${L(stability.pushHeight)} lifts its wheels, less than the ${format.force(checkPush)} checked (an analogy, not a scenery rule).${search && blocksForPush !== null ? ` ${blocksForPush} counterweight block${blocksForPush === 1 ? '' : 's'} would stand it.` : ' Move the casters out or add counterweight.'}`,
      field: 'unit.counterweight.count',
      values: { tippingPush: stability.tippingPush, checkPush },
    })
  }

  return {
    unit,
    input,
    load,
    stability,
    block: { mass, density, densitySource: COUNTERWEIGHT_MATERIALS[cw.material].source, passage, opening, passes: openings.length > 0 && passage < opening },
    layout,
    unitHeight,
    pushHeightAsked: unit.pushHeight,
    checkPush,
    pushPasses,
    anglePasses,
    blocksForAngle,
    blocksForPush,
    remedy,
    casterRating: rating,
    findings,
  }
}

/**
 * The unit's plate findings (buildPlate adds them): every stability, caster
 * and counterweight error, and the counterweight that must go in before the
 * tube (a warning, but one the builder must know before the tube goes on),
 * worked out without the search for blocks needed. The tipping warnings
 * stay with the figures.
 */
const PLATE_WARNINGS: ReadonlySet<string> = new Set(['counterweight-passage'])

export function unitPlateFindings(plate: Plate, unit?: UnitParams): StabilityFinding[] {
  return analyseUnit(plate, unit, METRIC_FORMAT, { search: false }).findings.filter((f) => f.severity === 'error' || PLATE_WARNINGS.has(f.code))
}

/** The findings alone: what a caller folding them into a plate's list needs. */
export function stabilityFindings(plate: Plate, unit?: UnitParams, format?: Formatters): StabilityFinding[] {
  return analyseUnit(plate, unit, format).findings
}

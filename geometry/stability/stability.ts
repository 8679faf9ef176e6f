// unitStability: the statics of a unit standing on its plate. Every figure is
// an estimate on stated assumptions (rigid unit, level floor, wheels that do
// not sink or roll while it leans, centre of mass where it is entered); the
// shop's qualified person, the venue's rules and local codes decide.

import type { Plate, Point } from '../types'
import { floorTouch, overturn, stanceLoads, supportPolygon, tipping, type SupportEdge } from './support'
import { PUSH_ANALOGY } from './unit-params'

/** Standard gravity, m/s2 (CGPM 1901): W = m g. */
export const STANDARD_GRAVITY = 9.80665

/** Rolling resistance of hard wheels on a smooth floor, a fraction of the weight (common practice, from memory). */
export const ROLLING_RESISTANCE = { low: 0.01, high: 0.03, source: 'common practice, from memory: about 1-3 % of the load for hard wheels on a smooth floor' } as const

export interface UnitInput {
  /** kg standing on the plate (the plate's own weight is added here). */
  loadWeight: number
  /** Its centre of mass above the floor, mm. */
  loadHeight: number
  /** Counterweight, kg. */
  counterweight?: number
  /** Its centre of mass above the floor, mm; default just above the plate's top face. */
  counterweightHeight?: number
  /** Where the counterweight's centre sits in plan, mm; default the plate centre. */
  counterweightAt?: { x: number; y: number }
  /** Height of the push to check, mm; default 1500 (the analogy in PUSH_ANALOGY). */
  pushHeight?: number
  /** Casters and pans together, kg; default 0. */
  hardwareWeight?: number
}

export interface WeightPart {
  kg: number
  /** Centre of mass above the floor, mm. */
  height: number
}

export interface UnitStability {
  /**
   * Degrees the unit may lean in the worst direction before it leaves its
   * wheels (the centre of mass passes the wheels' support, one side's wheels
   * lift); negative when it already stands outside its support. Where a root
   * reaches the floor it rocks onto the root then, and overturns only at
   * `overturnAngle`.
   */
  tippingAngle: number
  /** Horizontal distance from the centre of mass to the nearest side of the support polygon, mm. */
  supportDistance: number
  /** Horizontal push at `pushHeight` that tips it over a blocked wheel, N: W d / H. */
  tippingPush: number
  pushHeight: number
  /**
   * kg on the worst-loaded caster when the rigid plate stands on any three of
   * its wheels whose triangle holds the centre of mass (an uneven floor; the
   * barycentric shares of the weight, wheels at their kingpins). Three
   * casters: their exact loads. The whole weight when no three hold it.
   */
  loadPerCaster: number
  /** The even share, kg: the total over the casters (a level floor and a perfectly flat plate). */
  evenShare: number
  /** Caster (0-based, in the plate's pocket order) that carries `loadPerCaster`, and the stance of three it stands in; -1 and [] when none holds the centre of mass. */
  worstCaster: number
  worstStance: number[]
  /** Degrees it may lean before it overturns about the outline's convex hull (a root on the floor), and the horizontal distance to that hull's nearest side, mm. */
  overturnAngle: number
  overturnDistance: number
  overturnLine: [Point, Point] | null
  /** Combined centre of mass above the floor, mm. */
  centreOfMassHeight: number
  /** Combined centre of mass in plan, mm. */
  centreOfMass: { x: number; y: number }
  /** Total mass, kg, and its weight, N. */
  totalWeight: number
  weightNewtons: number
  parts: { plate: WeightPart; load: WeightPart; counterweight: WeightPart; hardware: WeightPart }
  swivelLead: number
  /** Kingpins (pocket centres), counter-clockwise. */
  kingpins: Point[]
  /** The kingpin polygon moved inward by the swivel lead; empty when the lead swallows it. */
  supportPolygon: Point[]
  /** The side it tips over: the tipping line drawn on the canvas. */
  tippingLine: [Point, Point] | null
  /** Direction it tips towards (the side's outward normal), degrees. */
  tippingDirection: number
  /** Least leaning angle at which some point of the outline reaches the floor, degrees (90: never). */
  rootTouchAngle: number
  /** How far that point stands beyond the side it turns about, mm. */
  rootTouchReach: number
  /** Rolling push on a smooth floor, N (1-3 % of the weight, from memory). */
  rollingPush: { low: number; high: number }
}

/** Centre of the wood in plan: the outline's centroid less the through-holes. */
export function plateCentroid(plate: Pick<Plate, 'outline' | 'holes'>): { x: number; y: number } {
  const ring = plate.outline
  let a2 = 0
  let cx = 0
  let cy = 0
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const p = ring[j]!
    const q = ring[i]!
    const cross = p[0] * q[1] - q[0] * p[1]
    a2 += cross
    cx += (p[0] + q[0]) * cross
    cy += (p[1] + q[1]) * cross
  }
  let area = a2 / 2
  let mx = cx / 6
  let my = cy / 6
  for (const h of plate.holes) {
    const ha = Math.PI * (h.diameter / 2) ** 2
    area -= ha
    mx -= ha * h.x
    my -= ha * h.y
  }
  return area > 0 ? { x: mx / area, y: my / area } : { x: 0, y: 0 }
}

function edgeLine(e: SupportEdge | null): [Point, Point] | null {
  return e ? [e.from, e.to] : null
}

/**
 * Statics of the unit on this plate. kg and mm in; degrees, mm, newtons, kg
 * per caster and mm out. The plate's own weight (from its volume) is added
 * at half its thickness above the floor gap, at the centroid of its wood;
 * the load stands on the plate centre.
 */
export function unitStability(plate: Plate, unit: UnitInput): UnitStability {
  const m = plate.metrics
  const top = m.floorGap + m.thickness
  const wood = plateCentroid(plate)
  const parts = {
    plate: { kg: m.weight, height: m.floorGap + m.thickness / 2 },
    load: { kg: Math.max(0, unit.loadWeight), height: unit.loadHeight },
    counterweight: { kg: Math.max(0, unit.counterweight ?? 0), height: unit.counterweightHeight ?? top },
    hardware: { kg: Math.max(0, unit.hardwareWeight ?? 0), height: plate.params.caster.overallHeight / 2 },
  }
  const at = unit.counterweightAt ?? { x: 0, y: 0 }
  const total = parts.plate.kg + parts.load.kg + parts.counterweight.kg + parts.hardware.kg
  const safe = total > 0 ? total : 1
  const height = (parts.plate.kg * parts.plate.height + parts.load.kg * parts.load.height + parts.counterweight.kg * parts.counterweight.height + parts.hardware.kg * parts.hardware.height) / safe
  const x = (parts.plate.kg * wood.x + parts.counterweight.kg * at.x) / safe
  const y = (parts.plate.kg * wood.y + parts.counterweight.kg * at.y) / safe

  const lead = plate.params.caster.swivelLead
  const kingpins: Point[] = plate.holes.filter((h) => h.kind === 'pocket').map((h) => [h.x, h.y])
  const support = supportPolygon(kingpins, lead)
  const tip = tipping(support, x, y, height)
  const touch = floorTouch(support, plate.outline, m.floorGap)
  const over = overturn(plate.outline, x, y, height)
  const stance = stanceLoads(kingpins, x, y, total)

  const pushHeight = unit.pushHeight ?? PUSH_ANALOGY.height
  const weightNewtons = total * STANDARD_GRAVITY
  const n = kingpins.length
  return {
    tippingAngle: tip.angle,
    supportDistance: tip.distance,
    tippingPush: pushHeight > 0 ? (weightNewtons * (tip.distance / 1000)) / (pushHeight / 1000) : Infinity,
    pushHeight,
    loadPerCaster: stance.worst,
    evenShare: total / Math.max(1, n),
    worstCaster: stance.caster,
    worstStance: stance.stance,
    overturnAngle: over.angle,
    overturnDistance: over.distance,
    overturnLine: over.line,
    centreOfMassHeight: height,
    centreOfMass: { x, y },
    totalWeight: total,
    weightNewtons,
    parts,
    swivelLead: lead,
    kingpins: support.kingpins,
    supportPolygon: support.polygon,
    tippingLine: edgeLine(tip.edge),
    tippingDirection: tip.edge ? (Math.atan2(tip.edge.ny, tip.edge.nx) * 180) / Math.PI : 0,
    rootTouchAngle: touch.angle,
    rootTouchReach: touch.reach,
    rollingPush: { low: weightNewtons * ROLLING_RESISTANCE.low, high: weightNewtons * ROLLING_RESISTANCE.high },
  }
}

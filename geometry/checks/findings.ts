// Problems with a plate the schema accepted. A plate is never refused here:
// the designer sees each problem where it is and decides. Errors are things a
// shop cannot build or must not roll; warnings are things it should look at.

import type { PlateParams } from '../params'
import type { CasterMount, Fastener, Finding, Hole, Point, Rabbet, TubeNotch } from '../types'
import type { OutlineShape } from '../outline/shape'
import { edgeGap, lensArea, centreDistance, type Circle } from '../math/circles'
import { probeRing } from '../math/polygon'
import { fastenerFloorFindings, type FloorStack } from './floor'
import { insideRadiusFindings, rootFindings, sheetFindings } from './cutting'
import { panFindings } from './pans'
import { placeAccess } from '../features/placement'
import { MM_PER_INCH } from '../units'

/** A 4x8 ft panel, 48 x 96 in nominal (US Product Standard PS 1-19): the default sheet. */
export const SHEET_MM = { width: 1219.2, length: 2438.4 } as const

export interface FindingsInput {
  params: PlateParams
  outline: readonly Point[]
  pockets: readonly Hole[]
  rabbets: readonly Rabbet[]
  access: readonly Hole[]
  centre: Hole
  index: readonly Hole[]
  casterMounts: readonly CasterMount[]
  fasteners: readonly Fastener[]
  notches: readonly TubeNotch[]
  tubeBearing: number
  stack: FloorStack
  /** The outline's radius function and the angle of each outline vertex, for the cutting checks. */
  shape: OutlineShape
  thetas: Float64Array
  /** Radius of the smallest circle round the outline; a plate inside a 48 in circle fits a sheet without turning it. */
  enclosingRadius: number
}

interface Keepout {
  hole: Hole
  /** The circle wood must keep clear of: a pocket's rabbet ring, otherwise the hole itself. */
  circle: Circle
  label: string
  field: string
}

const mm = (v: number) => `${Math.round(v * 10) / 10} mm`

function labelFor(hole: Hole): string {
  const n = Number(hole.id.split('-')[1] ?? 0) + 1
  switch (hole.kind) {
    case 'pocket': return `Pocket ${n}`
    case 'access': return `Access opening ${n}`
    case 'index': return `Index hole ${n}`
    case 'centre': return 'The centre hole'
  }
}

const FIELD: Record<Hole['kind'], string> = {
  pocket: 'casterOffset',
  access: 'access.offset',
  centre: 'centreHoleDiameter',
  index: 'indexHoleDiameter',
}

function keepouts(input: FindingsInput): Keepout[] {
  const out: Keepout[] = []
  input.pockets.forEach((hole, k) => {
    const rb = input.rabbets[k]
    const radius = rb ? rb.diameter / 2 : hole.diameter / 2
    out.push({ hole, circle: { x: hole.x, y: hole.y, radius }, label: labelFor(hole), field: FIELD.pocket })
  })
  for (const hole of [...input.access, input.centre, ...input.index]) {
    out.push({ hole, circle: { x: hole.x, y: hole.y, radius: hole.diameter / 2 }, label: labelFor(hole), field: FIELD[hole.kind] })
  }
  return out
}

function edgeFindings(input: FindingsInput, items: readonly Keepout[]): Finding[] {
  const found: Finding[] = []
  const minWood = input.params.minWood
  const probes = probeRing(input.outline, items.map((i) => i.circle))
  items.forEach(({ hole, circle, label, field }, k) => {
    const probe = probes[k]!
    const wood = probe.inside ? probe.distance - circle.radius : -Infinity
    const at = { x: circle.x, y: circle.y, radius: circle.radius }
    if (wood < 0) {
      found.push({ code: 'hole-cuts-edge', severity: 'error', message: `${label} cuts through the plate's edge.`, at, holeIds: [hole.id], field, values: { minWood } })
    } else if (wood < minWood) {
      found.push({ code: 'edge-too-close', severity: 'warning', message: `${label} has ${mm(wood)} of wood to the edge, less than the minimum ${mm(minWood)}.`, at, holeIds: [hole.id], field, values: { wood, minWood } })
    }
  })
  return found
}

function spacingFindings(input: FindingsInput, items: readonly Keepout[]): Finding[] {
  const found: Finding[] = []
  const minWood = input.params.minWood
  for (let i = 0; i < items.length; i++) {
    for (let j = i + 1; j < items.length; j++) {
      const a = items[i]!
      const b = items[j]!
      const gap = edgeGap(a.circle, b.circle)
      const holeIds = [a.hole.id, b.hole.id]
      const field = a.hole.kind === 'pocket' && b.hole.kind !== 'pocket' ? b.field : a.field
      const d = centreDistance(a.circle, b.circle)
      const at = { x: (a.circle.x + b.circle.x) / 2, y: (a.circle.y + b.circle.y) / 2 }
      if (gap < 0) {
        const shared = lensArea(a.circle.radius, b.circle.radius, d)
        found.push({
          code: 'holes-overlap',
          severity: 'error',
          message: `${a.label} and ${b.label.toLowerCase()} run into each other (${Math.round(shared)} mm2 shared).`,
          at,
          holeIds,
          field,
          values: { sharedArea: shared, overlap: -gap },
        })
      } else if (gap < minWood && a.hole.kind !== 'index' && b.hole.kind !== 'index') {
        // Index holes are small drilled marks: only their running into another hole matters.
        found.push({
          code: 'holes-too-close',
          severity: 'warning',
          message: `${a.label} and ${b.label.toLowerCase()} have ${mm(gap)} of wood between them, less than the minimum ${mm(minWood)}.`,
          at,
          holeIds,
          field,
          values: { wood: gap, minWood },
        })
      }
    }
  }
  return found
}

/** The tube stands on the ring between its inside and outside: an opening there leaves it unsupported. */
function trunkWallFindings(input: FindingsInput): Finding[] {
  const found: Finding[] = []
  const ro = input.params.tubeDiameter / 2
  const ri = ro - input.params.tubeWall
  for (const hole of [...input.access, input.centre]) {
    const d = Math.hypot(hole.x, hole.y)
    const r = hole.diameter / 2
    const at = { x: hole.x, y: hole.y, radius: r }
    const label = labelFor(hole)
    if (d - r >= ro) {
      found.push({ code: 'access-outside-trunk', severity: 'warning', message: `${label} lies outside the trunk, where it shows and cannot be reached from inside.`, at, holeIds: [hole.id], field: FIELD[hole.kind], values: { distance: d - r, tubeRadius: ro } })
    } else if (d + r > ri) {
      found.push({ code: 'hole-crosses-trunk-wall', severity: 'error', message: `${label} reaches under the tube wall, which would stand on nothing there.`, at, holeIds: [hole.id], field: FIELD[hole.kind], values: { reach: d + r, insideRadius: ri } })
    }
  }
  return found
}

function casterFindings(input: FindingsInput): Finding[] {
  const found: Finding[] = []
  const { params, stack } = input
  const c = params.caster
  const pocketRadius = params.pocketDiameter / 2
  const diagonal = Math.hypot(c.topPlateWidth, c.topPlateLength)
  const first = input.pockets[0]
  const at = first ? { x: first.x, y: first.y, radius: pocketRadius } : undefined
  const ids = input.pockets.map((p) => p.id)
  // A block passes a round opening when the diagonal of its smallest cross-section is less than the opening's diameter.
  if (diagonal >= params.pocketDiameter) {
    found.push({ code: 'caster-too-big-for-pocket', severity: 'error', message: `The caster's top plate (${mm(diagonal)} corner to corner) cannot pass through a ${mm(params.pocketDiameter)} pocket to reach the pan.`, at, holeIds: ids, field: 'pocketDiameter', values: { diagonal, pocketDiameter: params.pocketDiameter } })
  }
  if (stack.swivelRadius > pocketRadius) {
    found.push({ code: 'wheel-swing', severity: 'error', message: `The swivelling wheel's tread edge reaches ${mm(stack.swivelRadius - c.swivelClearance)} from its kingpin inside the pocket; with the ${mm(c.swivelClearance)} clearance it needs ${mm(stack.swivelRadius)}, past the pocket's edge at ${mm(pocketRadius)}.`, at, holeIds: ids, field: 'pocketDiameter', values: { swivelRadius: stack.swivelRadius, wheelReach: stack.wheelReach, clearance: c.swivelClearance, pocketRadius } })
  }
  const raceway = c.racewayDiameter / 2
  for (const mount of input.casterMounts) {
    const pocket = input.pockets.find((p) => p.id === mount.pocketId)
    if (!pocket) continue
    const inside = mount.bolts.filter((b) => Math.hypot(b.x - pocket.x, b.y - pocket.y) - b.diameter / 2 < raceway)
    if (inside.length > 0) {
      const b = inside[0]!
      found.push({ code: 'bolt-in-raceway', severity: 'error', message: `${labelFor(pocket)}: ${inside.length} mounting bolt(s) fall inside the swivel raceway (${mm(c.racewayDiameter)} across).`, at: { x: b.x, y: b.y, radius: b.diameter / 2 }, holeIds: [pocket.id], field: 'caster.racewayDiameter', values: { racewayDiameter: c.racewayDiameter } })
    }
  }
  return found
}

function floorFindings(input: FindingsInput): Finding[] {
  const { params, stack } = input
  if (stack.floorGap < 0) {
    return [{ code: 'floor-gap-negative', severity: 'error', message: `The plate would sit ${mm(-stack.floorGap)} below the wheels' reach: it rests on the floor and the casters carry nothing. Use a shallower pan or taller casters.`, field: 'panDepth', values: { floorGap: stack.floorGap } }]
  }
  if (stack.floorGap < params.minFloorGap) {
    return [{ code: 'floor-gap-small', severity: 'warning', message: `Floor gap ${mm(stack.floorGap)} is less than the ${mm(params.minFloorGap)} asked for.`, field: 'panDepth', values: { floorGap: stack.floorGap, minFloorGap: params.minFloorGap } }]
  }
  return []
}

/** The smallest hole saw an access opening is cut with (3/4 in; sizing to a tube tries no smaller). */
const SMALLEST_ACCESS_SAW = 0.75 * MM_PER_INCH

/**
 * Openings left out because none has room: not even the smallest saw fits
 * between the pans inside the tube wall (sizing a design to a small tube
 * drops them then). Nothing can reach in after the tube is fixed.
 */
function accessRoomFindings(input: FindingsInput): Finding[] {
  const p = input.params
  if (p.access.enabled || placeAccess(p, p.casterOffset, SMALLEST_ACCESS_SAW) !== null) return []
  return [{
    code: 'access-no-room', severity: 'warning',
    message: `No access opening fits between the pans inside the tube wall, not even a ${mm(SMALLEST_ACCESS_SAW)} hole saw: the plate has none, so the pan fasteners cannot be reached from inside the trunk and any counterweight goes in before the tube is fixed.`,
    field: 'access.enabled', values: { smallestSaw: SMALLEST_ACCESS_SAW, insideRadius: p.tubeDiameter / 2 - p.tubeWall },
  }]
}

export { labelFor }

export function plateFindings(input: FindingsInput): Finding[] {
  const items = keepouts(input)
  return [
    ...edgeFindings(input, items),
    ...spacingFindings(input, items),
    ...trunkWallFindings(input),
    ...accessRoomFindings(input),
    ...casterFindings(input),
    ...floorFindings(input),
    ...fastenerFloorFindings(input.params, input.stack),
    ...panFindings(input),
    ...cuttingFindings(input),
  ]
}

function cuttingFindings(input: FindingsInput): Finding[] {
  return [
    ...insideRadiusFindings(input.params, input.outline),
    ...rootFindings(input.params, input.shape, input.outline, input.thetas),
    ...sheetFindings(input.params, input.outline, input.enclosingRadius),
  ]
}

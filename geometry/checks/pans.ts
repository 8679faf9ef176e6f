// The pans and the tube standing over them: a pan showing outside the trunk,
// a tube foot notched away until little stands on wood, too little plywood
// under a rabbet, and rim fasteners that miss the rim.

import type { Finding } from '../types'
import type { FindingsInput } from './findings'
import { placeCasters } from '../features/placement'
import { fastenerCircleDiameter } from '../features/holes'

const mm = (v: number) => `${Math.round(v * 10) / 10} mm`
const pct = (v: number) => `${Math.round(v * 100)} %`

/**
 * Tube-bearing limits: below WARN of the foot on wood the tube stands on a
 * few short stubs and can crush or rack; below ERROR it has almost nothing
 * left to stand on. Engineering judgement from memory, not a published
 * figure: the shop's qualified person decides.
 */
export const TUBE_BEARING = { warn: 0.5, error: 0.25 } as const

/**
 * Least plywood under a rabbet, mm: the rim's fasteners need bite and the
 * ring round the pocket carries the caster's load. 1/2 in, from memory.
 */
export const LEAST_RABBET_FLOOR = 12.7

/** Float noise on the fastener wood figures, mm: the defaults leave exactly the least wood. */
const FASTENER_WOOD_TOLERANCE = 1e-6

/** Gap of 1/100 mm accepted before a pan counts as showing: float noise, not a visible edge. */
const SHOW_TOLERANCE = 0.01

export function panFindings(input: FindingsInput): Finding[] {
  const { params } = input
  const found: Finding[] = []
  const ro = params.tubeDiameter / 2

  const showing = input.rabbets
    .map((rb) => ({ rb, out: Math.hypot(rb.x, rb.y) + rb.diameter / 2 - ro }))
    .filter((s) => s.out > SHOW_TOLERANCE)
  if (showing.length > 0) {
    const place = placeCasters(params)
    const worst = showing.reduce((a, b) => (b.out > a.out ? b : a))
    const reason = place.hidden
      ? `A caster offset of ${mm(place.hiddenMax)} or less hides them.`
      : `This tube is too slim to hide them: pans this size need at least ${mm(place.least)} of offset to clear the centre hole and each other, but hide only up to ${mm(Math.max(0, place.hiddenMax))}. Smaller pans and casters, fewer casters or a larger tube would hide them.`
    found.push({
      code: 'pan-visible',
      severity: 'warning',
      message: `${showing.length === input.rabbets.length ? 'Every pan' : `${showing.length} pan(s)`} and rabbet show${showing.length === 1 ? 's' : ''} up to ${mm(worst.out)} outside the trunk's outside wall. ${reason}`,
      at: { x: worst.rb.x, y: worst.rb.y, radius: worst.rb.diameter / 2 },
      holeIds: showing.map((s) => s.rb.pocketId),
      field: 'casterOffset',
      values: { showing: worst.out, casterOffset: params.casterOffset, hiddenMax: place.hiddenMax, least: place.least },
    })
  }

  const bearing = input.tubeBearing
  if (bearing < TUBE_BEARING.warn) {
    const lost = input.notches.reduce((s, n) => s + n.span, 0)
    const first = input.notches[0]
    const a = first ? (first.angle * Math.PI) / 180 : 0
    const error = bearing < TUBE_BEARING.error
    found.push({
      code: 'tube-bearing',
      severity: error ? 'error' : 'warning',
      message: `Only ${pct(bearing)} of the tube's foot stands on wood: the notches over the pans take ${Math.round(Math.min(360, lost))} degrees of it. ${error ? 'The tube has almost nothing to stand on.' : 'It stands on short stubs.'} Tuck the pans further in, use smaller pans or fewer casters.`,
      at: { x: ro * Math.cos(a), y: ro * Math.sin(a), radius: params.tubeWall },
      holeIds: input.notches.map((n) => n.pocketId),
      field: 'casterOffset',
      values: { bearing, notchedAngle: Math.min(360, lost), warnBelow: TUBE_BEARING.warn, errorBelow: TUBE_BEARING.error },
    })
  }

  const floor = input.stack.thickness - params.rabbetDepth
  if (floor < LEAST_RABBET_FLOOR) {
    const rb = input.rabbets[0]
    found.push({
      code: 'rabbet-floor-thin',
      severity: 'warning',
      message: `The rabbet leaves ${mm(floor)} of plywood under the pan's rim, less than ${mm(LEAST_RABBET_FLOOR)}: too little for the rim's fasteners to bite and to carry the caster. Make the rabbet shallower or the plate thicker.`,
      ...(rb ? { at: { x: rb.x, y: rb.y, radius: rb.diameter / 2 } } : {}),
      field: 'rabbetDepth',
      values: { wood: floor, least: LEAST_RABBET_FLOOR },
    })
  }

  // Fasteners must land in the rabbet floor, with at least the fasteners' least wood between each
  // hole and the pocket's edge (a free edge) and between it and the rabbet's edge (the step the
  // rim sits against).
  const fp = params.fasteners
  const bc = fastenerCircleDiameter(params) / 2
  const f = fp.diameter / 2
  const inner = params.pocketDiameter / 2
  const outer = params.pocketDiameter / 2 + params.rabbetWidth
  const toPocket = bc - f - inner
  const toEdge = outer - (bc + f)
  const first = input.fasteners[0]
  const at = first ? { at: { x: first.x, y: first.y, radius: f } } : {}
  const holeIds = [...new Set(input.fasteners.map((x) => x.pocketId))]
  if (toPocket < 0 || toEdge < 0) {
    found.push({
      code: 'fastener-off-rim',
      severity: 'error',
      message: `The pan-rim fasteners on a ${mm(2 * bc)} circle do not land in the rabbet floor between the pocket (${mm(2 * inner)}) and the rabbet's edge (${mm(2 * outer)}).`,
      ...at,
      field: 'fasteners.boltCircleDiameter',
      values: { boltCircleDiameter: 2 * bc, pocketDiameter: 2 * inner, rabbetDiameter: 2 * outer, fastenerDiameter: 2 * f },
    })
  } else if (Math.min(toPocket, toEdge) < fp.edgeWood - FASTENER_WOOD_TOLERANCE) {
    const nearPocket = toPocket <= toEdge
    found.push({
      code: 'fastener-edge-wood',
      severity: 'warning',
      message: `The pan-rim fastener holes leave ${mm(Math.min(toPocket, toEdge))} of wood to the ${nearPocket ? "pocket's edge" : "rabbet's edge"}, less than the ${mm(fp.edgeWood)} least wood for fasteners: the wood splits out. Use smaller fasteners, a wider rabbet or move the bolt circle.`,
      ...at,
      holeIds,
      // Room for the least wood on both sides: moving the circle mends it; otherwise the ring is too narrow.
      field: toPocket + toEdge >= 2 * fp.edgeWood ? 'fasteners.boltCircleDiameter' : 'rabbetWidth',
      values: { toPocket, toEdge, wood: Math.min(toPocket, toEdge), least: fp.edgeWood, fastenerDiameter: 2 * f },
    })
  }
  return found
}

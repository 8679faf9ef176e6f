// Face grain: with `grain`, a part may turn only end for end (0 or 180 deg),
// so its grain stays along the sheet's. The turn is read from the placed
// outline itself (the direction of its first edge against the given one),
// not from what the nester says it did. Plain plane geometry.
import { describe, expect, it } from 'vitest'
import { nestParts } from '../../../geometry/nest'
import type { Pt } from './checks'

/** A tall strip, 40 x 300 mm, drawn counter-clockwise from its lower-left corner. */
const STRIP: Pt[] = [[0, 0], [40, 0], [40, 300], [0, 300]]
// A wide, short sheet: laid flat (turned 90 deg) three strips would stand in a row along x.
const SHEET = { width: 1000, height: 400, margin: 10, kerf: 3 }

/** The turn, degrees in [0, 360), that takes the given outline's first edge onto the placed one's. */
function turnOf(given: Pt[], placed: Pt[]): number {
  const a = Math.atan2(given[1]![1] - given[0]![1], given[1]![0] - given[0]![0])
  const b = Math.atan2(placed[1]![1] - placed[0]![1], placed[1]![0] - placed[0]![0])
  const deg = ((b - a) * 180) / Math.PI
  return ((Math.round(deg) % 360) + 360) % 360
}

describe('nestParts with the grain kept along the sheet', () => {
  it('turns no part a quarter turn, though quarter turns would pack lower', () => {
    const free = nestParts([{ outline: STRIP, count: 6 }], SHEET)
    const freeTurns = free.sheets.flatMap((s) => s.parts.map((p) => turnOf(STRIP, p.outline)))
    // Without the grain rule the lowest-edge placement lays strips flat: the case is one where the rule matters.
    expect(freeTurns.some((t) => t === 90 || t === 270)).toBe(true)

    const kept = nestParts([{ outline: STRIP, count: 6 }], SHEET, { grain: true })
    const turns = kept.sheets.flatMap((s) => s.parts.map((p) => turnOf(STRIP, p.outline)))
    expect(turns).toHaveLength(6)
    for (const t of turns) expect([0, 180]).toContain(t)
  })
})

// The improvement phase (geometry/nest/improve.ts) checked from outside: each
// layout it reports is sound by the independent checks of checks.ts
// (polygon-clipping overlaps, brute-force gaps against the kerf, every point
// inside the margin, parts congruent to the ones given, every copy placed
// once); its scores are read here from the outlines (sheets, then the last
// sheet's far edge); the best is never worse than the first layout; a seed
// gives the same layouts; and on a hand case where largest first is known to
// lose, the search finds the hand optimum.
import { describe, expect, it } from 'vitest'
import { buildPlate, deriveForTube, inchesToMm, presetParams } from '../../../geometry'
import { improveNesting, improveSteps, type ImprovedLayout } from '../../../geometry/nest/improve'
import { nestParts, nestWithState } from '../../../geometry/nest/nest'
import { gap, overlapArea, perimeterOf, shoelace, type Pt } from './checks'

type Parts = { outline: Pt[]; count: number }[]
type Sheet = { width: number; height: number; margin: number; kerf: number }
type Layout = { sheets: { parts: { part: number; outline: Pt[] }[] }[] }

function rect(w: number, h: number): Pt[] {
  return [[0, 0], [w, 0], [w, h], [0, h]]
}

/** Sheets used, then the last sheet's far edge along y: read from the outlines, not from the nester. */
function scoreOf(layout: Layout): [number, number] {
  const last = layout.sheets[layout.sheets.length - 1]!
  return [layout.sheets.length, Math.max(...last.parts.flatMap((p) => p.outline.map((q) => q[1])))]
}

function noWorse(a: [number, number], b: [number, number]): boolean {
  return a[0] < b[0] || (a[0] === b[0] && a[1] <= b[1] + 1e-9)
}

/** Every copy once, congruent (same signed area, perimeter, point distances), inside the margin, apart by the kerf. */
function expectSound(parts: Parts, sheet: Sheet, layout: Layout): void {
  const placed = parts.map(() => 0)
  for (const s of layout.sheets) for (const p of s.parts) placed[p.part]!++
  expect(placed).toEqual(parts.map((p) => p.count))
  for (const s of layout.sheets) {
    for (const p of s.parts) {
      const src = parts[p.part]!.outline
      expect(p.outline.length).toBe(src.length)
      expect(shoelace(p.outline)).toBeCloseTo(shoelace(src), 3)
      expect(perimeterOf(p.outline)).toBeCloseTo(perimeterOf(src), 6)
      for (const k of [1, Math.floor(src.length / 3), Math.floor((2 * src.length) / 3)]) {
        const d0 = Math.hypot(src[k]![0] - src[0]![0], src[k]![1] - src[0]![1])
        const d1 = Math.hypot(p.outline[k]![0] - p.outline[0]![0], p.outline[k]![1] - p.outline[0]![1])
        expect(d1).toBeCloseTo(d0, 6)
      }
      for (const [x, y] of p.outline) {
        expect(x).toBeGreaterThanOrEqual(sheet.margin - 1e-6)
        expect(y).toBeGreaterThanOrEqual(sheet.margin - 1e-6)
        expect(x).toBeLessThanOrEqual(sheet.width - sheet.margin + 1e-6)
        expect(y).toBeLessThanOrEqual(sheet.height - sheet.margin + 1e-6)
      }
    }
    for (let i = 0; i < s.parts.length; i++) {
      for (let j = i + 1; j < s.parts.length; j++) {
        const a = s.parts[i]!.outline
        const b = s.parts[j]!.outline
        expect(overlapArea(a, b)).toBe(0)
        expect(gap(a, b, sheet.kerf)).toBeGreaterThanOrEqual(sheet.kerf - 0.01)
      }
    }
  }
}

/** Every better layout the search reports, in order, and its last word. */
function run(parts: Parts, sheet: Sheet, options: Parameters<typeof improveSteps>[2]) {
  const reported: ImprovedLayout[] = []
  const progress: number[] = []
  const steps = improveSteps(parts, sheet, options)
  for (;;) {
    const r = steps.next()
    if (r.done) return { reported, progress, best: r.value }
    progress.push(r.value.progress)
    if (r.value.better) reported.push(r.value.better)
  }
}

// A hand case (sketched on paper): a strip 105 wide, one 20 x 90 part A and four 80 x 20 parts B, no kerf.
// Optimum 90: A stands at one side and the four B lie stacked beside it (20 + 80 = 100 <= 105).
// Nothing shorter: A standing is 90 long by itself; A lying (90 wide) leaves 15 beside it, narrower than a B's
// 20, so every B lies above A's 20 band, and four B in 105 need 80 more (no two lying B share a height,
// 160 > 105; a standing B is 80 long): 100. Largest first puts A down first, lying (its top edge 20 is lower
// than 90), and so ends at 100.
const HAND_PARTS: Parts = [
  { outline: rect(20, 90), count: 1 },
  { outline: rect(80, 20), count: 4 },
]

describe('improveNesting', () => {
  it('finds the hand optimum (90) where largest first gives 100, on a strip and as one sheet instead of two', () => {
    const strip = { width: 105, height: 1000, margin: 0, kerf: 0 }
    const first = nestParts(HAND_PARTS, strip)
    // 0.2: the nester's own clearance between parts and inside the edge.
    expect(scoreOf(first)[1]).toBeGreaterThan(100 - 1e-9)
    expect(scoreOf(first)[1]).toBeLessThan(100 + 0.2)
    const { reported, best } = run(HAND_PARTS, strip, { layouts: 60, seed: 5 })
    expectSound(HAND_PARTS, strip, best.result)
    expect(scoreOf(best.result)[0]).toBe(1)
    expect(scoreOf(best.result)[1]).toBeGreaterThanOrEqual(90)
    expect(scoreOf(best.result)[1]).toBeLessThan(90 + 0.2)
    // The first report is the largest-first layout, at once.
    expect(scoreOf(reported[0]!.result)).toEqual(scoreOf(first))

    // On a 105 x 95 sheet largest first needs two sheets (100 > 95); the search one.
    const sheet = { width: 105, height: 95, margin: 0, kerf: 0 }
    expect(nestParts(HAND_PARTS, sheet).sheets.length).toBe(2)
    const one = improveNesting(HAND_PARTS, sheet, { layouts: 60, seed: 5 })
    expect(one.result.sheets.length).toBe(1)
    expectSound(HAND_PARTS, sheet, one.result)
  })

  it('reports only ever better layouts, each sound, the best never worse than the first (plates with kerf and margin)', () => {
    // Three sizes of the river stone preset (10.5, 12.5, 14.5 in tubes), three of each, on a 48 x 48 in sheet
    // with 1/2 in margin and 1/4 in kerf (1 in = 25.4 mm, NIST SP 811): more than one sheet.
    const base = presetParams('river-stone')!
    const parts = [10.5, 12.5, 14.5].map((d) => ({ outline: buildPlate(deriveForTube(base, inchesToMm(d))).outline as Pt[], count: 3 }))
    const sheet = { width: inchesToMm(48), height: inchesToMm(48), margin: inchesToMm(0.5), kerf: inchesToMm(0.25) }
    const first = nestParts(parts, sheet)
    const { reported, progress, best } = run(parts, sheet, { layouts: 10, seed: 11 })
    expect(reported.length).toBeGreaterThanOrEqual(1)
    expect(scoreOf(reported[0]!.result)).toEqual(scoreOf(first))
    for (let k = 1; k < reported.length; k++) {
      const [a, b] = [scoreOf(reported[k]!.result), scoreOf(reported[k - 1]!.result)]
      expect(noWorse(a, b) && (a[0] < b[0] || a[1] < b[1])).toBe(true)
    }
    for (const l of reported) expectSound(parts, sheet, l.result)
    expect(scoreOf(best.result)).toEqual(scoreOf(reported[reported.length - 1]!.result))
    expect(noWorse(scoreOf(best.result), scoreOf(first))).toBe(true)
    // Progress: a fraction that never goes back and reaches the whole budget.
    for (let k = 1; k < progress.length; k++) expect(progress[k]!).toBeGreaterThanOrEqual(progress[k - 1]!)
    expect(progress[0]!).toBeGreaterThanOrEqual(0)
    expect(progress[progress.length - 1]!).toBeLessThanOrEqual(1)
    expect(progress[progress.length - 1]!).toBeGreaterThan(0.9)
  })

  it('gives the same layouts for the same seed', () => {
    // Irregular parts of our own: a notched plate, a wedge and a rhombus, on a strip 300 wide.
    const parts: Parts = [
      { outline: [[0, 0], [120, 0], [120, 50], [70, 50], [70, 90], [0, 90]], count: 3 },
      { outline: [[0, 0], [110, 0], [0, 60]], count: 4 },
      { outline: [[0, 0], [60, 20], [90, 80], [30, 60]], count: 3 },
    ]
    const strip = { width: 300, height: 2000, margin: 5, kerf: 2 }
    const a = run(parts, strip, { layouts: 30, seed: 42 })
    const b = run(parts, strip, { layouts: 30, seed: 42 })
    expect(b.reported.map((l) => l.result)).toEqual(a.reported.map((l) => l.result))
    expect(b.best.result).toEqual(a.best.result)
    for (const l of a.reported) expectSound(parts, strip, l.result)
    expect(noWorse(scoreOf(a.best.result), scoreOf(nestParts(parts, strip)))).toBe(true)
  })

  it('stops within a time budget (a given clock) and can be stopped by its caller, the first layout reported either way', () => {
    let t = 0
    // Each reading of the clock moves it on 1 ms: a 40 ms budget ends after a few dozen steps.
    const { reported, best } = run(HAND_PARTS, { width: 105, height: 1000, margin: 0, kerf: 0 }, { timeBudget: 40, now: () => t++ })
    expect(reported.length).toBeGreaterThanOrEqual(1)
    expect(t).toBeLessThan(2000)
    expect(best.result.sheets.length).toBe(1)
    // Stopped by the caller after the first report: nothing more runs.
    const steps = improveSteps(HAND_PARTS, { width: 105, height: 1000, margin: 0, kerf: 0 }, { layouts: 1000 })
    let r = steps.next()
    while (!r.done && !r.value.better) r = steps.next()
    expect(r.done).toBe(false)
    expect(steps.return(undefined as never).done).toBe(true)
    expect(steps.next().done).toBe(true)
  })
})

describe('nestSteps order', () => {
  it('places in the order given, fixes a turn where asked, and replays a layout from its steps', () => {
    const strip = { width: 105, height: 1000, margin: 0, kerf: 0 }
    // The four B first, held lying (turn 0), then A held upright (turn 0): A stands beside them (hand case above): 90.
    const order = [{ part: 1, turn: 0 }, { part: 1, turn: 0 }, { part: 1, turn: 0 }, { part: 1, turn: 0 }, { part: 0, turn: 0 }]
    const nesting = nestWithState(HAND_PARTS, strip, { order })
    expect(nesting.steps.map((s) => s.part)).toEqual([1, 1, 1, 1, 0])
    expect(nesting.steps.map((s) => s.turn)).toEqual([0, 0, 0, 0, 0])
    expectSound(HAND_PARTS, strip, nesting.result)
    // Read from the outlines: the hand optimum, plus the nester's clearance.
    expect(scoreOf(nesting.result)[1]).toBeGreaterThanOrEqual(90)
    expect(scoreOf(nesting.result)[1]).toBeLessThan(90 + 0.2)
    // Free turns instead: no layout can beat the hand optimum, 90 (with no slack between parts, lying on the
    // other three and standing beside them tie at 80, so the free order may reach it too).
    const free = nestParts(HAND_PARTS, strip, { order: order.map((s) => ({ part: s.part })) })
    expectSound(HAND_PARTS, strip, free)
    expect(scoreOf(free)[1]).toBeGreaterThanOrEqual(90 - 1e-6)
    // Replayed from its steps, unsearched: the same layout.
    expect(nestParts(HAND_PARTS, strip, { order: nesting.steps }).sheets).toEqual(nesting.result.sheets)
    // A step's position is taken as given: A (standing, turn 0) moved 3 right and 5 up, into the free room beside
    // the four B, lands exactly there.
    const [ax, ay] = nesting.steps[4]!.at!
    const moved = nestParts(HAND_PARTS, strip, { order: nesting.steps.map((s, k) => (k === 4 ? { ...s, at: [ax + 3, ay + 5] as Pt } : s)) })
    const a = moved.sheets[0]!.parts.find((p) => p.part === 0)!
    expect(a.outline).toEqual(rect(20, 90).map(([x, y]) => [x + ax + 3, y + ay + 5]))
  })

  it('refuses an order that does not place every copy once or turns a part the wrong way', () => {
    const strip = { width: 105, height: 1000, margin: 0, kerf: 0 }
    expect(() => nestParts(HAND_PARTS, strip, { order: [{ part: 0 }, { part: 1 }] })).toThrow(RangeError)
    expect(() => nestParts(HAND_PARTS, strip, { order: [{ part: 2 }, { part: 1 }, { part: 1 }, { part: 1 }, { part: 1 }] })).toThrow(RangeError)
    expect(() => nestParts(HAND_PARTS, strip, { order: [{ part: 0, turn: 45 }, { part: 1 }, { part: 1 }, { part: 1 }, { part: 1 }] })).toThrow(RangeError)
  })
})

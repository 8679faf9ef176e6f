// nestParts (CONTRACTS.md) checked from outside: placed parts never overlap or
// come closer than the kerf, stay inside the margin, keep their shape (area,
// perimeter, every point-to-point distance, winding: turned and moved, never
// mirrored or scaled), and use no fewer sheets than the area bound nor more
// than the bounding-rectangle peer (REFERENCES.md, "added for the second round").
import { describe, expect, it } from 'vitest'
import { buildPlate, deriveForTube, presetParams, inchesToMm, plateParamsSchema } from '../../../geometry'
import { sheetFindings } from '../../../geometry/checks/cutting'
import { nestParts, PartTooLargeError } from '../../../geometry/nest'
import { areaLowerBound, gap, overlapArea, peerSheets, perimeterOf, shoelace, type Pt } from './checks'

// 1 in = 25.4 mm exactly (NIST SP 811); a 48 x 96 in panel (PS 1-19).
const SHEET = { width: inchesToMm(48), height: inchesToMm(96), margin: inchesToMm(0.5), kerf: inchesToMm(0.25) }

/** Three sizes of one shape: the river stone preset on 10, 12 and 14 in tubes (measured outside). */
function threeSizes(): Pt[][] {
  const base = presetParams('river-stone')!
  return [10.5, 12.5, 14.5].map((d) => buildPlate(deriveForTube(base, inchesToMm(d))).outline as Pt[])
}

/** The polygon engine's rounding, mm (it works to the micrometre). */
const ROUND = 1e-3

function checkNesting(parts: { outline: Pt[]; count: number }[], sheet: typeof SHEET, sheets: { parts: { part: number; outline: Pt[] }[] }[]) {
  // Every copy placed once.
  const placed = parts.map(() => 0)
  for (const s of sheets) for (const p of s.parts) placed[p.part]!++
  expect(placed).toEqual(parts.map((p) => p.count))
  for (const s of sheets) {
    for (const p of s.parts) {
      const src = parts[p.part]!.outline
      expect(p.outline.length).toBe(src.length)
      // Congruent: the same signed area (so not mirrored), perimeter and distances between points.
      expect(shoelace(p.outline)).toBeCloseTo(shoelace(src), 3)
      expect(perimeterOf(p.outline)).toBeCloseTo(perimeterOf(src), 6)
      for (const k of [1, Math.floor(src.length / 3), Math.floor((2 * src.length) / 3)]) {
        const d0 = Math.hypot(src[k]![0] - src[0]![0], src[k]![1] - src[0]![1])
        const d1 = Math.hypot(p.outline[k]![0] - p.outline[0]![0], p.outline[k]![1] - p.outline[0]![1])
        expect(d1).toBeCloseTo(d0, 6)
      }
      // Inside the margin (the polygon engine works to the micrometre: ROUND).
      for (const [x, y] of p.outline) {
        expect(x).toBeGreaterThanOrEqual(sheet.margin - ROUND)
        expect(y).toBeGreaterThanOrEqual(sheet.margin - ROUND)
        expect(x).toBeLessThanOrEqual(sheet.width - sheet.margin + ROUND)
        expect(y).toBeLessThanOrEqual(sheet.height - sheet.margin + ROUND)
      }
    }
    // No two parts overlap (polygon-clipping) or come closer than the kerf (a few micrometres for rounding).
    for (let i = 0; i < s.parts.length; i++) {
      for (let j = i + 1; j < s.parts.length; j++) {
        const a = s.parts[i]!.outline
        const b = s.parts[j]!.outline
        expect(overlapArea(a, b)).toBe(0)
        expect(gap(a, b, sheet.kerf)).toBeGreaterThanOrEqual(sheet.kerf - 5 * ROUND)
      }
    }
  }
}

describe('nestParts', () => {
  it('places a small, a medium and a large plate, two of each and two layers each, without touching or leaving the margin', () => {
    const parts = threeSizes().map((outline) => ({ outline, count: 4 }))
    const { sheets } = nestParts(parts, SHEET)
    checkNesting(parts, SHEET, sheets)
    const areas = parts.flatMap((p) => Array(p.count).fill(Math.abs(shoelace(p.outline))) as number[])
    // Area bound (REFERENCES.md: ceil(total part area / usable sheet area)) and the peer.
    expect(sheets.length).toBeGreaterThanOrEqual(areaLowerBound(areas, SHEET))
    expect(sheets.length).toBeLessThanOrEqual(peerSheets(parts, SHEET))
  })

  it('packs eight 100 mm squares on a sheet with room for exactly eight (hand count: 4 x 2 in 402 x 202 mm)', () => {
    const square: Pt[] = [[0, 0], [100, 0], [100, 100], [0, 100]]
    const sheet = { width: 422, height: 222, margin: 10, kerf: 0 }
    const { sheets } = nestParts([{ outline: square, count: 8 }], sheet)
    expect(sheets.length).toBe(1)
    checkNesting([{ outline: square, count: 8 }], sheet, sheets)
    // A ninth needs a second sheet.
    expect(nestParts([{ outline: square, count: 9 }], sheet).sheets.length).toBe(2)
  })

  it('nests an L into the notch of another where bounding rectangles cannot (real shapes, not boxes)', () => {
    // Two L shapes 200 x 200 with a 100 x 100 notch: turned 180 degrees they interlock into
    // 200 x 300 (hand sketch); their bounding boxes need 200 x 400.
    const ell: Pt[] = [[0, 0], [200, 0], [200, 100], [100, 100], [100, 200], [0, 200]]
    const sheet = { width: 224, height: 334, margin: 10, kerf: 2 }
    const parts = [{ outline: ell, count: 2 }]
    const { sheets } = nestParts(parts, sheet)
    expect(sheets.length).toBe(1)
    checkNesting(parts, sheet, sheets)
    expect(peerSheets(parts, sheet)).toBe(2)
  })

  it('keeps the grain: only half turns, never quarter turns, when asked', () => {
    const bar: Pt[] = [[0, 0], [300, 0], [300, 40], [0, 40]]
    const sheet = { width: 400, height: 400, margin: 5, kerf: 3 }
    const { sheets } = nestParts([{ outline: bar, count: 6 }], sheet, { grain: true })
    for (const p of sheets.flatMap((s) => s.parts)) {
      // The first edge keeps its direction along x (0 or 180 degrees).
      const dx = p.outline[1]![0] - p.outline[0]![0]
      const dy = p.outline[1]![1] - p.outline[0]![1]
      expect(Math.abs(dy)).toBeLessThan(1e-9)
      expect(Math.abs(dx)).toBeCloseTo(300, 9)
    }
  })

  it('keeps a clockwise outline clockwise (never mirrored)', () => {
    const cw: Pt[] = [[0, 0], [0, 150], [80, 150], [120, 60], [200, 0]]
    const { sheets } = nestParts([{ outline: cw, count: 5 }], SHEET)
    for (const p of sheets.flatMap((s) => s.parts)) expect(shoelace(p.outline)).toBeCloseTo(shoelace(cw), 6)
  })

  it('refuses a plate larger than the sheet inside its margin, naming the sizes', () => {
    const big: Pt[] = [[0, 0], [1300, 0], [1300, 1300], [0, 1300]]
    expect(() => nestParts([{ outline: big, count: 1 }], SHEET)).toThrow(PartTooLargeError)
    expect(() => nestParts([{ outline: big, count: 1 }], SHEET)).toThrow(/1300\.0 x 1300\.0 mm.*1193\.8 x 2413\.0 mm/)
  })

  it('answers no sheets for no parts, and rejects nonsense input', () => {
    expect(nestParts([], SHEET).sheets).toEqual([])
    expect(() => nestParts([{ outline: [[0, 0], [1, 1]], count: 1 }], SHEET)).toThrow(RangeError)
    expect(() => nestParts([{ outline: [[0, 0], [1, 0], [0, 1]], count: -1 }], SHEET)).toThrow(RangeError)
    expect(() => nestParts([], { ...SHEET, margin: 700 })).toThrow(RangeError)
  })
})

/** A regular polygon of n points round a circle of diameter d (its corners on the circle), by hand. */
function disc(d: number, n = 720): Pt[] {
  return Array.from({ length: n }, (_, k) => [(d / 2) * Math.cos((2 * Math.PI * k) / n), (d / 2) * Math.sin((2 * Math.PI * k) / n)] as Pt)
}

function rect(w: number, h: number): Pt[] {
  return [[0, 0], [w, 0], [w, h], [0, h]]
}

/** The plate's sheet check on an outline, with the sheet figures in inches; the enclosing radius by hand (passed in). */
function sheetCheck(outline: Pt[], enclosingRadius: number, sheet: { width: number; length: number; margin: number; kerf: number }) {
  const params = plateParamsSchema.parse({
    cutting: { sheetWidth: inchesToMm(sheet.width), sheetLength: inchesToMm(sheet.length), edgeMargin: inchesToMm(sheet.margin), kerf: inchesToMm(sheet.kerf) },
  })
  return sheetFindings(params, outline, enclosingRadius).map((f) => f.code)
}

describe('one rule for margin and kerf: the sheet check and the nester agree, with no hidden slack', () => {
  // The sheet inside its 1/2 in margins: 48 - 1 = 47 in = 1193.8 mm across (1 in = 25.4 mm, NIST SP 811).
  // The kerf is kept between parts only, so a disc from 1187.45 mm (47 in less a 1/4 in kerf) up to 1193.8 mm
  // fits whole: the old kerf term refused exactly this band.
  it.each([1188, 1190, 1193.7])('places a round plate %d mm across whole on a 48 x 96 in sheet, and the sheet check agrees', (d) => {
    const outline = disc(d)
    expect(sheetCheck(outline, d / 2, { width: 48, length: 96, margin: 0.5, kerf: 0.25 })).not.toContain('larger-than-sheet')
    const parts = [{ outline, count: 1 }]
    const { sheets } = nestParts(parts, SHEET)
    expect(sheets).toHaveLength(1)
    checkNesting(parts, SHEET, sheets)
  })

  it('refuses a round plate 1195 mm across in both places (more than the 1193.8 mm inside the margins)', () => {
    const outline = disc(1195)
    expect(sheetCheck(outline, 1195 / 2, { width: 48, length: 96, margin: 0.5, kerf: 0.25 })).toContain('larger-than-sheet')
    expect(() => nestParts([{ outline, count: 1 }], SHEET)).toThrow(PartTooLargeError)
  })

  it('agrees on a real plate: a plain disc plate 1190 mm across', () => {
    // Radius = tube radius + valley when there are no lobes and no wobble: 1100 / 2 + 45 = 595 mm.
    const plate = buildPlate(plateParamsSchema.parse({ tubeDiameter: 1100, lobes: { count: 0, irregularity: 0, valley: 45 }, casterOffset: 400, access: { enabled: false } }))
    expect(plate.metrics.width).toBeCloseTo(1190, 0)
    expect(plate.findings.map((f) => f.code)).not.toContain('larger-than-sheet')
    expect(nestParts([{ outline: plate.outline as Pt[], count: 1 }], SHEET).sheets).toHaveLength(1)
  })

  it('fits a 47 x 94 in plate on a 48 x 96 in sheet with a 1/2 in margin (exactly the room inside the margin)', () => {
    const outline = rect(inchesToMm(47), inchesToMm(94))
    // Half the diagonal by Pythagoras.
    expect(sheetCheck(outline, inchesToMm(Math.hypot(47, 94) / 2), { width: 48, length: 96, margin: 0.5, kerf: 0.25 })).toEqual([])
    const parts = [{ outline, count: 1 }]
    const { sheets } = nestParts(parts, SHEET)
    expect(sheets).toHaveLength(1)
    checkNesting(parts, SHEET, sheets)
    // An inch wider fits neither.
    const wide = rect(inchesToMm(47.1), inchesToMm(94))
    expect(sheetCheck(wide, inchesToMm(Math.hypot(47.1, 94) / 2), { width: 48, length: 96, margin: 0.5, kerf: 0.25 })).toContain('larger-than-sheet')
    expect(() => nestParts([{ outline: wide, count: 1 }], SHEET)).toThrow(PartTooLargeError)
  })

  it('puts two 23-3/8 x 40 in plates on one 48 x 48 in sheet with 1/2 in margin and 1/4 in kerf (2 x 23.375 + 0.25 = 47 in)', () => {
    const sheet = { width: inchesToMm(48), height: inchesToMm(48), margin: inchesToMm(0.5), kerf: inchesToMm(0.25) }
    const parts = [{ outline: rect(inchesToMm(23.375), inchesToMm(40)), count: 2 }]
    const { sheets } = nestParts(parts, sheet)
    expect(sheets).toHaveLength(1)
    checkNesting(parts, sheet, sheets)
    // A hair wider and the two no longer fit side by side (40 + 40 > 47 the other way): two sheets.
    expect(nestParts([{ outline: rect(inchesToMm(23.4), inchesToMm(40)), count: 2 }], sheet).sheets).toHaveLength(2)
  })

  it('places a long bar that fits a square sheet only on its diagonal, as the sheet check says it fits', () => {
    // 48 x 48 in sheet, 1/2 in margin: 1193.8 mm square inside; its diagonal is 1688 mm. A 1500 x 60 mm bar
    // turned 45 degrees needs (1500 + 60) / sqrt 2 = 1103 mm each way (hand calculation): it fits.
    const sheet = { width: inchesToMm(48), height: inchesToMm(48), margin: inchesToMm(0.5), kerf: inchesToMm(0.25) }
    const outline = rect(1500, 60)
    expect(sheetCheck(outline, Math.hypot(1500, 60) / 2, { width: 48, length: 48, margin: 0.5, kerf: 0.25 })).toEqual([])
    const parts = [{ outline, count: 1 }]
    const { sheets } = nestParts(parts, sheet, { turns: [0, 90] })
    expect(sheets).toHaveLength(1)
    checkNesting(parts, sheet, sheets)
  })
})


import { describe, expect, it } from 'vitest'
import type { Point } from '../../../geometry/types'
import {
  MAX_PAGE_LENGTH,
  PAPERS,
  plateToPage,
  polygonTouchesRect,
  registrationPoints,
  rowLabel,
  tileContent,
  tilePlate,
} from '../../../geometry/export/tiling'
import { fixturePlate } from './fixture'

const PT_PER_MM = 72 / 25.4 // ISO 32000-1, 8.3.2.3: 72 units per inch; 25.4 mm per inch (NIST SP 811)

describe('paper sizes', () => {
  it('match the standards in millimetres', () => {
    // ASME Y14.1: Letter 8.5 x 11 in, Tabloid 11 x 17 in; Legal 8.5 x 14 in (common practice)
    expect(PAPERS.letter.width).toBeCloseTo(215.9, 6)
    expect(PAPERS.letter.height).toBeCloseTo(279.4, 6)
    expect(PAPERS.tabloid.width).toBeCloseTo(279.4, 6)
    expect(PAPERS.tabloid.height).toBeCloseTo(431.8, 6)
    expect(PAPERS.legal.height).toBeCloseTo(355.6, 6)
    // ISO 216: A4 210 x 297, A3 297 x 420
    expect([PAPERS.a4.width, PAPERS.a4.height]).toEqual([210, 297])
    expect([PAPERS.a3.width, PAPERS.a3.height]).toEqual([297, 420])
    // ISO 32000-1 Annex C: 14,400 units = 200 in
    expect(MAX_PAGE_LENGTH * PT_PER_MM).toBeCloseTo(14400, 6)
  })
})

describe('sheet count of a circular plate, computed by hand', () => {
  // A 1200 mm circle, 4 mm clear round it: 1208 mm square of content.
  // Letter portrait, margin 6.35, overlap 12.7: printable 203.2 x 266.7, step 190.5 x 254.
  // cols = ceil((1208 - 12.7) / 190.5) = ceil(6.27) = 7; rows = ceil(1195.3 / 254) = ceil(4.71) = 5: 35 cells.
  // Grid 1346.2 x 1282.7 centred: column 1 spans x -673.1..-469.9, row A spans y 374.65..641.35.
  // Corner A1's nearest point to the centre is (-469.9, 374.65), 600.97 mm away: outside the circle,
  // so the four corners are empty: 31 printed. Landscape is the same grid turned: 31, so portrait stays.
  const plate = fixturePlate({ radius: 600, amplitude: 0 })

  it('is 7 x 5 with the four corners left out', () => {
    const t = tilePlate(plate, { paper: 'letter' })
    expect(t.orientation).toBe('portrait')
    expect([t.cols, t.rows]).toEqual([7, 5])
    expect(t.printed).toBe(31)
    const empty = t.sheets.filter((s) => s.empty).map((s) => s.label)
    expect(empty.sort()).toEqual(['R1-C1', 'R1-C7', 'R5-C1', 'R5-C7'])
    expect(t.grid.minX).toBeCloseTo(-673.1, 6)
    expect(t.grid.maxY).toBeCloseTo(641.35, 6)
  })

  it('names sheets by row from the top and column from the left (R2-C3), never like a paper size', () => {
    const t = tilePlate(plate, { paper: 'letter' })
    const b2 = t.sheets.find((s) => s.label === 'R2-C2')!
    const a2 = t.sheets.find((s) => s.label === 'R1-C2')!
    expect(b2.window.maxY).toBeLessThan(a2.window.maxY)
    expect(b2.neighbours).toEqual({ above: 'R1-C2', below: 'R3-C2', left: 'R2-C1', right: 'R2-C3' })
    // A left-out neighbour is not named.
    expect(a2.neighbours.left).toBeNull()
    // ISO 216 and ASME Y14.1 paper names (A4, A3, B5 ...) are a letter and a digit: no sheet name may look like one.
    for (const s of t.sheets) expect(s.label).not.toMatch(/^[A-E]\d+$/)
    expect(rowLabel(25)).toBe('Z')
    expect(rowLabel(26)).toBe('AA')
  })

  it('puts the same plate point in the overlap of two neighbours, one step apart on the pages', () => {
    const t = tilePlate(plate, { paper: 'letter' })
    const a2 = t.sheets.find((s) => s.label === 'R1-C2')!
    const a3 = t.sheets.find((s) => s.label === 'R1-C3')!
    // The overlap between columns 2 and 3 is x -292.1..-279.4 (12.7 mm, the default overlap).
    expect(a2.window.maxX - a3.window.minX).toBeCloseTo(12.7, 9)
    const p: Point = [-285.75, 500]
    const onA2 = plateToPage(t, a2, p)
    const onA3 = plateToPage(t, a3, p)
    // A2: 6.35 mm margin + 196.85 mm into the window = 203.2 mm = 576 pt; A3: 6.35 + 6.35 = 12.7 mm = 36 pt.
    expect(onA2[0]).toBeCloseTo(576, 6)
    expect(onA3[0]).toBeCloseTo(36, 6)
    expect(onA2[1]).toBeCloseTo(onA3[1], 9)
    expect(onA2[0] - onA3[0]).toBeCloseTo(190.5 * PT_PER_MM, 6)
  })

  it('places registration crosses only where printed sheets share a strip', () => {
    const t = tilePlate(plate, { paper: 'letter' })
    const crosses = registrationPoints(t)
    expect(crosses.length).toBeGreaterThan(0)
    for (const [x, y] of crosses) {
      const holders = t.sheets.filter((s) => !s.empty && x >= s.window.minX && x <= s.window.maxX && y >= s.window.minY && y <= s.window.maxY)
      expect(holders.length).toBeGreaterThanOrEqual(2)
    }
  })
})

describe('orientation and options', () => {
  it('chooses landscape when it prints fewer sheets', () => {
    // A 500 x 190 mm strip (content 508 x 198): portrait needs 3 x 1 = 3 sheets
    // (ceil(495.3 / 190.5) = 3, 198 < 266.7); landscape needs 2 x 1 (ceil(495.3 / 254) = 2, 198 < 203.2).
    const rect: Point[] = [
      [0, 0],
      [500, 0],
      [500, 190],
      [0, 190],
    ]
    const content = { bounds: { minX: -4, minY: -4, maxX: 504, maxY: 194 }, polygons: [rect] }
    expect(tileContent(content, { paper: 'letter', orientation: 'portrait' }).printed).toBe(3)
    const auto = tileContent(content, { paper: 'letter' })
    expect(auto.orientation).toBe('landscape')
    expect(auto.printed).toBe(2)
  })

  it('honours margin and overlap', () => {
    const plate = fixturePlate({ radius: 300, amplitude: 0 })
    const t = tilePlate(plate, { paper: 'a4', orientation: 'portrait', margin: 10, overlap: 20 })
    expect(t.printableWidth).toBeCloseTo(190, 9)
    expect(t.stepX).toBeCloseTo(170, 9)
    const [s0, s1] = t.sheets
    expect(s1!.window.minX - s0!.window.minX).toBeCloseTo(170, 9)
  })

  it('rejects unknown paper and impossible margins', () => {
    const plate = fixturePlate({ radius: 300, amplitude: 0 })
    expect(() => tilePlate(plate, { paper: 'folio' as never })).toThrow(/Unknown paper/)
    expect(() => tilePlate(plate, { paper: 'letter', margin: 100 })).toThrow(/too little/)
    expect(() => tilePlate(plate, { paper: 'letter', overlap: -1 })).toThrow(/overlap/)
  })

  it('cuts roll sheets to the plate, never past the 200 in page limit (ISO 32000-1 Annex C)', () => {
    const plate = fixturePlate({ radius: 762, amplitude: 0 }) // 60 in across
    const t = tilePlate(plate, { paper: 'roll-24in', orientation: 'portrait' })
    expect(t.pageWidth).toBeCloseTo(609.6, 6)
    // 1532 mm of content across a 596.9 mm printable width, 584.2 mm step: 3 columns, one row.
    expect([t.cols, t.rows]).toEqual([3, 1])
    expect(t.pageHeight).toBeGreaterThanOrEqual(1532 + 2 * 6.35)
    expect(t.pageHeight).toBeLessThan(1532 + 2 * 6.35 + 1)

    const tall: Point[] = [
      [0, 0],
      [500, 0],
      [500, 6000],
      [0, 6000],
    ]
    const long = tileContent({ bounds: { minX: 0, minY: 0, maxX: 500, maxY: 6000 }, polygons: [tall] }, { paper: 'roll-36in', orientation: 'portrait' })
    expect(long.rows).toBe(2)
    expect(long.pageHeight * PT_PER_MM).toBeLessThanOrEqual(14400 + 1e-6)
    expect(long.rows * long.stepY + long.overlap).toBeGreaterThanOrEqual(6000)
  })
})

describe('polygonTouchesRect', () => {
  const square: Point[] = [
    [0, 0],
    [100, 0],
    [100, 100],
    [0, 100],
  ]
  it('sees a rectangle inside, across an edge, or outside', () => {
    expect(polygonTouchesRect(square, { minX: 40, minY: 40, maxX: 60, maxY: 60 })).toBe(true)
    expect(polygonTouchesRect(square, { minX: 90, minY: 40, maxX: 160, maxY: 60 })).toBe(true)
    expect(polygonTouchesRect(square, { minX: -50, minY: -50, maxX: 150, maxY: 150 })).toBe(true)
    expect(polygonTouchesRect(square, { minX: 101, minY: 0, maxX: 160, maxY: 60 })).toBe(false)
  })
})

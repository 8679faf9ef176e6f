// planSheets and its files, checked from outside: layer counts, sheets and
// glue against hand arithmetic, areas by the shoelace formula, the DXF read
// back with dxf-parser against the plate's own cut file, the PDF with pdf-lib.
import { describe, expect, it } from 'vitest'
import DxfParser from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import polygonClipping from 'polygon-clipping'
import { buildPlate, deriveForTube, inchesToMm, plateParamsSchema, presetParams, renderCutDxf } from '../../../geometry'
import { planSheets, planSheetsAsync, renderLayoutDxf, renderLayoutPdf, type PlanEntry } from '../../../geometry/nest'
import { gap, shoelace, type Pt } from './checks'

// 48 x 96 in (PS 1-19); 1 in = 25.4 mm (NIST SP 811).
const SHEET = { width: inchesToMm(48), height: inchesToMm(96), margin: inchesToMm(0.5), kerf: inchesToMm(0.25), thickness: inchesToMm(0.703) }

function column(layers: number, count: number, tubeInches = 12.5): PlanEntry {
  const params = plateParamsSchema.parse({ ...presetParams('plain-column'), layers })
  return { name: 'Column', size: `${tubeInches} in`, plate: buildPlate(deriveForTube(params, inchesToMm(tubeInches))), count }
}

/** Net face area by hand: the outline's shoelace area less each through-hole's pi d^2 / 4 (they do not overlap on this plate). */
function netArea(e: PlanEntry): number {
  return Math.abs(shoelace(e.plate.outline as Pt[])) - e.plate.holes.reduce((s, h) => s + (Math.PI * h.diameter ** 2) / 4, 0)
}

type Circle = { layer: string; x: number; y: number; r: number }

/** The CIRCLE entities of a DXF read back by dxf-parser, layer, centre and radius. */
function circlesIn(d: any): Circle[] {
  return d.entities.filter((x: any) => x.type === 'CIRCLE').map((c: any) => ({ layer: c.layer, x: c.center.x, y: c.center.y, r: c.radius }))
}

/** A plate-file point turned `deg` counter-clockwise about the plate's origin, then moved by `at` (mm), in inches: by hand. */
function placed(x: number, y: number, deg: number, at: [number, number]): [number, number] {
  const t = (deg * Math.PI) / 180
  return [x * Math.cos(t) - y * Math.sin(t) + at[0] / 25.4, x * Math.sin(t) + y * Math.cos(t) + at[1] / 25.4]
}

describe('the sheet DXF carries every hole of every placed plate', () => {
  it.each(['routed', 'hole-saw'] as const)('%s: every circle of each part\'s own cut file, turned and moved, on the same layer; nothing else', (openings) => {
    const e = column(2, 3)
    const plan = planSheets([e], { sheet: SHEET, workflow: 'layers' })
    const parser = new DxfParser()
    for (let index = 0; index < plan.layouts.length; index++) {
      const sheet = parser.parseSync(renderLayoutDxf(plan, [e], index, { units: 'in', openings }))!
      const got = circlesIn(sheet)
      const expected: Circle[] = []
      for (const part of plan.layouts[index]!.parts) {
        const own = parser.parseSync(renderCutDxf(e.plate, { units: 'in', layer: part.layer, includeReference: false, openings }))!
        for (const c of circlesIn(own)) {
          const [x, y] = placed(c.x, c.y, part.turn, part.at as [number, number])
          expected.push({ layer: c.layer, x, y, r: c.r })
        }
      }
      // Each expected circle found once (1e-6 in), and no circle beyond them.
      const left = [...got]
      for (const c of expected) {
        const k = left.findIndex((g) => g.layer === c.layer && Math.hypot(g.x - c.x, g.y - c.y) < 1e-6 && Math.abs(g.r - c.r) < 1e-9)
        expect(k, `${c.layer} circle at ${c.x.toFixed(3)}, ${c.y.toFixed(3)}`).toBeGreaterThanOrEqual(0)
        left.splice(k, 1)
      }
      expect(left).toEqual([])
      // By hand: each column plate has 3 pockets and 3 access openings (preset), 1 centre and 2 index holes.
      const parts = plan.layouts[index]!.parts.length
      const pocketsAndOpenings = e.plate.holes.filter((h) => h.kind === 'pocket' || h.kind === 'access').length
      expect(pocketsAndOpenings).toBe(6)
      if (openings === 'routed') expect(got.filter((c) => c.layer === 'RP-INSIDE-CUT')).toHaveLength(parts * 6)
      else {
        expect(got.filter((c) => c.layer.startsWith('RP-HOLESAW-'))).toHaveLength(parts * 6)
        // Pilots and drilled holes: 6 pilots + 1 centre + 2 index per part.
        expect(got.filter((c) => c.layer === 'RP-DRILL')).toHaveLength(parts * 9)
      }
      // Rabbets on the top layers only, on a layer named with the depth (3/8 in).
      const tops = plan.layouts[index]!.parts.filter((p) => p.layer === 'top').length
      expect(got.filter((c) => c.layer === 'RP-RABBET-0.375IN')).toHaveLength(tops * 3)
      // The notes name every part and every hole kind.
      const notes = sheet.entities.filter((x: any) => x.layer === 'RP-NOTES' && x.type === 'TEXT').map((x: any) => x.text as string).join('\n')
      expect(notes).toMatch(new RegExp(`Sheet ${index + 1} of ${plan.layouts.length}`))
      for (let k = 1; k <= parts; k++) expect(notes).toContain(`Part ${k}: Column`)
      expect(notes).toMatch(/3 pockets/)
      expect(notes).toMatch(/3 access openings/)
      expect(notes).toMatch(/Hole saws: /)
      // No text on a cut layer.
      expect(sheet.entities.some((x: any) => x.layer !== 'RP-NOTES' && ['TEXT', 'MTEXT'].includes(x.type))).toBe(false)
    }
  })
})

describe('planSheets', () => {
  it('cut first: a three-layer plate is a top and two lower parts; glue on two faces of each plate', () => {
    const e = column(3, 2)
    const plan = planSheets([e], { sheet: SHEET, workflow: 'layers' })
    const parts = plan.layouts.flatMap((l) => l.parts)
    expect(parts.map((p) => `${p.layer}${p.layerNumber}`).sort()).toEqual(['bottom2', 'bottom2', 'bottom3', 'bottom3', 'top1', 'top1'])
    expect(plan.panels).toBe(0)
    expect(plan.sheetsToBuy).toBe(plan.layouts.length)
    expect(plan.glue.area).toBeCloseTo(2 * 2 * netArea(e), -1)
    // The hand net area agrees with polygon-clipping's difference of the outline less each hole (as a 720-gon, area pi r^2 sin(2 pi / 720) / (2 pi / 720)).
    const ring = (x: number, y: number, r: number): Pt[] => Array.from({ length: 720 }, (_, k) => [x + r * Math.cos((k * Math.PI) / 360), y + r * Math.sin((k * Math.PI) / 360)] as Pt)
    const clipped = polygonClipping.difference([e.plate.outline as Pt[]], ...e.plate.holes.map((h) => [ring(h.x, h.y, h.diameter / 2)]))
    const lost = e.plate.holes.reduce((sum, h) => sum + (Math.PI * (h.diameter / 2) ** 2) * (1 - Math.sin(Math.PI / 360) / (Math.PI / 360)), 0)
    const clippedArea = clipped.reduce((sum, poly) => sum + poly.reduce((a, r, k) => a + (k === 0 ? 1 : -1) * Math.abs(shoelace(r.slice(0, -1) as Pt[])), 0), 0) - lost
    expect(clippedArea).toBeCloseTo(netArea(e), -1)
    // Volume by hand: the hand area x a 6 mil film (0.006 in = 0.1524 mm; a product setting, common practice from memory).
    expect(plan.glue.volume).toBeCloseTo(2 * 2 * netArea(e) * 0.1524, -1)
    // In US gallons: 231 in3 each (NIST Handbook 44, Appendix C), 1 in = 25.4 mm (NIST SP 811).
    expect(plan.glue.volume / 25.4 ** 3 / 231).toBeCloseTo(((2 * 2 * netArea(e)) / 25.4 ** 2) * 0.006 / 231, 6)
  })

  it('glued first: sheets = panels x layers, whole-sheet glue lines, yield by the shoelace formula', () => {
    const entries = [column(2, 3, 10.5), column(2, 3, 16.5)]
    const plan = planSheets(entries, { sheet: SHEET, workflow: 'panels' })
    expect(plan.sheetsToBuy).toBe(plan.panels * 2)
    expect(plan.glue.area).toBeCloseTo(plan.panels * SHEET.width * SHEET.height, 3)
    const wood = entries.reduce((s, e) => s + e.count * 2 * Math.abs(shoelace(e.plate.outline as Pt[])), 0)
    expect(plan.yield).toBeCloseTo(wood / (plan.sheetsToBuy * SHEET.width * SHEET.height), 9)
    expect(plan.layouts.flatMap((l) => l.parts).every((p) => p.layer === 'all')).toBe(true)
    // Area bound (REFERENCES.md), in panels, times two sheets each.
    const usable = (SHEET.width - 2 * SHEET.margin) * (SHEET.height - 2 * SHEET.margin)
    expect(plan.areaLowerBound).toBe(Math.ceil(wood / 2 / usable) * 2)
    expect(plan.sheetsToBuy).toBeGreaterThanOrEqual(plan.areaLowerBound)
  })

  it('says whether one more plate fits: yes on a roomy sheet, no on a sheet cut to one plate', async () => {
    const e = column(2, 1)
    expect(planSheets([e], { sheet: SHEET, workflow: 'panels' }).spare).toEqual([true])
    // A sheet 10 mm wider and longer than the plate plus its margins has no room for a second.
    const tight = { ...SHEET, width: e.plate.metrics.width + 2 * SHEET.margin + 10, height: e.plate.metrics.height + 2 * SHEET.margin + 10 }
    const plan = await planSheetsAsync([e], { sheet: tight, workflow: 'panels' })
    expect(plan.layouts).toHaveLength(1)
    expect(plan.spare).toEqual([false])
  })

  it('keeps the kerf between every two parts of every sheet and every part inside the margin (brute-force distances)', () => {
    // Eight plates of two sizes, two layers each, cut first: 32 parts, packed as tight as the nester can.
    const entries = [column(2, 4, 10.5), column(2, 4, 14.5)]
    const plan = planSheets(entries, { sheet: SHEET, workflow: 'layers' })
    let pairs = 0
    let closest = Infinity
    for (const layout of plan.layouts) {
      for (const p of layout.parts) {
        for (const [x, y] of p.outline) {
          // The polygon engine works to the micrometre.
          expect(x).toBeGreaterThanOrEqual(SHEET.margin - 1e-3)
          expect(y).toBeGreaterThanOrEqual(SHEET.margin - 1e-3)
          expect(x).toBeLessThanOrEqual(SHEET.width - SHEET.margin + 1e-3)
          expect(y).toBeLessThanOrEqual(SHEET.height - SHEET.margin + 1e-3)
        }
      }
      for (let i = 0; i < layout.parts.length; i++) {
        for (let j = i + 1; j < layout.parts.length; j++) {
          const d = gap(layout.parts[i]!.outline as Pt[], layout.parts[j]!.outline as Pt[], 2 * SHEET.kerf)
          closest = Math.min(closest, d)
          pairs++
          expect(d).toBeGreaterThanOrEqual(SHEET.kerf - 5e-3)
        }
      }
    }
    expect(pairs).toBeGreaterThan(0)
    // Packed tight, not merely apart: the closest two parts are within a few millimetres of the kerf.
    expect(closest).toBeLessThan(SHEET.kerf + 6)
  })

  it('writes a sheet DXF whose parts are the plate\'s cut file turned and moved, and a PDF page per sheet', async () => {
    const e = column(2, 3)
    const plan = planSheets([e], { sheet: SHEET, workflow: 'layers' })
    const parser = new DxfParser()
    const own = parser.parseSync(renderCutDxf(e.plate, { units: 'in', layer: 'top' }))!
    const sheet = parser.parseSync(renderLayoutDxf(plan, [e], 0, { units: 'in' }))!
    // $INSUNITS 1 = inches (DXF Reference, HEADER section).
    expect(sheet.header.$INSUNITS).toBe(1)
    const outside = sheet.entities.filter((x: any) => x.layer === 'RP-OUTSIDE-CUT') as any[]
    expect(outside).toHaveLength(plan.layouts[0]!.parts.length)
    const ownOutline = (own.entities.find((x: any) => x.layer === 'RP-OUTSIDE-CUT') as any).vertices.map((v: any) => [v.x, v.y]) as Pt[]
    for (const o of outside) {
      const ring = o.vertices.map((v: any) => [v.x, v.y]) as Pt[]
      // Same signed area as the plate's own file: congruent and not mirrored.
      expect(shoelace(ring)).toBeCloseTo(shoelace(ownOutline), 6)
      for (const [x, y] of ring) {
        expect(x).toBeGreaterThanOrEqual(0.5 - 1e-6)
        expect(y).toBeLessThanOrEqual(95.5 + 1e-6)
      }
    }
    // Every layer the sheet file uses is one of the plate's own cut layers, the notes, or the sheet outline.
    const ownLayers = new Set(Object.keys(own.tables.layer.layers))
    const sheetLayers = new Set(sheet.entities.map((x: any) => x.layer as string))
    for (const name of sheetLayers) expect(name === 'RP-SHEET' || ownLayers.has(name), name).toBe(true)
    expect(sheetLayers.has('RP-NOTES')).toBe(true)
    expect(sheetLayers.has('RP-INSIDE-CUT')).toBe(true)
    const pdf = await PDFDocument.load(await renderLayoutPdf(plan, [e], { units: 'mm' }))
    expect(pdf.getPageCount()).toBe(plan.layouts.length)
    // Letter, 612 x 792 pt (ASME Y14.1).
    expect(pdf.getPage(0).getSize()).toEqual({ width: 612, height: 792 })
  })
})

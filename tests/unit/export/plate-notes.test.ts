// What the printouts and cut files tell the person cutting, read back with independent
// readers: dxf-parser for the cut file, poppler's pdftotext for the PDFs, polygon-clipping
// for sheet coverage. Hand values: 1 in = 25.4 mm (NIST SP 811); a "3/4 in" panel is
// performance category 23/32 (PS 1-19), the default's 23/32 in.
import { execFileSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import DxfParser, { type IDxf } from 'dxf-parser'
import polygonClipping from 'polygon-clipping'
import { beforeAll, describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema } from '../../../geometry/core'
import { renderBuildSheetPdf, renderCutDxf, renderCutSvg, renderTemplatePdf, renderTubeWrapPdf, LAYER_NOTES } from '../../../geometry/export'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import { placeLabels } from '../../../geometry/export/tiled-pdf'
import { tileContent, type TileContent } from '../../../geometry/export/tiling'
import { formatTapeLength } from '../../../geometry/export/units'
import type { HeldLabel } from '../../../geometry/export/pdf-ops'
import type { Point } from '../../../geometry/types'

const IN = 25.4
let font: Uint8Array
const dir = mkdtempSync(join(tmpdir(), 'rp-notes-'))
beforeAll(async () => {
  font = await loadTemplateFontNode()
})

const clean = buildPlate(plateParamsSchema.parse({}))
// Six casters at 4 in: the pockets run into each other (errors), saved anyway.
const bad = buildPlate(plateParamsSchema.parse({ casterCount: 6, casterOffset: 4 * IN }))

function pdfText(bytes: Uint8Array, name: string, page?: number): string {
  const file = join(dir, name)
  writeFileSync(file, bytes)
  const range = page ? ['-f', String(page), '-l', String(page)] : []
  return execFileSync('/usr/bin/pdftotext', [...range, file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
}

function notes(dxf: IDxf): string[] {
  return dxf.entities.filter((e) => e.layer === LAYER_NOTES).map((e) => (e as unknown as { text: string }).text)
}

describe('tape lengths', () => {
  it('7.180 in reads 7-3/16 in and 16.002 in reads 16 in (nearest 1/32: 229.76/32 -> 230/32)', () => {
    expect(formatTapeLength(7.18 * IN, 'in')).toBe('7-3/16 in')
    expect(formatTapeLength(16.002 * IN, 'in')).toBe('16 in')
    expect(formatTapeLength(0.5 * IN, 'in')).toBe('1/2 in')
    expect(formatTapeLength(182.37, 'mm')).toBe('182.5 mm')
  })
})

describe('the cut file notes layer (read back by dxf-parser)', () => {
  const parse = (text: string) => new DxfParser().parseSync(text)!

  it('names the design, revision, pieces, layers, face up and the 23/32 in sheet, on a layer that is never cut', () => {
    const dxf = parse(renderCutDxf(clean, { units: 'in', meta: { designName: 'Hollow ash', sizeLabel: 'small', revision: 4 } }))
    expect(Object.keys(dxf.tables.layer.layers)).toContain(LAYER_NOTES)
    const text = notes(dxf).join('\n')
    expect(text).toContain('Hollow ash')
    expect(text).toContain('revision 4')
    // Default plate: 2 layers of 23/32 in, so 2 pieces, 46/32 = 1-7/16 in glued (hand sum).
    expect(text).toContain('Cut 2 pieces per plate from 23/32 in plywood')
    expect(text).toContain('1-7/16 in glued')
    expect(text).toMatch(/TOP face/)
    expect(text).not.toContain('SAVED WITH ERRORS')
    // Only text there, and no text anywhere else (no text on cut layers: common CNC practice).
    for (const e of dxf.entities) expect(e.layer === LAYER_NOTES).toBe(e.type === 'TEXT')
  })

  it('says the revision was saved with errors, and lists them in the file units', () => {
    const dxf = parse(renderCutDxf(bad, { units: 'mm', meta: { designName: 'Bad beech', revision: 2 } }))
    const text = notes(dxf)
    expect(text[0]).toMatch(/^SAVED WITH ERRORS \(\d+\)/)
    // 1-1/4 in overlap of the rabbets = 31.75 mm, to the half millimetre.
    expect(text.join(' ')).toContain('32 mm')
  })

  it('the SVG cut file carries the same notes as its description (read back by happy-dom as XML)', async () => {
    const { Window } = await import('happy-dom')
    const doc = new new Window().DOMParser().parseFromString(renderCutSvg(bad, { units: 'in' }), 'image/svg+xml')
    const desc = doc.querySelector('desc')?.textContent ?? ''
    expect(desc).toMatch(/^SAVED WITH ERRORS/)
    expect(desc).toContain('Cut 2 pieces per plate from 23/32 in plywood')
  })

  it('counts the bottom layers of a three-layer plate: 2 pieces, no rabbets', () => {
    const three = buildPlate(plateParamsSchema.parse({ layers: 3 }))
    const text = notes(parse(renderCutDxf(three, { units: 'in', layer: 'bottom' }))).join('\n')
    expect(text).toContain('Cut 2 pieces per plate: the bottom layers')
    expect(text).not.toContain('Rabbets:')
  })
})

describe('template, build sheet and tube wrap (read back by pdftotext)', () => {
  it('the template cover carries the cut list, and the warning only for a revision with errors', async () => {
    const good = pdfText(await renderTemplatePdf(clean, { paper: 'letter', font, meta: { designName: 'Hollow ash', revision: 4 } }), 'good.pdf', 1)
    expect(good).toContain('Cut list')
    expect(good).toContain('Cut 2 pieces per plate from 23/32 in plywood')
    expect(good).not.toContain('SAVED WITH ERRORS')
    const pdf = await renderTemplatePdf(bad, { paper: 'letter', font, meta: { designName: 'Bad beech', revision: 2 } })
    expect(pdfText(pdf, 'bad.pdf', 1)).toContain('SAVED WITH ERRORS')
    // Every sheet repeats it in its title block.
    expect(pdfText(pdf, 'bad2.pdf', 2)).toContain('SAVED WITH ERRORS')
    expect(pdfText(pdf, 'bad3.pdf', 2)).toContain('cut 2 per plate')
  })

  it('the build sheet says so at the top', async () => {
    const meta = { designName: 'Bad beech', revision: 2, date: '2026-01-01' }
    expect(pdfText(await renderBuildSheetPdf(bad, { units: 'in', meta, font }), 'bs.pdf', 1)).toContain('SAVED WITH ERRORS')
    expect(pdfText(await renderBuildSheetPdf(clean, { units: 'in', meta, font }), 'bs-clean.pdf', 1)).not.toContain('SAVED WITH ERRORS')
  })

  it('the tube wrap gives tape fractions, not decimals, and names no setting that does not exist', async () => {
    const text = pdfText(await renderTubeWrapPdf(clean, { paper: 'letter', font, units: 'in' }), 'wrap.pdf')
    expect(text).not.toMatch(/\d\.\d{2,} in/)
    expect(text).toMatch(/\d+-\d+\/\d+ in wide/)
    expect(text).not.toMatch(/notch.height setting/i)
    expect(text).toContain('pan depth and the rabbet depth')
  })
})

describe('sheets (item: slivers and labels)', () => {
  // Letter portrait: printable 203.2 mm wide (215.9 - 2 x 6.35), overlap 12.7, step 190.5.
  // Content 210 mm wide -> cols = ceil((210 - 12.7) / 190.5) = 2; grid 393.7 wide, centred on 105:
  // column 1 spans -91.85..111.35, column 2 98.65..301.85; their overlap is 98.65..111.35.
  const rect = (x0: number, x1: number, y0: number, y1: number): Point[] => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]]

  it('leaves out a sheet that would hold only a sliver inside its overlap with a printed neighbour', () => {
    const shape = rect(0, 105, 0, 100)
    const content: TileContent = { bounds: { minX: 0, maxX: 210, minY: 0, maxY: 100 }, polygons: [shape] }
    const t = tileContent(content, { paper: 'letter', orientation: 'portrait' })
    expect(t.cols).toBe(2)
    expect(t.sheets[0]!.window.maxX).toBeCloseTo(111.35, 6)
    expect(t.sheets[1]!.window.minX).toBeCloseTo(98.65, 6)
    // 98.65..105 of the shape lies on column 2, but all of it is on column 1 too.
    expect(t.printed).toBe(1)
    const printed = t.sheets.filter((s) => !s.empty).map((s) => [rect(s.window.minX, s.window.maxX, s.window.minY, s.window.maxY)])
    const missing = polygonClipping.difference([shape], ...printed)
    expect(missing.flat(2).length).toBe(0)
  })

  it('keeps both when the shape reaches past the overlap', () => {
    const content: TileContent = { bounds: { minX: 0, maxX: 210, minY: 0, maxY: 100 }, polygons: [rect(0, 115, 0, 100)] }
    expect(tileContent(content, { paper: 'letter', orientation: 'portrait' }).printed).toBe(2)
  })

  it('puts a label across a sheet edge whole on a sheet, and never in part', () => {
    const content: TileContent = { bounds: { minX: 0, maxX: 210, minY: 0, maxY: 100 }, polygons: [rect(0, 210, 0, 100)] }
    const t = tileContent(content, { paper: 'letter', orientation: 'portrait' })
    expect(t.printed).toBe(2)
    // A label 30 mm long from x 95 to 125: column 1 ends at 111.35, column 2 starts at 98.65: neither holds it.
    const label: HeldLabel = { text: 'rabbet 7-3/4 in', x: 95, y: 50, size: 3, options: {}, corners: [[95, 49], [125, 49], [125, 53], [95, 53]] }
    const placed = placeLabels([label], t)
    const all = [...placed.entries()].flatMap(([sheet, ls]) => ls.map((l) => ({ sheet, l })))
    expect(all.length).toBeGreaterThan(0)
    for (const { sheet, l } of all) {
      for (const [x, y] of l.corners) {
        expect(x).toBeGreaterThanOrEqual(sheet.window.minX)
        expect(x).toBeLessThanOrEqual(sheet.window.maxX)
        expect(y).toBeGreaterThanOrEqual(sheet.window.minY)
        expect(y).toBeLessThanOrEqual(sheet.window.maxY)
      }
      // Moved by the least: into column 2 it moves 98.65 + 0.5 - 95 = 4.15 mm right.
      expect(Math.abs(l.x - label.x)).toBeCloseTo(4.15, 6)
    }
  })
})

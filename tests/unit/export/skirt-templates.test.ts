// Skirt marks on the templates and the rib profile template, checked against
// the plate read independently: a point-in-polygon test written here (ray
// casting, the even-odd rule), the unrolled circumference pi x D, Ramanujan's
// ellipse perimeter (REFERENCES) for the rib curves, and the PDFs read back
// with pdf-lib.

import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, it } from 'vitest'
import { buildPlate } from '../../../geometry/plate'
import { presetParams } from '../../../geometry/presets'
import { skirtStrips } from '../../../geometry/skirt'
import { plateStationMarks, wrapStripMarks } from '../../../geometry/export/skirt-marks'
import { planTemplate, renderTemplatePdf } from '../../../geometry/export/template-pdf'
import { planTubeWrap } from '../../../geometry/export/tube-wrap-pdf'
import { renderSkirtProfilesPdf, skirtProfileLayout } from '../../../geometry/export/skirt-profiles-pdf'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import type { Ops } from '../../../geometry/export/pdf-ops'

type P = [number, number]

let font: Uint8Array
beforeAll(async () => {
  font = await loadTemplateFontNode()
})

/** Even-odd ray casting (common computational-geometry method). */
function inside(p: P, poly: readonly P[]): boolean {
  let odd = false
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i]!
    const [xj, yj] = poly[j]!
    if ((yi > p[1]) !== (yj > p[1]) && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) odd = !odd
  }
  return odd
}

/** Records the lines and texts a mark set draws, with no PDF in between. */
function recorder() {
  const lines: [number, number, number, number][] = []
  const texts: { text: string; x: number; y: number }[] = []
  const ops = {
    style() { return ops },
    stroke() { return ops },
    line(x0: number, y0: number, x1: number, y1: number) { lines.push([x0, y0, x1, y1]); return ops },
    text(text: string, x: number, y: number) { texts.push({ text, x, y }); return ops },
  }
  return { ops: ops as unknown as Ops, lines, texts }
}

const plate = buildPlate(presetParams('gnarled-oak')!)

describe('station marks on the plate template', () => {
  it('puts one tick across the edge at every station, numbered 1 to n', () => {
    const { strips } = skirtStrips(plate)
    const r = recorder()
    plateStationMarks(strips).draw(r.ops)
    expect(r.lines).toHaveLength(strips.length)
    for (const [x0, y0, x1, y1] of r.lines) {
      expect(inside([x0, y0], plate.outline)).toBe(true)
      expect(inside([x1, y1], plate.outline)).toBe(false)
    }
    expect(r.texts.map((t) => Number(t.text))).toEqual(strips.map((_, i) => i + 1))
  })

  it('adds the marks without adding sheets, and its legend line', async () => {
    const plain = await PDFDocument.load(await renderTemplatePdf(plate, { paper: 'letter', font }))
    const marked = await PDFDocument.load(await renderTemplatePdf(plate, { paper: 'letter', font, extraMarks: [plateStationMarks(skirtStrips(plate).strips)] }))
    expect(marked.getPageCount()).toBe(plain.getPageCount())
    const { drawing } = planTemplate(plate, { paper: 'letter', extraMarks: [plateStationMarks(skirtStrips(plate).strips)] })
    expect(drawing.legend.map((l) => l.label)).toContain('skirt station: tick across the edge, number')
  })
})

describe('strip landings on the tube wrap', () => {
  it('marks each strip at its angle from the clocking axis times the outside radius, at its rise', () => {
    const { strips } = skirtStrips(plate, { height: 100 })
    const r = recorder()
    const H = 152.4
    wrapStripMarks(plate, strips, H, 'in').draw(r.ops)
    const R = plate.params.tubeDiameter / 2
    const C = Math.PI * plate.params.tubeDiameter
    strips.forEach((s, k) => {
      // Arc length = radius x angle in radians (plain geometry).
      const fromAxis = (((s.angle - plate.params.rotation) % 360) + 360) % 360
      const x = (R * fromAxis * Math.PI) / 180
      const [x0, y0, x1, y1] = r.lines[2 * k]!
      expect(x0).toBeCloseTo(x % C, 6)
      expect(x1).toBeCloseTo(x % C, 6)
      expect(y0).toBe(0)
      expect(y1).toBeCloseTo(100, 9)
      const bar = r.lines[2 * k + 1]!
      expect(bar[1]).toBeCloseTo(100, 9)
      expect(bar[3]).toBeCloseTo(100, 9)
    })
    // 100 mm / 25.4 = 3.937 in, to the nearest 1/16 in: 3-15/16 in (hand value).
    expect(r.texts[0]!.text).toBe('1: 3-15/16 in')
  })

  it('joins the wrap drawing through its extra-marks hook', () => {
    const marks = wrapStripMarks(plate, skirtStrips(plate).strips, 152.4, 'mm')
    const { drawing } = planTubeWrap(plate, { paper: 'letter', extraMarks: [marks] })
    expect(drawing.legend.map((l) => l.label)).toContain('skirt strip landing: number and height of its top')
  })
})

describe('rib profile template', () => {
  it('has one rib per distinct run and rise, covering every station once, each curve as long as Ramanujan gives', () => {
    const { ribs, strips } = skirtProfileLayout(plate, { units: 'in' })
    expect(ribs.flatMap((r) => r.stations).sort((a, b) => a - b)).toEqual(strips.map((s) => s.number))
    for (const rib of ribs) {
      const curve = rib.shape.slice(0, -1)
      let len = 0
      for (let i = 1; i < curve.length; i++) len += Math.hypot(curve[i]![0] - curve[i - 1]![0], curve[i]![1] - curve[i - 1]![1])
      const a = rib.run
      const b = rib.rise
      const quarter = (Math.PI * (3 * (a + b) - Math.sqrt((3 * a + b) * (a + 3 * b)))) / 4
      // 64 chords fall short of the arc by well under 0.1 % (chord error ~ L theta^2 / 24).
      expect(Math.abs(len - quarter) / quarter).toBeLessThan(1e-3)
      const top = curve[curve.length - 1]!
      expect(top[0] - rib.origin[0]).toBeCloseTo(a, 9)
      expect(top[1] - rib.origin[1]).toBeCloseTo(b, 9)
    }
  })

  it('writes a tiled PDF that pdf-lib reads back: a cover and Letter sheets (612 x 792 pt, ASME Y14.1 at 72 pt/in)', async () => {
    const doc = await PDFDocument.load(await renderSkirtProfilesPdf(plate, { paper: 'letter', font, meta: { designName: 'Rib test' } }))
    expect(doc.getPageCount()).toBeGreaterThan(1)
    const sizes = doc.getPages().slice(1).map((p) => { const s = p.getSize(); return [Math.min(s.width, s.height), Math.max(s.width, s.height)] })
    for (const s of sizes) expect(s).toEqual([612, 792])
  })
})

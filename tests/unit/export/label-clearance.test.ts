// Template sheets never print a word over a cut line (issue 23, item 17). Read
// back independently of the writer: poppler's `pdftotext -bbox` gives each
// printed word's box on each sheet; the matrix that places the drawing is read
// from the page's own content stream (ISO 32000-1, 8.3.4: "a b c d e f cm"); the
// cut lines come from the plate (outline, holes, rabbets) with the line widths
// the legend states. Circles are checked exactly (a box meets a ring of radius r
// and width w when its nearest point is within r + w/2 of the centre and its
// farthest beyond r - w/2); the outline's band is clipper2-ts's offset of the
// outline by +-w/2, met by polygon-clipping's intersection. Labels set at an
// angle (pdftotext boxes them square to the page, larger than they print) are
// checked from their own position, size and angle with widths measured by pdf-lib.
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { inflateSync } from 'node:zlib'
import fontkit from '@pdf-lib/fontkit'
import { EndType, JoinType, inflatePathsD } from 'clipper2-ts'
import { PDFArray, PDFDocument, PDFRawStream, PDFRef, type PDFFont } from 'pdf-lib'
import polygonClipping, { type Polygon } from 'polygon-clipping'
import { beforeAll, describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema } from '../../../geometry/core'
import { presetParams } from '../../../geometry/presets'
import { planTemplate, renderTemplatePdf, TEMPLATE_STYLES } from '../../../geometry/export/template-pdf'
import { sheetLabels } from '../../../geometry/export/tiled-pdf'
import { Ops, type HeldLabel } from '../../../geometry/export/pdf-ops'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'
import { unpackWoff } from '../../../geometry/export/fonts'
import type { Plate, Point } from '../../../geometry/types'

const PT_PER_MM = 72 / 25.4 // 25.4 mm per inch (NIST SP 811), 72 pt per inch (ISO 32000-1)
const shots = 'test-results/unit'
let fontBytes: Uint8Array
let pdfFont: PDFFont

beforeAll(async () => {
  fontBytes = await loadTemplateFontNode()
  mkdirSync(shots, { recursive: true })
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  pdfFont = await doc.embedFont(await unpackWoff(fontBytes))
})

type Box = [number, number, number, number] // minX, minY, maxX, maxY in plate mm

/** Cut lines of a plate as the legend draws them: the outline, every hole, the rabbets (top layer). */
function cutGeometry(plate: Plate) {
  const S = TEMPLATE_STYLES
  const circles = [
    ...plate.holes.map((h) => ({ x: h.x, y: h.y, r: h.diameter / 2, w: h.kind === 'index' ? S.drill.width : S.hole.width })),
    ...plate.rabbets.map((r) => ({ x: r.x, y: r.y, r: r.diameter / 2, w: S.rabbet.width })),
  ]
  const ring = (d: number) => inflatePathsD([plate.outline.map(([x, y]) => ({ x, y }))], d, JoinType.Round, EndType.Polygon, 2, 4).map((p) => p.map((q) => [q.x, q.y] as [number, number]))
  const outer = ring(S.cut.width / 2)
  const inner = ring(-S.cut.width / 2)
  const band = polygonClipping.difference(outer.map((r) => [r]) as Polygon[], ...(inner.map((r) => [r]) as Polygon[]))
  return { circles, band, outline: plate.outline }
}

/** A segment's bounding box within `pad` mm of the box's. */
function nearBox(a: Point, b: Point, xs: number[], ys: number[], pad: number): boolean {
  return Math.max(a[0], b[0]) >= Math.min(...xs) - pad && Math.min(a[0], b[0]) <= Math.max(...xs) + pad && Math.max(a[1], b[1]) >= Math.min(...ys) - pad && Math.min(a[1], b[1]) <= Math.max(...ys) + pad
}

function boxMeets(box: Point[], geo: ReturnType<typeof cutGeometry>): string | null {
  const xs = box.map((p) => p[0])
  const ys = box.map((p) => p[1])
  for (const c of geo.circles) {
    // Nearest and farthest points of the (convex) box from the centre; for an upright box the nearest is the clamp.
    const near = Math.hypot(Math.max(Math.min(...xs) - c.x, 0, c.x - Math.max(...xs)), Math.max(Math.min(...ys) - c.y, 0, c.y - Math.max(...ys)))
    const far = Math.max(...box.map(([x, y]) => Math.hypot(x - c.x, y - c.y)))
    if (near <= c.r + c.w / 2 && far >= c.r - c.w / 2) {
      // An upright box's clamp is exact; for a turned box, confirm on its own edges.
      const edgeNear = Math.min(...box.map((p, i) => distToSegment([c.x, c.y], p, box[(i + 1) % box.length]!)))
      const inside = pointInConvex([c.x, c.y], box)
      const nearest = inside ? 0 : edgeNear
      if (nearest <= c.r + c.w / 2) return `circle r ${c.r.toFixed(1)} at (${c.x.toFixed(1)}, ${c.y.toFixed(1)})`
    }
  }
  // Only boxes within a few mm of the outline go to polygon-clipping (the band has thousands of points).
  if (!geo.outline.some((p, i) => nearBox(p, geo.outline[(i + 1) % geo.outline.length]!, xs, ys, 3))) return null
  const hit = polygonClipping.intersection([box.map((p) => [p[0], p[1]] as [number, number])], geo.band)
  const area = hit.flat().reduce((s, ring) => s + Math.abs(shoelace(ring)), 0)
  return area > 1e-6 ? 'the outline' : null
}

function shoelace(ring: readonly (readonly [number, number])[]): number {
  let a = 0
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = ring[i]!
    const [x2, y2] = ring[(i + 1) % ring.length]!
    a += x1 * y2 - x2 * y1
  }
  return a / 2
}

function distToSegment(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0]
  const dy = b[1] - a[1]
  const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy || 1)))
  return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy)
}

function pointInConvex(p: Point, poly: Point[]): boolean {
  let sign = 0
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i]!
    const b = poly[(i + 1) % poly.length]!
    const c = Math.sign((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]))
    if (c !== 0 && sign !== 0 && c !== sign) return false
    if (c !== 0) sign = c
  }
  return true
}

/** The placing matrix of the drawing on each page, from the page's content stream. */
async function bodyMatrices(bytes: Uint8Array): Promise<(number[] | null)[]> {
  const doc = await PDFDocument.load(bytes)
  return doc.getPages().map((page) => {
    const contents = page.node.Contents()
    const refs = contents instanceof PDFArray ? contents.asArray() : contents ? [contents] : []
    const text = refs.map((r) => {
      const s = r instanceof PDFRef ? doc.context.lookup(r) : r
      return inflateSync(Buffer.from((s as PDFRawStream).contents)).toString('latin1')
    }).join('\n')
    const m = /([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+) ([-\d.]+) cm\s*\/RpBody Do/.exec(text)
    return m ? m.slice(1).map(Number) : null
  })
}

/** Every word pdftotext finds, per page, with its box in PDF points (y up). */
function words(file: string, pageHeight: number): { page: number; text: string; box: Box }[] {
  const html = execFileSync('/usr/bin/pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' })
  const out: { page: number; text: string; box: Box }[] = []
  let page = 0
  for (const line of html.split('\n')) {
    if (line.includes('<page ')) page++
    const m = /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/.exec(line)
    if (m) out.push({ page, text: m[5]!, box: [Number(m[1]), pageHeight - Number(m[4]), Number(m[3]), pageHeight - Number(m[2])] })
  }
  return out
}

/** A label's printed box (descender to ascender) from its own position, size and angle; width by pdf-lib. */
function turnedBox(l: HeldLabel): Point[] {
  const w = pdfFont.widthOfTextAtSize(l.text, l.size)
  const h = pdfFont.heightAtSize(l.size, { descender: true })
  const asc = pdfFont.heightAtSize(l.size, { descender: false })
  const a = ((l.options.angle ?? 0) * Math.PI) / 180
  const shift = l.options.align === 'center' ? w / 2 : l.options.align === 'right' ? w : 0
  const c = Math.cos(a)
  const s = Math.sin(a)
  const at = (u: number, v: number): Point => [l.x + (u - shift) * c - v * s, l.y + (u - shift) * s + v * c]
  return [at(0, asc - h), at(w, asc - h), at(w, asc), at(0, asc)]
}

const cases: [string, Record<string, unknown>][] = [
  ['the default plate', {}],
  ['the banyan preset', presetParams('banyan-sprawl')!],
  ['a 12.47 in tube with six 3 in pockets', { tubeDiameter: 12.47 * 25.4, casterCount: 4, casterOffset: 110, pocketDiameter: 3 * 25.4, lobes: { count: 5, irregularity: 0.3 } }],
]

describe('no word on a template sheet over a cut line (issue 23, item 17)', () => {
  for (const [name, params] of cases) {
    it(`${name}: every word on every sheet clears the cut lines (pdftotext -bbox, clipper2-ts, polygon-clipping)`, async () => {
      const plate = buildPlate(plateParamsSchema.parse(params))
      const bytes = await renderTemplatePdf(plate, { paper: 'letter', units: 'in', font: fontBytes, meta: { designName: 'Clearance check', revision: 1, date: '2026-12-05' } })
      const file = `${shots}/clearance-${name.replace(/\W+/g, '-')}.pdf`
      writeFileSync(file, bytes)
      const doc = await PDFDocument.load(bytes)
      const matrices = await bodyMatrices(bytes)
      const geo = cutGeometry(plate)
      // Words of labels set at an angle are checked below from their own boxes.
      const { drawing, tiling } = planTemplate(plate, { paper: 'letter', units: 'in' })
      const held: HeldLabel[] = []
      drawing.drawBody(new Ops(pdfFont, 'F1').holdLabels(held))
      const turned = new Set(held.filter((l) => (l.options.angle ?? 0) % 90 !== 0).flatMap((l) => l.text.split(/\s+/)))
      const problems: string[] = []
      let checked = 0
      for (const w of words(file, doc.getPage(1).getHeight())) {
        const m = matrices[w.page - 1]
        if (!m || turned.has(w.text)) continue
        const [a, , , d, e, f] = m
        // Page points to plate mm through the placing matrix; shrunk 0.05 mm for pdftotext's rounding.
        const [x0, y0, x1, y1] = [(w.box[0] - e!) / a! + 0.05, (w.box[1] - f!) / d! + 0.05, (w.box[2] - e!) / a! - 0.05, (w.box[3] - f!) / d! - 0.05]
        const hit = boxMeets([[x0, y0], [x1, y0], [x1, y1], [x0, y1]], geo)
        checked++
        if (hit) problems.push(`page ${w.page}: "${w.text}" on ${hit}`)
      }
      expect(checked).toBeGreaterThan(20)
      expect(problems).toEqual([])
      // The turned labels, from their own boxes on the sheets that print them.
      for (const [, labels] of sheetLabels(held, drawing, tiling)) {
        for (const l of labels) {
          if ((l.options.angle ?? 0) % 90 === 0) continue
          const hit = boxMeets(turnedBox(l), geo)
          if (hit) problems.push(`"${l.text}" (turned ${l.options.angle}) on ${hit}`)
        }
      }
      expect(problems).toEqual([])
    })
  }

  it('renders a content sheet of the default plate for a person to look at (test-results/unit/clearance-sheet-*.png)', () => {
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '60', '-f', '2', '-l', '5', `${shots}/clearance-the-default-plate.pdf`, `${shots}/clearance-sheet`])
  })
})

describe('every length on a template is a fraction in inch mode (issue 23, item 17)', () => {
  it('a 12.47 in tube reads 12-15/32 in (12.47 x 32 = 399.04, so 399/32), and no sheet prints a decimal inch', async () => {
    const plate = buildPlate(plateParamsSchema.parse(cases[2]![1]))
    const bytes = await renderTemplatePdf(plate, { paper: 'letter', units: 'in', font: fontBytes, meta: { designName: 'Fractions', revision: 1, date: '2026-12-05' } })
    const file = `${shots}/clearance-fractions.pdf`
    writeFileSync(file, bytes)
    const text = execFileSync('/usr/bin/pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
    expect(text).toContain('trunk circle Ø 12-15/32 in')
    expect(text).not.toMatch(/\d\.\d+ in\b/)
  })
})

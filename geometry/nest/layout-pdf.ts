// The sheet plan as a PDF: one page per sheet (or glued panel), drawn to
// scale with every part's outline and holes, each part labelled with its
// design, size and layer, and the sheet's figures.

import fontkit from '@pdf-lib/fontkit'
import { PDFDocument, rgb, type PDFFont, type PDFPage } from 'pdf-lib'
import type { Point } from '../types'
import { formatLength } from '../units'
import { resolveFontBytes, unpackWoff, type FontBytes } from '../export/fonts'
import type { PlanEntry, PlanPart, SheetPlan } from './plan'

export interface LayoutPdfOptions {
  units: 'in' | 'mm'
  /** The font file (WOFF); read from node_modules under Node when left out. */
  font?: FontBytes
  /** A title for the header, e.g. the show's name. */
  title?: string
}

const PAGE = { width: 612, height: 792 } // Letter, portrait (ASME Y14.1)
const MARGIN = 36
const HEADER = 54
const FOOTER = 40
const INK = rgb(0.1, 0.1, 0.1)
const GREY = rgb(0.55, 0.55, 0.55)
const PART_FILL = rgb(0.93, 0.9, 0.84)
const OFFCUT_FILL = rgb(0.88, 0.95, 0.88)

function rotate(p: Point, turn: number): Point {
  const t = (turn * Math.PI) / 180
  const c = turn % 90 === 0 ? Math.round(Math.cos(t)) : Math.cos(t)
  const s = turn % 90 === 0 ? Math.round(Math.sin(t)) : Math.sin(t)
  return [p[0] * c - p[1] * s, p[0] * s + p[1] * c]
}

export function partLabel(entry: PlanEntry, part: PlanPart, layers: number): string {
  const name = entry.size ? `${entry.name} (${entry.size})` : entry.name
  if (part.layer === 'all') return `${name}, ${layers} layers glued`
  if (part.layer === 'top') return `${name}, top layer`
  return layers > 2 ? `${name}, layer ${part.layerNumber} of ${layers}` : `${name}, bottom layer`
}

function workflowLine(plan: SheetPlan, sheets: number): string {
  return plan.workflow === 'panels'
    ? `Panel of ${sheets} glued sheet${sheets === 1 ? '' : 's'}: every layer cut at once`
    : 'Single sheet: each layer cut, the parts glued after'
}

function text(page: PDFPage, font: PDFFont, s: string, x: number, y: number, size: number, centred = false, color = INK): void {
  const w = centred ? font.widthOfTextAtSize(s, size) : 0
  page.drawText(s, { x: x - w / 2, y, size, font, color })
}

/** The layouts PDF. */
export async function renderLayoutPdf(plan: SheetPlan, entries: PlanEntry[], options: LayoutPdfOptions): Promise<Uint8Array> {
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  const font = await doc.embedFont(await unpackWoff(await resolveFontBytes(options.font)), { subset: true })
  doc.setTitle(options.title ? `Sheet plan: ${options.title}` : 'Sheet plan')
  doc.setCreator('Rootplate')
  const L = (mm: number) => formatLength(mm, options.units, options.units === 'in' ? { denominator: 8 } : { step: 1 })
  const { width: W, height: H, margin, kerf } = plan.sheet
  const scale = Math.min((PAGE.width - 2 * MARGIN) / W, (PAGE.height - 2 * MARGIN - HEADER - FOOTER) / H)
  const x0 = (PAGE.width - W * scale) / 2
  const y0 = MARGIN + FOOTER
  const toPage = (p: Point): Point => [x0 + p[0] * scale, y0 + p[1] * scale]
  const svg = (ring: Point[]) => ring.map((p, i) => `${i ? 'L' : 'M'}${(p[0] * scale).toFixed(2)} ${(-p[1] * scale).toFixed(2)}`).join(' ') + ' Z'

  plan.layouts.forEach((layout, index) => {
    const page = doc.addPage([PAGE.width, PAGE.height])
    const top = PAGE.height - MARGIN
    text(page, font, `${options.title ? `${options.title}: sheet plan` : 'Sheet plan'}, ${index + 1} of ${plan.layouts.length}`, MARGIN, top - 14, 14)
    text(page, font, workflowLine(plan, layout.sheets), MARGIN, top - 30, 9)
    text(page, font, `Sheet ${L(W)} x ${L(H)}, edge margin ${L(margin)}, kerf ${L(kerf)}. Drawn to scale 1:${Math.round(1 / (scale / (72 / 25.4)))}; origin lower left.`, MARGIN, top - 43, 8, false, GREY)

    // The sheet, its unusable margin and the clear offcut.
    page.drawRectangle({ x: x0, y: y0, width: W * scale, height: H * scale, borderColor: INK, borderWidth: 0.8 })
    if (margin > 0) {
      page.drawRectangle({ x: x0 + margin * scale, y: y0 + margin * scale, width: (W - 2 * margin) * scale, height: (H - 2 * margin) * scale, borderColor: GREY, borderWidth: 0.3, borderDashArray: [2, 2] })
    }
    if (layout.offcut) {
      const o = layout.offcut
      page.drawRectangle({ x: x0 + o.x * scale, y: y0 + o.y * scale, width: o.width * scale, height: o.height * scale, color: OFFCUT_FILL })
      if (o.height * scale > 14) text(page, font, `offcut ${L(o.width)} x ${L(o.height)}`, x0 + (o.x + o.width / 2) * scale, y0 + (o.y + o.height / 2) * scale - 3, 8, true, GREY)
    }

    for (const part of layout.parts) {
      const entry = entries[part.entry]!
      page.drawSvgPath(svg(part.outline), { x: x0, y: y0, color: PART_FILL, borderColor: INK, borderWidth: 0.6 })
      const plate = entry.plate
      const withRabbets = part.layer !== 'bottom'
      for (const h of plate.holes) {
        const [cx, cy] = toPage(add(rotate([h.x, h.y], part.turn), part.at))
        page.drawCircle({ x: cx, y: cy, size: Math.max(0.4, (h.diameter / 2) * scale), color: rgb(1, 1, 1), borderColor: INK, borderWidth: 0.4 })
      }
      if (withRabbets) {
        for (const r of plate.rabbets) {
          const [cx, cy] = toPage(add(rotate([r.x, r.y], part.turn), part.at))
          page.drawCircle({ x: cx, y: cy, size: (r.diameter / 2) * scale, borderColor: GREY, borderWidth: 0.3, borderDashArray: [1.5, 1.5] })
        }
      }
      const [lx, ly] = toPage(part.at)
      const size = `${L(plate.metrics.width)} x ${L(plate.metrics.height)}`
      text(page, font, partLabel(entry, part, plate.params.layers), lx, ly + 2, 6.5, true)
      text(page, font, size, lx, ly - 6, 6.5, true)
    }

    const used = layout.partArea / (W * H)
    text(page, font, `${layout.parts.length} part${layout.parts.length === 1 ? '' : 's'} on this ${layout.sheets > 1 ? 'panel' : 'sheet'}; yield ${(used * 100).toFixed(0)} %. Plan: ${plan.sheetsToBuy} sheet${plan.sheetsToBuy === 1 ? '' : 's'} to buy${plan.panels ? `, ${plan.panels} panel${plan.panels === 1 ? '' : 's'} to glue` : ''}.`, MARGIN, MARGIN + 18, 8)
    text(page, font, 'Check every plate against its own template or cut file before cutting.', MARGIN, MARGIN + 6, 7, false, GREY)
  })
  if (plan.layouts.length === 0) {
    const page = doc.addPage([PAGE.width, PAGE.height])
    text(page, font, 'Sheet plan: no plates to place.', MARGIN, PAGE.height - MARGIN - 14, 14)
  }
  return doc.save()
}

function add(p: Point, q: Point): Point {
  return [p[0] + q[0], p[1] + q[1]]
}

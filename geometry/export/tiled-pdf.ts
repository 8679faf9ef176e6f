// The tiled full-size PDF, whatever is drawn on it (the plate, the tube wrap):
// a cover sheet with the scale check and the page map, then one page per
// printed sheet. The drawing itself is written once as a form XObject and
// placed on every page through a clip and a 1:1 transform, which keeps a
// 40-sheet template small and the placement identical on every page.

import fontkit from '@pdf-lib/fontkit'
import { PDFDocument, PDFName, type PDFFont, type PDFRef } from 'pdf-lib'
import type { Point } from '../types'
import { resolveFontBytes, unpackWoff, type FontBytes } from './fonts'
import { COLOURS, encode, Ops, sanitise, type HeldLabel, type LineStyle, type Rgb } from './pdf-ops'
import { simplifyClosed } from './polyline'
import {
  edgesTouchRect,
  PAPERS,
  polygonTouchesRect,
  pageSizePt,
  rectContains,
  registrationPoints,
  sheetTransform,
  type Rect,
  type Sheet,
  type TileContent,
  type Tiling,
} from './tiling'
import { formatTapeLength, PT_PER_MM, type ExportUnits } from './units'

/** What the title blocks say about the design. */
export interface TemplateMeta {
  designName: string
  /** e.g. `18 in` or `Large`. */
  sizeLabel?: string
  revision?: number
  /** As printed; default today's date, YYYY-MM-DD. */
  date?: string
}

export interface LegendEntry {
  label: string
  /** Widths and dashes in millimetres, as drawn at full size. */
  style: LineStyle
}

/** A full-size drawing to be tiled. Its user unit is 1 mm, plate coordinates, y up. */
export interface TiledDrawing {
  /** e.g. `Plate template`. */
  title: string
  content: TileContent
  drawBody(ops: Ops): void
  /** Closed shapes for the page map and the location maps. */
  mapShapes: Point[][]
  /** Lines a sheet's title block should keep clear of, heavier weight for the more important. */
  avoid: { shape: Point[]; weight: number }[]
  /**
   * The closed cut lines (mm, with their printed width): no label and no
   * title block is printed over one. Left out, the `avoid` shapes of weight 5
   * or more stand for them, at 0.8 mm.
   */
  cutLines?: CutLine[]
  legend: LegendEntry[]
  /** Lines for the cover under the assembly steps. */
  notes: string[]
  /** A warning the cover shows boxed in red and every sheet repeats in short (a revision saved with errors). */
  alerts?: { heading: string; lines: string[] }
  /** What to cut from this file (pieces, layers, face up, thickness), first on the cover. */
  cutList?: string[]
  /** One short line for every sheet's title block, e.g. `cut 2 per plate · top face up · 0.703 in plywood`. */
  sheetNote?: string
}

/** A closed cut line as printed: its shape (mm) and its stroke width (mm). */
export interface CutLine {
  shape: Point[]
  width: number
}

/** Room kept between a label's box and a cut line's edge, mm. */
export const LABEL_CLEARANCE = 0.5

/** The box a reader sees of a label: the font's full height (descender 0.3, ascender 1.05 of the size) along its baseline. */
export function labelBox(l: HeldLabel): Point[] {
  const c0 = l.corners[0]!
  const c1 = l.corners[1]!
  const c3 = l.corners[3]!
  const ul = Math.hypot(c1[0] - c0[0], c1[1] - c0[1]) || 1
  const vl = Math.hypot(c3[0] - c0[0], c3[1] - c0[1]) || 1
  const v: Point = [(c3[0] - c0[0]) / vl, (c3[1] - c0[1]) / vl]
  const u: Point = [(c1[0] - c0[0]) / ul, (c1[1] - c0[1]) / ul]
  // The held corners run from -0.25 to 0.8 of the size; the font's own box is taller.
  const lo = -0.05 * l.size
  const hi = 0.25 * l.size
  const b0: Point = [c0[0] + v[0] * lo, c0[1] + v[1] * lo]
  const b3: Point = [c3[0] + v[0] * hi, c3[1] + v[1] * hi]
  return [b0, [b0[0] + u[0] * ul, b0[1] + u[1] * ul], [b3[0] + u[0] * ul, b3[1] + u[1] * ul], b3]
}

interface Segment { ax: number; ay: number; bx: number; by: number; reach: number }

/** Cut-line segments in a grid of 10 mm cells, each with the distance a label must keep from its centre line. */
class SegmentGrid {
  private readonly cells = new Map<string, Segment[]>()
  private static readonly CELL = 10
  constructor(lines: readonly CutLine[]) {
    const C = SegmentGrid.CELL
    for (const line of lines) {
      const reach = line.width / 2 + LABEL_CLEARANCE
      const n = line.shape.length
      for (let i = 0; i < n; i++) {
        const a = line.shape[i]!
        const b = line.shape[(i + 1) % n]!
        const seg = { ax: a[0], ay: a[1], bx: b[0], by: b[1], reach }
        for (let cx = Math.floor((Math.min(a[0], b[0]) - reach) / C); cx <= Math.floor((Math.max(a[0], b[0]) + reach) / C); cx++) {
          for (let cy = Math.floor((Math.min(a[1], b[1]) - reach) / C); cy <= Math.floor((Math.max(a[1], b[1]) + reach) / C); cy++) {
            const key = `${cx}:${cy}`
            const list = this.cells.get(key)
            if (list) list.push(seg)
            else this.cells.set(key, [seg])
          }
        }
      }
    }
  }

  /** True when a cut line (with its width and the clearance) reaches the convex polygon. */
  hits(poly: readonly Point[]): boolean {
    const C = SegmentGrid.CELL
    const xs = poly.map((p) => p[0])
    const ys = poly.map((p) => p[1])
    const seen = new Set<Segment>()
    for (let cx = Math.floor(Math.min(...xs) / C); cx <= Math.floor(Math.max(...xs) / C); cx++) {
      for (let cy = Math.floor(Math.min(...ys) / C); cy <= Math.floor(Math.max(...ys) / C); cy++) {
        for (const seg of this.cells.get(`${cx}:${cy}`) ?? []) {
          if (seen.has(seg)) continue
          seen.add(seg)
          if (segmentToConvex(seg, poly) < seg.reach) return true
        }
      }
    }
    return false
  }
}

function pointToSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax
  const dy = by - ay
  const l2 = dx * dx + dy * dy
  const t = l2 > 0 ? Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / l2)) : 0
  return Math.hypot(px - ax - t * dx, py - ay - t * dy)
}

function insideConvex(px: number, py: number, poly: readonly Point[]): boolean {
  let sign = 0
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i]!
    const b = poly[(i + 1) % poly.length]!
    const c = (b[0] - a[0]) * (py - a[1]) - (b[1] - a[1]) * (px - a[0])
    if (c !== 0) {
      if (sign === 0) sign = Math.sign(c)
      else if (Math.sign(c) !== sign) return false
    }
  }
  return true
}

function segmentsCross(a: Point, b: Point, c: Point, d: Point): boolean {
  const o = (p: Point, q: Point, r: Point) => Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]))
  return o(a, b, c) * o(a, b, d) < 0 && o(c, d, a) * o(c, d, b) < 0
}

/** Least distance from a segment to a convex polygon (0 when they meet). */
function segmentToConvex(s: Segment, poly: readonly Point[]): number {
  if (insideConvex(s.ax, s.ay, poly) || insideConvex(s.bx, s.by, poly)) return 0
  let best = Infinity
  for (let i = 0; i < poly.length; i++) {
    const p = poly[i]!
    const q = poly[(i + 1) % poly.length]!
    if (segmentsCross([s.ax, s.ay], [s.bx, s.by], p, q)) return 0
    best = Math.min(best, pointToSegment(p[0], p[1], s.ax, s.ay, s.bx, s.by), pointToSegment(s.ax, s.ay, p[0], p[1], q[0], q[1]), pointToSegment(s.bx, s.by, p[0], p[1], q[0], q[1]))
  }
  return best
}

function shifted(l: HeldLabel, dx: number, dy: number): HeldLabel {
  return { ...l, x: l.x + dx, y: l.y + dy, corners: l.corners.map(([x, y]) => [x + dx, y + dy] as [number, number]) }
}

/**
 * Moves each label that would print over a cut line the least distance (up
 * to `reach` mm, searched outward in rings) to where it is clear, staying
 * inside `within` when given. A label with no clear spot in reach stays put.
 */
export function clearOfCutLines(labels: readonly HeldLabel[], lines: readonly CutLine[], reach = 40, within?: Rect): HeldLabel[] {
  if (lines.length === 0) return labels.slice()
  const grid = new SegmentGrid(lines)
  const fits = (l: HeldLabel) => !within || l.corners.every(([x, y]) => x >= within.minX && x <= within.maxX && y >= within.minY && y <= within.maxY)
  return labels.map((l) => {
    if (!grid.hits(labelBox(l))) return l
    for (let r = 0.5; r <= reach; r += 0.5) {
      const steps = Math.max(8, Math.ceil((2 * Math.PI * r) / 0.75))
      for (let k = 0; k < steps; k++) {
        const a = (2 * Math.PI * k) / steps
        const moved = shifted(l, r * Math.cos(a), r * Math.sin(a))
        if (fits(moved) && !grid.hits(labelBox(moved))) return moved
      }
    }
    return l
  })
}

/** The cut lines of a drawing: its own, or its heaviest `avoid` shapes. */
export function cutLinesOf(drawing: Pick<TiledDrawing, 'avoid' | 'cutLines'>): CutLine[] {
  return drawing.cutLines ?? drawing.avoid.filter((a) => a.weight >= 5).map((a) => ({ shape: a.shape, width: 0.8 }))
}

export interface TiledPdfSettings {
  units: ExportUnits
  meta: TemplateMeta
  font?: FontBytes
}

const FONT = 'F1'
const BODY = 'RpBody'
const MAP = 'RpMap'

function today(): string {
  return new Date().toISOString().slice(0, 10)
}

function metaLine(meta: TemplateMeta, date: string): string {
  return [meta.sizeLabel, meta.revision !== undefined ? `revision ${meta.revision}` : undefined, date]
    .filter((p): p is string => typeof p === 'string' && p !== '')
    .join('  ·  ')
}

function wrap(font: PDFFont, text: string, size: number, width: number): string[] {
  const words = text.split(/\s+/).filter((w) => w !== '')
  const lines: string[] = []
  let line = ''
  for (const word of words) {
    const next = line ? `${line} ${word}` : word
    if (line && encode(font, sanitise(font, next), size).width > width) {
      lines.push(line)
      line = word
    } else line = next
  }
  if (line) lines.push(line)
  return lines
}

/** Cells of the page map as printed sheets show them, scaled into a box. */
interface MapFrame {
  scale: number
  /** Page point of plate point (grid.minX, grid.minY). */
  x0: number
  y0: number
  width: number
  height: number
}

function mapFrame(tiling: Tiling, x: number, y: number, maxW: number, maxH: number): MapFrame {
  const gw = tiling.grid.maxX - tiling.grid.minX
  const gh = tiling.grid.maxY - tiling.grid.minY
  const scale = Math.min(maxW / gw, maxH / gh)
  return { scale, x0: x, y0: y, width: gw * scale, height: gh * scale }
}

function toMap(f: MapFrame, tiling: Tiling, p: Point): Point {
  return [f.x0 + (p[0] - tiling.grid.minX) * f.scale, f.y0 + (p[1] - tiling.grid.minY) * f.scale]
}

function mapRect(f: MapFrame, tiling: Tiling, r: Rect): [number, number, number, number] {
  const [x, y] = toMap(f, tiling, [r.minX, r.minY])
  return [x, y, (r.maxX - r.minX) * f.scale, (r.maxY - r.minY) * f.scale]
}

/** The sheet grid with the drawing's shapes; printed sheets outlined, left-out ones dotted. */
function drawMap(ops: Ops, tiling: Tiling, f: MapFrame, shapes: Point[][], labelSize: number): void {
  for (const s of tiling.sheets) {
    const [x, y, w, h] = mapRect(f, tiling, s.window)
    if (s.empty) {
      ops.style({ colour: COLOURS.reference, width: 0.4, dash: [1, 2] }).rect(x, y, w, h).stroke()
    }
  }
  for (const s of tiling.sheets) {
    if (s.empty) continue
    const [x, y, w, h] = mapRect(f, tiling, s.window)
    ops.style({ colour: COLOURS.guide, width: 0.6 }).rect(x, y, w, h).stroke()
  }
  const tolerance = 0.3 / f.scale
  ops.style({ colour: COLOURS.cut, width: 1.2 })
  for (const shape of shapes) ops.polygon(simplifyClosed(shape, tolerance).map((p) => toMap(f, tiling, p))).stroke()
  if (labelSize > 0) {
    for (const s of tiling.sheets) {
      if (s.empty) continue
      // Label the part of the window no neighbour covers, so labels do not crowd the overlaps.
      const cx = s.window.minX + (tiling.stepX + (s.col === 0 ? 0 : tiling.overlap)) / 2
      const cy = s.window.maxY - (tiling.stepY + (s.row === 0 ? 0 : tiling.overlap)) / 2
      const [px, py] = toMap(f, tiling, [cx, cy])
      ops.text(s.label, px, py - labelSize * 0.35, labelSize, { align: 'center', colour: COLOURS.ink })
    }
  }
}

function legendSwatch(ops: Ops, entry: LegendEntry, x: number, y: number, length: number): void {
  const s = entry.style
  ops
    .style({
      colour: s.colour,
      width: Math.max(s.width * PT_PER_MM, 0.4),
      ...(s.dash ? { dash: s.dash.map((d) => d * PT_PER_MM) } : {}),
    })
    .line(x, y, x + length, y)
    .stroke()
}

function triangle(ops: Ops, x: number, y: number, size: number, direction: 'up' | 'down' | 'left' | 'right', colour: Rgb): void {
  const h = size
  const w = size * 0.6
  const pts: Point[] =
    direction === 'up'
      ? [[x, y + h / 2], [x - w, y - h / 2], [x + w, y - h / 2]]
      : direction === 'down'
        ? [[x, y - h / 2], [x - w, y + h / 2], [x + w, y + h / 2]]
        : direction === 'left'
          ? [[x - h / 2, y], [x + h / 2, y + w], [x + h / 2, y - w]]
          : [[x + h / 2, y], [x - h / 2, y + w], [x - h / 2, y - w]]
  ops.fillColour(colour).polygon(pts).fill()
}

function registrationCross(ops: Ops, x: number, y: number): void {
  const arm = 5 * PT_PER_MM
  ops.style({ colour: COLOURS.ink, width: 0.5 }).circle(x, y, 2.2 * PT_PER_MM).cross(x, y, arm).stroke()
}

function coverSize(tiling: Tiling): [number, number] {
  const spec = PAPERS[tiling.paper]
  if (spec.height !== null) return [spec.width * PT_PER_MM, spec.height * PT_PER_MM]
  // A roll has no sheet size of its own: a cover as wide as the roll, in Letter proportions.
  return [spec.width * PT_PER_MM, spec.width * PT_PER_MM * (11 / 8.5)]
}

function drawCover(
  ops: Ops,
  font: PDFFont,
  drawing: TiledDrawing,
  tiling: Tiling,
  settings: TiledPdfSettings,
  date: string,
  size: [number, number],
): void {
  const [W, H] = size
  const { units, meta } = settings
  const m = tiling.margin * PT_PER_MM + 18
  const width = W - 2 * m
  let y = H - m

  ops.text(`ROOTPLATE  ·  ${drawing.title.toUpperCase()}`, m, y - 9, 9, { colour: COLOURS.accent })
  y -= 34
  ops.text(meta.designName, m, y, 22)
  y -= 16
  ops.text(metaLine(meta, date), m, y, 10.5, { colour: COLOURS.muted })
  y -= 16

  const warnLines = wrap(
    font,
    'Before cutting, measure both squares below: their sides must be exactly 1 in and exactly 25 mm. If either is off, correct the print settings and print again.',
    9.5,
    width - 20,
  )
  const boxH = 34 + warnLines.length * 12
  ops.fillColour(COLOURS.warnTint).rect(m, y - boxH, width, boxH).fill()
  ops.style({ colour: COLOURS.warn, width: 1.2 }).rect(m, y - boxH, width, boxH).stroke()
  ops.text('Print at 100 % (actual size): no "fit to page", no shrinking, no scaling.', m + 10, y - 20, 12.5, {
    colour: COLOURS.warn,
  })
  warnLines.forEach((line, i) => ops.text(line, m + 10, y - 36 - i * 12, 9.5))
  y -= boxH + 10

  if (drawing.alerts) {
    // At most five problems listed: enough to see what is wrong; the editor has the rest.
    const shown = drawing.alerts.lines.slice(0, 5)
    const more = drawing.alerts.lines.length - shown.length
    const body = [...shown.map((l) => `- ${l}`), ...(more > 0 ? [`and ${more} more: open the design in Rootplate.`] : [])]
      .flatMap((l) => wrap(font, l, 8.5, width - 20))
    const alertH = 26 + body.length * 10.5
    ops.fillColour(COLOURS.warnTint).rect(m, y - alertH, width, alertH).fill()
    ops.style({ colour: COLOURS.warn, width: 2 }).rect(m, y - alertH, width, alertH).stroke()
    ops.text(drawing.alerts.heading, m + 10, y - 16, 11, { colour: COLOURS.warn })
    body.forEach((line, i) => ops.text(line, m + 10, y - 30 - i * 10.5, 8.5))
    y -= alertH + 10
  }
  y -= 12

  // The scale squares, exactly 1 in and 25 mm.
  const inch = 72
  const mm25 = 25 * PT_PER_MM
  const sqTop = y
  ops.style({ colour: COLOURS.ink, width: 0.75 }).rect(m, sqTop - inch, inch, inch).stroke()
  ops.text('1 in', m + inch / 2, sqTop - inch / 2 - 4, 11, { align: 'center' })
  ops.text('1 in square', m + inch / 2, sqTop - inch - 12, 8, { align: 'center', colour: COLOURS.muted })
  const sx = m + inch + 22
  ops.style({ colour: COLOURS.ink, width: 0.75 }).rect(sx, sqTop - mm25, mm25, mm25).stroke()
  ops.text('25 mm', sx + mm25 / 2, sqTop - mm25 / 2 - 4, 11, { align: 'center' })
  ops.text('25 mm square', sx + mm25 / 2, sqTop - inch - 12, 8, { align: 'center', colour: COLOURS.muted })

  const tx = sx + mm25 + 26
  const textWidth = W - m - tx
  const spec = PAPERS[tiling.paper]
  const left = tiling.sheets.length - tiling.printed
  const summary = [
    `${tiling.printed} sheet${tiling.printed === 1 ? '' : 's'} of ${spec.label}, ${tiling.orientation}` +
      (spec.height === null ? `, each ${formatTapeLength(tiling.pageHeight, units)} by ${formatTapeLength(tiling.pageWidth, units)}` : '') +
      ` (grid ${tiling.rows} x ${tiling.cols}${left > 0 ? `, ${left} empty left out` : ''}).`,
    `Margin ${formatTapeLength(tiling.margin, units)}, overlap ${formatTapeLength(tiling.overlap, units)}. Sheets are named by row and column: R1-C2 is row 1 (rows counted from the top), column 2 (columns counted from the left).`,
  ]
  const steps = [
    '1. Trim each sheet along its dashed trim lines (left and top edges).',
    '2. Lay it over its neighbour: the trimmed edge on the neighbour\'s match line, the crosses on each other. Tape.',
    '3. The labels at each edge name the neighbouring sheet; the small map shows where each sheet goes.',
  ]
  let ty = sqTop - 9
  if (drawing.cutList?.length) {
    ops.text('Cut list', tx, ty, 9, { colour: COLOURS.accent })
    ty -= 13
  }
  for (const para of [...(drawing.cutList ?? []), ...summary, ...steps, ...drawing.notes]) {
    for (const line of wrap(font, para, 8.5, textWidth)) {
      ops.text(line, tx, ty, 8.5)
      ty -= 11
    }
    ty -= 3
  }
  y = Math.min(sqTop - inch - 30, ty - 8)

  // Legend along the foot of the page, two columns.
  const legendRows = Math.ceil(drawing.legend.length / 2)
  const legendH = legendRows * 13 + 16
  const legendTop = m + legendH
  ops.text('Lines', m, legendTop - 4, 9, { colour: COLOURS.accent })
  drawing.legend.forEach((entry, i) => {
    const col = i % 2
    const row = Math.floor(i / 2)
    const lx = m + col * (width / 2)
    const ly = legendTop - 18 - row * 13
    legendSwatch(ops, entry, lx, ly + 3, 30)
    ops.text(entry.label, lx + 38, ly, 8.5)
  })

  // The page map fills what is left between the squares and the legend.
  const mapTop = y - 14
  ops.text('Page map (dotted cells are left out: nothing on them that another sheet does not carry)', m, mapTop + 2, 9, {
    colour: COLOURS.accent,
  })
  const mapH = mapTop - 8 - (legendTop + 14)
  if (mapH > 40) {
    const probe = mapFrame(tiling, 0, 0, width, mapH)
    const f = mapFrame(tiling, m + (width - probe.width) / 2, legendTop + 14 + (mapH - probe.height) / 2, width, mapH)
    const cell = Math.min(tiling.stepX, tiling.stepY) * f.scale
    drawMap(ops, tiling, f, drawing.mapShapes, Math.max(5, Math.min(12, cell * 0.32)))
  }
}

function drawSheet(
  ops: Ops,
  tiling: Tiling,
  sheet: Sheet,
  index: number,
  crosses: Point[],
  settings: TiledPdfSettings,
  date: string,
  mapSize: [number, number],
  drawing: Pick<TiledDrawing, 'avoid' | 'alerts' | 'sheetNote' | 'cutLines'>,
  labels: readonly HeldLabel[],
): void {
  const { avoid } = drawing
  const k = PT_PER_MM
  const wx = tiling.margin * k
  const wy = tiling.margin * k
  const ww = tiling.printableWidth * k
  const wh = tiling.printableHeight * k
  const o = tiling.overlap * k
  const n = sheet.neighbours

  // The strips a neighbour will cover, lightly tinted so the overlap can be seen at a glance.
  ops.fillColour(COLOURS.tint)
  if (n.right && o > 0) ops.rect(wx + ww - o, wy, o, wh).fill()
  if (n.below && o > 0) ops.rect(wx, wy, ww, o).fill()

  const t = sheetTransform(tiling, sheet)
  const toPlate = (x: number, y: number): Point => [(x - t.tx) / t.scale, (y - t.ty) / t.scale]
  const grid = new SegmentGrid(cutLinesOf(drawing))
  /** True when no cut line runs under the page box [x0, y0, x1, y1] (pt). */
  const clearBox = (x0: number, y0: number, x1: number, y1: number): boolean => {
    const [ax, ay] = toPlate(x0, y0)
    const [bx, by] = toPlate(x1, y1)
    return !grid.hits([[ax, ay], [bx, ay], [bx, by], [ax, by]])
  }
  /** The first offset along an edge (0, then further out either way) at which the box is clear; 0 when none is. */
  const slide = (limit: number, boxAt: (d: number) => [number, number, number, number]): number => {
    for (let d = 0; d <= limit; d += 6) {
      for (const s of d === 0 ? [0] : [d, -d]) if (clearBox(...boxAt(s))) return s
    }
    return 0
  }
  ops.save().rect(wx, wy, ww, wh).clip().transformExact(t.scale, 0, 0, t.scale, t.tx, t.ty).drawObject(BODY)
  for (const l of labels) ops.text(l.text, l.x, l.y, l.size, l.options)
  ops.restore()

  const trim: LineStyle = { colour: COLOURS.guide, width: 0.7, dash: [6, 3] }
  const match: LineStyle = { colour: COLOURS.guide, width: 0.5 }
  // Edge words slide along their edge to a stretch no cut line crosses (font box: 0.3 below, 1.05 above the baseline).
  // Where the whole sentence finds no clear stretch, its first word alone (the arrow names the neighbour).
  const uprightWords = (text: string, x: number, y: number) => {
    for (const t of [text, text.split(/\s/)[0]!]) {
      const w = ops.textWidth(t, 7)
      const box = (d: number): [number, number, number, number] => [x - 1.05 * 7, y + d - w / 2, x + 0.3 * 7, y + d + w / 2]
      const d = slide(wh / 2 - w / 2 - 4, box)
      if (clearBox(...box(d)) || t !== text) return ops.text(t, x, y + d, 7, { angle: 90, align: 'center', colour: COLOURS.muted })
    }
  }
  const levelWords = (text: string, x: number, y: number) => {
    for (const t of [text, text.split(/\s/)[0]!]) {
      const w = ops.textWidth(t, 7)
      const box = (d: number): [number, number, number, number] => [x + d - w / 2, y - 0.3 * 7, x + d + w / 2, y + 1.05 * 7]
      const d = slide(ww / 2 - w / 2 - 4, box)
      if (clearBox(...box(d)) || t !== text) return ops.text(t, x + d, y, 7, { align: 'center', colour: COLOURS.muted })
    }
  }
  if (n.left) {
    ops.style(trim).line(wx, wy, wx, wy + wh).stroke()
    uprightWords(`trim  ·  this edge goes on the match line of ${n.left}`, wx + 8, wy + wh / 2)
  }
  if (n.above) {
    ops.style(trim).line(wx, wy + wh, wx + ww, wy + wh).stroke()
    levelWords(`trim  ·  this edge goes on the match line of ${n.above}`, wx + ww / 2, wy + wh - 11)
  }
  if (n.right) {
    ops.style(match).line(wx + ww - o, wy, wx + ww - o, wy + wh).stroke()
    uprightWords(`match line: trimmed edge of ${n.right} here`, wx + ww - o + 9, wy + wh / 2)
  }
  if (n.below) {
    ops.style(match).line(wx, wy + o, wx + ww, wy + o).stroke()
    levelWords(`match line: trimmed edge of ${n.below} here`, wx + ww / 2, wy + o - 10)
  }

  for (const p of crosses) {
    if (!rectContains(sheet.window, p)) continue
    registrationCross(ops, p[0] * t.scale + t.tx, p[1] * t.scale + t.ty)
  }

  // Neighbour labels, just inside the overlap strips.
  const cx = wx + ww / 2
  const cy = wy + wh / 2
  const inset = o + 16
  const label = 13
  // Each slides along its edge, like the edge words, to where no cut line runs under the arrow or the name.
  if (n.above) {
    const w = ops.textWidth(n.above, label)
    const y = wy + wh - inset
    const d = slide(ww / 2 - w, (d) => [cx + d - w / 2, y - 18 - 0.3 * label, cx + d + w / 2, y + 5])
    triangle(ops, cx + d, y, 8, 'up', COLOURS.accent)
    ops.text(n.above, cx + d, y - 18, label, { align: 'center', colour: COLOURS.accent })
  }
  if (n.below) {
    const w = ops.textWidth(n.below, label)
    const y = wy + inset
    const d = slide(ww / 2 - w, (d) => [cx + d - w / 2, y - 5, cx + d + w / 2, y + 9 + 1.05 * label])
    triangle(ops, cx + d, y, 8, 'down', COLOURS.accent)
    ops.text(n.below, cx + d, y + 9, label, { align: 'center', colour: COLOURS.accent })
  }
  if (n.left) {
    const w = ops.textWidth(n.left, label)
    const x = wx + inset
    const d = slide(wh / 2 - 20, (d) => [x - 5, cy + d - 0.65 * label, x + 8 + w, cy + d + 0.7 * label])
    triangle(ops, x, cy + d, 8, 'left', COLOURS.accent)
    ops.text(n.left, x + 8, cy + d - label * 0.35, label, { colour: COLOURS.accent })
  }
  if (n.right) {
    const w = ops.textWidth(n.right, label)
    const x = wx + ww - inset
    const d = slide(wh / 2 - 20, (d) => [x - 8 - w, cy + d - 0.65 * label, x + 5, cy + d + 0.7 * label])
    triangle(ops, x, cy + d, 8, 'right', COLOURS.accent)
    ops.text(n.right, x - 8, cy + d - label * 0.35, label, { align: 'right', colour: COLOURS.accent })
  }

  // Title block in a corner clear of the strips, preferring one no outline runs through.
  const labelWidth = ops.textWidth(sheet.label, 30)
  const info = [
    settings.meta.designName,
    metaLine(settings.meta, date),
    `sheet ${index} of ${tiling.printed}  ·  full size 1:1`,
    ...(drawing.sheetNote ? [drawing.sheetNote] : []),
    ...(drawing.alerts ? [drawing.alerts.heading] : []),
  ]
  const textW = labelWidth + 10 + Math.max(...info.map((line) => ops.textWidth(line, 7.5)))
  const infoH = 38 + Math.max(0, info.length - 3) * 9.5
  // Full: the location map and scale bars under the words (room right of the map for the upright bars).
  // Compact, where no spot clear of the cut lines holds the full block: the words alone.
  const sizes = [
    { w: Math.max(mapSize[0] + VERTICAL_BARS_WIDTH, 100, textW), h: infoH + Math.max(mapSize[1] + 26, 72 + 4), full: true },
    { w: textW, h: infoH, full: false },
    { w: labelWidth + 4, h: 30, full: false, only: true },
  ]
  const rectAt = (x: number, y: number, w: number, h: number): Rect => {
    const [minX, minY] = toPlate(x - 4, y - h - 4)
    const [maxX, maxY] = toPlate(x + w + 4, y + 4)
    return { minX, minY, maxX, maxY }
  }
  const clear = (r: Rect) => !grid.hits([[r.minX, r.minY], [r.maxX, r.minY], [r.maxX, r.maxY], [r.minX, r.maxY]])
  const score = (r: Rect) => avoid.reduce((sum, a) => sum + (edgesTouchRect(a.shape, r) ? a.weight : 0), 0)
  let chosen: { x: number; y: number; w: number; h: number; full: boolean; only?: boolean } | null = null
  let fallback: { x: number; y: number; w: number; h: number; full: boolean; score: number } | null = null
  for (const size of sizes) {
    const left = wx + o + 10
    const right = wx + ww - o - 10 - size.w
    const top = wy + wh - o - 10
    const bottom = wy + o + 10 + size.h
    if (right < left || bottom > top) continue
    // The corners first (where a reader looks), then anywhere on a 12 pt grid.
    const spots: [number, number][] = [[left, top], [right, top], [left, bottom], [right, bottom]]
    for (let y = top; y >= bottom; y -= 12) for (let x = left; x <= right; x += 12) spots.push([x, y])
    let best: { x: number; y: number; score: number } | null = null
    for (const [x, y] of spots) {
      const r = rectAt(x, y, size.w, size.h)
      const sc = score(r)
      if (!clear(r)) {
        // Nowhere clear at all: the full block where it crosses the fewest lines.
        if (size.full && (!fallback || sc < fallback.score)) fallback = { x, y, ...size, score: sc }
        continue
      }
      if (!best || sc < best.score) best = { x, y, score: sc }
      if (sc === 0) break
    }
    if (best) {
      chosen = { x: best.x, y: best.y, ...size }
      break
    }
  }
  const block = chosen ?? fallback ?? { x: wx + o + 10, y: wy + wh - o - 10, ...sizes[0]! }
  const blockW = block.w
  const bx = block.x
  let by = block.y
  ops.text(sheet.label, bx, by - 26, 30, { colour: COLOURS.accent })
  // Where only the sheet's name finds a clear spot, the words go without: the cover and the other sheets carry them.
  const nameOnly = 'only' in block && block.only
  if (!nameOnly) info.forEach((line, i) => {
    const alert = drawing.alerts && i === info.length - 1
    ops.text(line, bx + labelWidth + 10, by - 8 - i * 9.5, 7.5, { colour: alert ? COLOURS.warn : i === 0 ? COLOURS.ink : COLOURS.muted })
  })
  by -= infoH
  const mm = 25 * k
  /** The level bars from (x, y) down, the upright ones at ux from y down. */
  const bars = (x: number, levelTop: number, ux: number, vTop: number) => {
    // A short scale bar: a quick check with a tape on any sheet.
    const sy = levelTop
    ops.style({ colour: COLOURS.ink, width: 0.6 }).line(x, sy, x + 72, sy).line(x, sy - 3, x, sy + 3).line(x + 72, sy - 3, x + 72, sy + 3).stroke()
    ops.text('1 in', x + 76, sy - 2.5, 7, { colour: COLOURS.muted })
    const s2 = sy - 10
    ops.style({ colour: COLOURS.ink, width: 0.6 }).line(x, s2, x + mm, s2).line(x, s2 - 3, x, s2 + 3).line(x + mm, s2 - 3, x + mm, s2 + 3).stroke()
    ops.text('25 mm', x + mm + 4, s2 - 2.5, 7, { colour: COLOURS.muted })
    // The same two bars upright: a printer that scales one direction only shows it here.
    const upright = (ux: number, length: number, label: string) => {
      ops.style({ colour: COLOURS.ink, width: 0.6 }).line(ux, vTop, ux, vTop - length).line(ux - 3, vTop, ux + 3, vTop).line(ux - 3, vTop - length, ux + 3, vTop - length).stroke()
      ops.text(label, ux + 9, vTop - length / 2, 7, { angle: 90, align: 'center', colour: COLOURS.muted })
    }
    upright(ux, 72, '1 in')
    upright(ux + 18, mm, '25 mm')
  }
  if (!block.full) {
    // No room for the whole block clear of the cut lines: the bars go on their own, where they are clear
    // (a 130 x 100 pt box: the upright bars right of the level ones), every sheet keeps its scale check.
    const BW = 140
    const BH = 100
    const spots: [number, number][] = []
    for (let y = wy + wh - o - 10; y >= wy + o + 10 + BH; y -= 12) for (let x = wx + o + 10; x <= wx + ww - o - 10 - BW; x += 12) spots.push([x, y])
    // Clear of the cut lines, and of the other lines (caster plates, rings) as far as can be.
    let spot: [number, number] = [wx + o + 10, wy + o + 10 + BH]
    let least = Infinity
    for (const [x, y] of spots) {
      if (!clearBox(x - 4, y - BH - 4, x + BW + 4, y + 4)) continue
      const sc = score(rectAt(x, y, BW, BH))
      if (sc < least) { least = sc; spot = [x, y] }
      if (sc === 0) break
    }
    bars(spot[0], spot[1] - 80, spot[0] + 110, spot[1])
    return
  }
  const mh = mapSize[1]
  ops.save().transform(1, 0, 0, 1, bx, by - mh).drawObject(MAP).restore()
  const f = locationFrame(tiling, mapSize)
  const [rx, ry, rw, rh] = mapRect(f, tiling, sheet.window)
  ops.fillColour(COLOURS.accent).rect(bx + rx, by - mh + ry, rw, rh).fill()
  ops.style({ colour: COLOURS.paper, width: 0.5 }).rect(bx + rx, by - mh + ry, rw, rh).stroke()
  bars(bx, by - mh - 14, bx + blockW - VERTICAL_BARS_WIDTH + 10, by)
}

/**
 * Each label goes on every printed sheet that holds it whole, and nowhere in
 * part. A label no printed sheet holds whole is moved the least distance into
 * the printed sheet nearest to it (its text stays within a few mm of what it
 * names, on a sheet that is printed); one larger than a sheet is left whole
 * across the sheets it touches.
 */
export function placeLabels(labels: readonly HeldLabel[], tiling: Tiling): Map<Sheet, HeldLabel[]> {
  const printed = tiling.sheets.filter((s) => !s.empty)
  const out = new Map<Sheet, HeldLabel[]>(printed.map((s) => [s, []]))
  const inset = 0.5
  const holds = (s: Sheet, l: HeldLabel) => l.corners.every(([x, y]) => x >= s.window.minX + inset && x <= s.window.maxX - inset && y >= s.window.minY + inset && y <= s.window.maxY - inset)
  for (const label of labels) {
    let l = label
    if (!printed.some((s) => holds(s, l))) {
      let best: { dx: number; dy: number; cost: number } | null = null
      const xs = l.corners.map((c) => c[0])
      const ys = l.corners.map((c) => c[1])
      const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)]
      for (const s of printed) {
        const w = s.window
        if (maxX - minX > w.maxX - w.minX - 2 * inset || maxY - minY > w.maxY - w.minY - 2 * inset) continue
        const dx = minX < w.minX + inset ? w.minX + inset - minX : maxX > w.maxX - inset ? w.maxX - inset - maxX : 0
        const dy = minY < w.minY + inset ? w.minY + inset - minY : maxY > w.maxY - inset ? w.maxY - inset - maxY : 0
        const cost = Math.hypot(dx, dy)
        if (!best || cost < best.cost) best = { dx, dy, cost }
      }
      if (best) {
        const { dx, dy } = best
        l = { ...l, x: l.x + dx, y: l.y + dy, corners: l.corners.map(([x, y]) => [x + dx, y + dy] as [number, number]) }
      }
    }
    const on = printed.filter((s) => holds(s, l))
    // Larger than any sheet: drawn as before, across the sheets it touches, rather than lost.
    for (const s of on.length ? on : printed.filter((p) => polygonTouchesRect(l.corners, p.window))) out.get(s)!.push(l)
  }
  return out
}

/** The body's labels sheet by sheet: moved off the cut lines, each whole on the sheets that print it. */
export function sheetLabels(labels: readonly HeldLabel[], drawing: Pick<TiledDrawing, 'avoid' | 'cutLines'>, tiling: Tiling): Map<Sheet, HeldLabel[]> {
  const cuts = cutLinesOf(drawing)
  const perSheet = placeLabels(clearOfCutLines(labels, cuts), tiling)
  // A label moved onto a sheet may land on a cut line again: cleared once more, kept on its sheet.
  for (const [sheet, held] of perSheet) perSheet.set(sheet, clearOfCutLines(held, cuts, 20, sheet.window))
  return perSheet
}

/** Width kept right of the location map for the two upright scale bars, pt. */
const VERTICAL_BARS_WIDTH = 40

function locationFrame(tiling: Tiling, mapSize: [number, number]): MapFrame {
  return mapFrame(tiling, 0, 0, mapSize[0], mapSize[1])
}

/** Render a tiled drawing to PDF bytes: cover first, then printed sheets row by row. */
export async function renderTiledPdf(drawing: TiledDrawing, tiling: Tiling, settings: TiledPdfSettings): Promise<Uint8Array> {
  const date = settings.meta.date ?? today()
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  const font = await doc.embedFont(await unpackWoff(await resolveFontBytes(settings.font)), { subset: true })
  const title = `${settings.meta.designName} - ${drawing.title}`
  doc.setTitle(title)
  doc.setCreator('Rootplate')
  doc.setProducer('Rootplate')
  const ctx = doc.context
  const register = (content: string, dict: Record<string, unknown> = {}): PDFRef =>
    ctx.register(ctx.flateStream(content, dict as never))

  const bodyOps = new Ops(font, FONT)
  const labels: HeldLabel[] = []
  drawing.drawBody(bodyOps.holdLabels(labels))
  const perSheet = sheetLabels(labels, drawing, tiling)
  // Labels may run past the content bounds; the box only has to contain what is drawn.
  const b = tiling.grid
  const spill = 500
  const bodyRef = register(bodyOps.toString(), {
    Type: 'XObject',
    Subtype: 'Form',
    BBox: [b.minX - spill, b.minY - spill, b.maxX + spill, b.maxY + spill],
    Resources: { Font: { [FONT]: font.ref } },
  })

  const gw = tiling.grid.maxX - tiling.grid.minX
  const gh = tiling.grid.maxY - tiling.grid.minY
  const mapSize: [number, number] = gw >= gh ? [90, Math.max(20, (90 * gh) / gw)] : [Math.max(20, (70 * gw) / gh), 70]
  const mapOps = new Ops(font, FONT)
  drawMap(mapOps, tiling, locationFrame(tiling, mapSize), drawing.mapShapes, 0)
  const mapRef = register(mapOps.toString(), {
    Type: 'XObject',
    Subtype: 'Form',
    BBox: [-2, -2, mapSize[0] + 2, mapSize[1] + 2],
  })

  const fontName = PDFName.of(FONT)
  const cover = doc.addPage(coverSize(tiling))
  const coverOps = new Ops(font, FONT)
  drawCover(coverOps, font, drawing, tiling, settings, date, coverSize(tiling))
  cover.node.addContentStream(register(coverOps.toString()))
  cover.node.setFontDictionary(fontName, font.ref)

  const crosses = registrationPoints(tiling)
  const size = pageSizePt(tiling)
  let index = 0
  for (const sheet of tiling.sheets) {
    if (sheet.empty) continue
    index++
    const page = doc.addPage(size)
    const ops = new Ops(font, FONT)
    drawSheet(ops, tiling, sheet, index, crosses, settings, date, mapSize, drawing, perSheet.get(sheet) ?? [])
    page.node.addContentStream(register(ops.toString()))
    page.node.setFontDictionary(fontName, font.ref)
    page.node.setXObject(PDFName.of(BODY), bodyRef)
    page.node.setXObject(PDFName.of(MAP), mapRef)
  }
  return doc.save()
}

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
import { formatShopLength, PT_PER_MM, type ExportUnits } from './units'

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
      (spec.height === null ? `, each ${formatShopLength(tiling.pageHeight, units)} by ${formatShopLength(tiling.pageWidth, units)}` : '') +
      ` (grid ${tiling.rows} x ${tiling.cols}${left > 0 ? `, ${left} empty left out` : ''}).`,
    `Margin ${formatShopLength(tiling.margin, units)}, overlap ${formatShopLength(tiling.overlap, units)}. Sheets are named by row and column: R1-C2 is row 1 (rows counted from the top), column 2 (columns counted from the left).`,
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
  drawing: Pick<TiledDrawing, 'avoid' | 'alerts' | 'sheetNote'>,
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
  ops.save().rect(wx, wy, ww, wh).clip().transformExact(t.scale, 0, 0, t.scale, t.tx, t.ty).drawObject(BODY)
  for (const l of labels) ops.text(l.text, l.x, l.y, l.size, l.options)
  ops.restore()

  const trim: LineStyle = { colour: COLOURS.guide, width: 0.7, dash: [6, 3] }
  const match: LineStyle = { colour: COLOURS.guide, width: 0.5 }
  if (n.left) {
    ops.style(trim).line(wx, wy, wx, wy + wh).stroke()
    ops.text(`trim  ·  this edge goes on the match line of ${n.left}`, wx + 8, wy + wh / 2, 7, {
      angle: 90,
      align: 'center',
      colour: COLOURS.muted,
    })
  }
  if (n.above) {
    ops.style(trim).line(wx, wy + wh, wx + ww, wy + wh).stroke()
    ops.text(`trim  ·  this edge goes on the match line of ${n.above}`, wx + ww / 2, wy + wh - 11, 7, {
      align: 'center',
      colour: COLOURS.muted,
    })
  }
  if (n.right) {
    ops.style(match).line(wx + ww - o, wy, wx + ww - o, wy + wh).stroke()
    ops.text(`match line: trimmed edge of ${n.right} here`, wx + ww - o + 9, wy + wh / 2, 7, {
      angle: 90,
      align: 'center',
      colour: COLOURS.muted,
    })
  }
  if (n.below) {
    ops.style(match).line(wx, wy + o, wx + ww, wy + o).stroke()
    ops.text(`match line: trimmed edge of ${n.below} here`, wx + ww / 2, wy + o - 10, 7, {
      align: 'center',
      colour: COLOURS.muted,
    })
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
  if (n.above) {
    triangle(ops, cx, wy + wh - inset, 8, 'up', COLOURS.accent)
    ops.text(n.above, cx, wy + wh - inset - 18, label, { align: 'center', colour: COLOURS.accent })
  }
  if (n.below) {
    triangle(ops, cx, wy + inset, 8, 'down', COLOURS.accent)
    ops.text(n.below, cx, wy + inset + 9, label, { align: 'center', colour: COLOURS.accent })
  }
  if (n.left) {
    triangle(ops, wx + inset, cy, 8, 'left', COLOURS.accent)
    ops.text(n.left, wx + inset + 8, cy - label * 0.35, label, { colour: COLOURS.accent })
  }
  if (n.right) {
    triangle(ops, wx + ww - inset, cy, 8, 'right', COLOURS.accent)
    ops.text(n.right, wx + ww - inset - 8, cy - label * 0.35, label, { align: 'right', colour: COLOURS.accent })
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
  // Room right of the map for the upright scale bars, and below it for the level ones.
  const blockW = Math.max(mapSize[0] + VERTICAL_BARS_WIDTH, 100, labelWidth + 10 + Math.max(...info.map((line) => ops.textWidth(line, 7.5))))
  const blockH = 38 + Math.max(0, info.length - 3) * 9.5 + Math.max(mapSize[1] + 26, 72 + 4)
  const left = wx + o + 10
  const right = wx + ww - o - 10 - blockW
  const top = wy + wh - o - 10
  const bottom = wy + o + 10 + blockH
  const corners: [number, number][] = [
    [left, top],
    [right, top],
    [left, bottom],
    [right, bottom],
  ]
  const toPlate = (x: number, y: number): Point => [(x - t.tx) / t.scale, (y - t.ty) / t.scale]
  let best = corners[0]!
  let bestScore = Infinity
  for (const corner of corners) {
    const [x, y] = corner
    const [minX, minY] = toPlate(x - 4, y - blockH - 4)
    const [maxX, maxY] = toPlate(x + blockW + 4, y + 4)
    const r = { minX, minY, maxX, maxY }
    const score = avoid.reduce((sum, a) => sum + (edgesTouchRect(a.shape, r) ? a.weight : 0), 0)
    if (score < bestScore) {
      best = corner
      bestScore = score
    }
    if (score === 0) break
  }
  const [bx, blockTop] = best
  let by = blockTop
  ops.text(sheet.label, bx, by - 26, 30, { colour: COLOURS.accent })
  info.forEach((line, i) => {
    const alert = drawing.alerts && i === info.length - 1
    ops.text(line, bx + labelWidth + 10, by - 8 - i * 9.5, 7.5, { colour: alert ? COLOURS.warn : i === 0 ? COLOURS.ink : COLOURS.muted })
  })
  by -= 38 + Math.max(0, info.length - 3) * 9.5
  const mh = mapSize[1]
  ops.save().transform(1, 0, 0, 1, bx, by - mh).drawObject(MAP).restore()
  const f = locationFrame(tiling, mapSize)
  const [rx, ry, rw, rh] = mapRect(f, tiling, sheet.window)
  ops.fillColour(COLOURS.accent).rect(bx + rx, by - mh + ry, rw, rh).fill()
  ops.style({ colour: COLOURS.paper, width: 0.5 }).rect(bx + rx, by - mh + ry, rw, rh).stroke()

  // A short scale bar: a quick check with a tape on any sheet.
  const sy = by - mh - 14
  ops.style({ colour: COLOURS.ink, width: 0.6 }).line(bx, sy, bx + 72, sy).line(bx, sy - 3, bx, sy + 3).line(bx + 72, sy - 3, bx + 72, sy + 3).stroke()
  ops.text('1 in', bx + 76, sy - 2.5, 7, { colour: COLOURS.muted })
  const s2 = sy - 10
  const mm = 25 * k
  ops.style({ colour: COLOURS.ink, width: 0.6 }).line(bx, s2, bx + mm, s2).line(bx, s2 - 3, bx, s2 + 3).line(bx + mm, s2 - 3, bx + mm, s2 + 3).stroke()
  ops.text('25 mm', bx + mm + 4, s2 - 2.5, 7, { colour: COLOURS.muted })

  // The same two bars upright: a printer that scales one direction only shows it here.
  const vx = bx + blockW - VERTICAL_BARS_WIDTH + 10
  const vTop = by
  const upright = (x: number, length: number, label: string) => {
    ops.style({ colour: COLOURS.ink, width: 0.6 }).line(x, vTop, x, vTop - length).line(x - 3, vTop, x + 3, vTop).line(x - 3, vTop - length, x + 3, vTop - length).stroke()
    ops.text(label, x + 9, vTop - length / 2, 7, { angle: 90, align: 'center', colour: COLOURS.muted })
  }
  upright(vx, 72, '1 in')
  upright(vx + 18, mm, '25 mm')
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
  const perSheet = placeLabels(labels, tiling)
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

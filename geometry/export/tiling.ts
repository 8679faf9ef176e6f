// How a full-scale drawing is split over sheets of paper. Pure and cheap: the
// export panel calls it on every change for its live preview, and the PDF
// writers use exactly the same result, so the preview never disagrees with
// the file. All lengths in millimetres, plate coordinates (y up).

import type { Plate, Point } from '../types'
import { MM_PER_INCH } from '../units'
import { PT_PER_MM } from './units'

export type PaperName =
  | 'letter'
  | 'legal'
  | 'tabloid'
  | 'a4'
  | 'a3'
  | 'roll-24in'
  | 'roll-36in'
  | 'roll-914mm'

export type Orientation = 'portrait' | 'landscape'

export interface PaperSpec {
  label: string
  /** Short side of a cut sheet, or the width of a roll, mm. */
  width: number
  /** Long side of a cut sheet; null for a roll, whose length is cut as needed. */
  height: number | null
}

/**
 * Letter 8.5x11 in and Tabloid 11x17 in (ASME Y14.1 sizes A and B), Legal
 * 8.5x14 in (common North American practice), A4 210x297 mm and A3 297x420 mm
 * (ISO 216), plotter rolls by their nominal width.
 */
export const PAPERS: Readonly<Record<PaperName, PaperSpec>> = {
  letter: { label: 'Letter', width: 8.5 * MM_PER_INCH, height: 11 * MM_PER_INCH },
  legal: { label: 'Legal', width: 8.5 * MM_PER_INCH, height: 14 * MM_PER_INCH },
  tabloid: { label: 'Tabloid', width: 11 * MM_PER_INCH, height: 17 * MM_PER_INCH },
  a4: { label: 'A4', width: 210, height: 297 },
  a3: { label: 'A3', width: 297, height: 420 },
  'roll-24in': { label: '24 in roll', width: 24 * MM_PER_INCH, height: null },
  'roll-36in': { label: '36 in roll', width: 36 * MM_PER_INCH, height: null },
  'roll-914mm': { label: '914 mm roll', width: 914, height: null },
}

export const PAPER_NAMES = Object.keys(PAPERS) as PaperName[]

/** 14,400 default user-space units = 200 in: the largest PDF page (ISO 32000-1, Annex C). */
export const MAX_PAGE_LENGTH = 200 * MM_PER_INCH

/** 1/4 in: a printable margin most printers honour (common practice). */
export const DEFAULT_MARGIN = 6.35
/** 1/2 in of overlap between neighbouring sheets for taping. */
export const DEFAULT_OVERLAP = 12.7
/** Clear space kept round the drawing so a heavy line never sits on a trim edge. */
export const DEFAULT_PAD = 4

/** Smallest useful advance from one sheet to the next; less means margin and overlap eat the sheet. */
const MIN_STEP = 20

export interface Rect {
  minX: number
  minY: number
  maxX: number
  maxY: number
}

export interface TilingOptions {
  paper: PaperName
  /** Default 'auto': whichever orientation prints fewer sheets (then fewer grid cells, then portrait). */
  orientation?: 'auto' | Orientation
  /** Blank border the printer cannot reach, mm, each side. Default 6.35 (1/4 in). */
  margin?: number
  /** Printed strip shared by neighbouring sheets, mm. Default 12.7 (1/2 in). */
  overlap?: number
  /**
   * Where the content sits in the grid's spare height. Default 'centre';
   * 'bottom' leaves the spare paper at the top, clear for the sheet's title block.
   */
  anchor?: 'centre' | 'bottom'
}

/** What is to be tiled: its extent and the closed shapes that decide whether a sheet is empty. */
export interface TileContent {
  bounds: Rect
  /** Closed polygons (first point not repeated). A sheet touching none of them, inside or on an edge, is empty. */
  polygons: Point[][]
}

export interface SheetNeighbours {
  above: string | null
  below: string | null
  left: string | null
  right: string | null
}

export interface Sheet {
  /** 0 is the top row, named R1. */
  row: number
  /** 0 is the left column, numbered 1. */
  col: number
  /** e.g. `R2-C3`. */
  label: string
  /** The printable area of this sheet in plate coordinates, overlap strips included. */
  window: Rect
  /** Nothing of the content on it, or only what printed neighbours' overlaps carry too: left out of the file. */
  empty: boolean
  /** Labels of the printed neighbours; null where there is none or it is left out. */
  neighbours: SheetNeighbours
}

export interface Tiling {
  paper: PaperName
  orientation: Orientation
  /** Page size as printed, mm (for rolls the length cut from the roll). */
  pageWidth: number
  pageHeight: number
  printableWidth: number
  printableHeight: number
  margin: number
  overlap: number
  /** Advance from one column / row to the next: printable size less the overlap. */
  stepX: number
  stepY: number
  rows: number
  cols: number
  /** Row by row from the top, left to right. */
  sheets: Sheet[]
  /** Sheets that are printed (not empty). */
  printed: number
  /** The area the whole grid covers, plate coordinates. */
  grid: Rect
  content: Rect
}

/** Row letters A..Z, then AA, AB ... (spreadsheet style, so labels never run out). */
export function rowLabel(row: number): string {
  let n = row + 1
  let s = ''
  while (n > 0) {
    const r = (n - 1) % 26
    s = String.fromCharCode(65 + r) + s
    n = Math.floor((n - 1) / 26)
  }
  return s
}

/**
 * `R1-C2`: row 1 (from the top), column 2 (from the left). Written so no
 * sheet name reads like a paper size (A3, A4, B5) on a table of taped sheets.
 */
export function sheetLabel(row: number, col: number): string {
  return `R${row + 1}-C${col + 1}`
}

function pointInPolygon(x: number, y: number, polygon: Point[]): boolean {
  let inside = false
  for (let i = 0, j = polygon.length - 1; i < polygon.length; j = i++) {
    const [xi, yi] = polygon[i]!
    const [xj, yj] = polygon[j]!
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

/** Liang-Barsky clip of one boundary: narrows [t0, t1], or reports the segment entirely outside it. */
function clipEdge(p: number, q: number, range: { t0: number; t1: number }): boolean {
  if (p === 0) return q >= 0
  const t = q / p
  if (p < 0) {
    if (t > range.t1) return false
    if (t > range.t0) range.t0 = t
  } else {
    if (t < range.t0) return false
    if (t < range.t1) range.t1 = t
  }
  return true
}

/** Liang-Barsky: does the segment touch the rectangle? */
function segmentTouchesRect(x0: number, y0: number, x1: number, y1: number, r: Rect, range: { t0: number; t1: number }): boolean {
  // Both ends beyond the same side: the common case, settled without clipping.
  if ((x0 < r.minX && x1 < r.minX) || (x0 > r.maxX && x1 > r.maxX) || (y0 < r.minY && y1 < r.minY) || (y0 > r.maxY && y1 > r.maxY)) {
    return false
  }
  const dx = x1 - x0
  const dy = y1 - y0
  range.t0 = 0
  range.t1 = 1
  return (
    clipEdge(-dx, x0 - r.minX, range) &&
    clipEdge(dx, r.maxX - x0, range) &&
    clipEdge(-dy, y0 - r.minY, range) &&
    clipEdge(dy, r.maxY - y0, range)
  )
}

/** True when an edge of the closed polygon passes through the rectangle. */
export function edgesTouchRect(polygon: Point[], r: Rect): boolean {
  const n = polygon.length
  const range = { t0: 0, t1: 1 }
  for (let i = 0; i < n; i++) {
    const a = polygon[i]!
    const b = polygon[i + 1 === n ? 0 : i + 1]!
    if (segmentTouchesRect(a[0], a[1], b[0], b[1], r, range)) return true
  }
  return false
}

/** True when any part of the closed polygon (its area or its edge) lies in the rectangle. */
export function polygonTouchesRect(polygon: Point[], r: Rect): boolean {
  if (polygon.length === 0) return false
  if (edgesTouchRect(polygon, r)) return true
  // No edge reaches the rectangle: it is either wholly inside the polygon or wholly outside.
  return pointInPolygon((r.minX + r.maxX) / 2, (r.minY + r.maxY) / 2, polygon)
}

export function boundsOf(points: Point[], pad = 0): Rect {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  for (const [x, y] of points) {
    if (x < minX) minX = x
    if (x > maxX) maxX = x
    if (y < minY) minY = y
    if (y > maxY) maxY = y
  }
  if (!Number.isFinite(minX)) throw new RangeError('Nothing to tile: the outline has no points.')
  return { minX: minX - pad, minY: minY - pad, maxX: maxX + pad, maxY: maxY + pad }
}

function checkLength(name: string, value: number): void {
  if (!Number.isFinite(value) || value < 0) {
    throw new RangeError(`${name} must be a length of zero or more (mm), got ${value}.`)
  }
}

/** Sheets needed to cover `extent` when each prints `printable` and neighbours share `overlap`. */
function countAlong(extent: number, printable: number, overlap: number): number {
  const step = printable - overlap
  return Math.max(1, Math.ceil((extent - overlap) / step - 1e-9))
}

/** For a roll: the length printed per sheet along the roll, and how many such sheets. */
function rollAlong(extent: number, margin: number, overlap: number): { printable: number; count: number } {
  const maxPrintable = MAX_PAGE_LENGTH - 2 * margin
  if (maxPrintable - overlap < MIN_STEP) throw new RangeError('The margin leaves no room on a 200 in page.')
  if (extent <= maxPrintable) return { printable: Math.min(maxPrintable, Math.ceil(extent)), count: 1 }
  const count = countAlong(extent, maxPrintable, overlap)
  const printable = Math.min(maxPrintable, Math.ceil((extent - overlap) / count + overlap))
  return { printable, count }
}

function layout(
  content: TileContent,
  paper: PaperName,
  orientation: Orientation,
  margin: number,
  overlap: number,
  anchor: 'centre' | 'bottom',
): Tiling {
  const spec = PAPERS[paper]
  const width = content.bounds.maxX - content.bounds.minX
  const height = content.bounds.maxY - content.bounds.minY
  let pageWidth: number
  let pageHeight: number
  if (spec.height !== null) {
    pageWidth = orientation === 'portrait' ? spec.width : spec.height
    pageHeight = orientation === 'portrait' ? spec.height : spec.width
  } else if (orientation === 'portrait') {
    pageWidth = spec.width
    pageHeight = rollAlong(height, margin, overlap).printable + 2 * margin
  } else {
    pageHeight = spec.width
    pageWidth = rollAlong(width, margin, overlap).printable + 2 * margin
  }
  const printableWidth = pageWidth - 2 * margin
  const printableHeight = pageHeight - 2 * margin
  const stepX = printableWidth - overlap
  const stepY = printableHeight - overlap
  if (stepX < MIN_STEP || stepY < MIN_STEP) {
    throw new RangeError(
      `Margin ${margin} mm and overlap ${overlap} mm leave too little of a ${spec.label} sheet to print on.`,
    )
  }
  const cols = countAlong(width, printableWidth, overlap)
  const rows = countAlong(height, printableHeight, overlap)
  const gridWidth = cols * stepX + overlap
  const gridHeight = rows * stepY + overlap
  // Centre the grid on the content so the spare paper is shared round the edges.
  const spareY = anchor === 'bottom' ? 0 : (gridHeight - height) / 2
  const grid: Rect = {
    minX: content.bounds.minX - (gridWidth - width) / 2,
    maxX: content.bounds.maxX + (gridWidth - width) / 2,
    minY: content.bounds.minY - spareY,
    maxY: content.bounds.minY - spareY + gridHeight,
  }
  const sheets: Sheet[] = []
  for (let row = 0; row < rows; row++) {
    for (let col = 0; col < cols; col++) {
      const minX = grid.minX + col * stepX
      const maxY = grid.maxY - row * stepY
      const window: Rect = { minX, maxX: minX + printableWidth, minY: maxY - printableHeight, maxY }
      const empty = !content.polygons.some((p) => polygonTouchesRect(p, window))
      sheets.push({
        row,
        col,
        label: sheetLabel(row, col),
        window,
        empty,
        neighbours: { above: null, below: null, left: null, right: null },
      })
    }
  }
  const at = (row: number, col: number): Sheet | undefined =>
    row >= 0 && row < rows && col >= 0 && col < cols ? sheets[row * cols + col] : undefined
  leaveOutCovered(sheets, content, at, overlap)
  const labelIfPrinted = (s: Sheet | undefined): string | null => (s && !s.empty ? s.label : null)
  for (const s of sheets) {
    s.neighbours = {
      above: labelIfPrinted(at(s.row - 1, s.col)),
      below: labelIfPrinted(at(s.row + 1, s.col)),
      left: labelIfPrinted(at(s.row, s.col - 1)),
      right: labelIfPrinted(at(s.row, s.col + 1)),
    }
  }
  return {
    paper,
    orientation,
    pageWidth,
    pageHeight,
    printableWidth,
    printableHeight,
    margin,
    overlap,
    stepX,
    stepY,
    rows,
    cols,
    sheets,
    printed: sheets.filter((s) => !s.empty).length,
    grid,
    content: content.bounds,
  }
}

/**
 * Leaves out a sheet whose lines all lie in overlap strips that printed
 * neighbours carry too: a sheet holding only a sliver of line inside its
 * overlap would add paper and taping for nothing. A sheet's window is cut
 * into up to 3 x 3 parts at its overlap lines; a part counts as carried when
 * another printed sheet's window holds it. Sheets are tried from the least
 * content (fewest touched parts) up, one at a time, so two sheets never both
 * leave a shared strip to each other.
 */
function leaveOutCovered(sheets: Sheet[], content: TileContent, at: (row: number, col: number) => Sheet | undefined, overlap: number): void {
  if (overlap <= 0) return
  const parts = (s: Sheet): Rect[] => {
    const w = s.window
    const xs = [w.minX, ...(at(s.row, s.col - 1) ? [w.minX + overlap] : []), ...(at(s.row, s.col + 1) ? [w.maxX - overlap] : []), w.maxX]
    const ys = [w.minY, ...(at(s.row + 1, s.col) ? [w.minY + overlap] : []), ...(at(s.row - 1, s.col) ? [w.maxY - overlap] : []), w.maxY]
    const out: Rect[] = []
    for (let i = 0; i + 1 < xs.length; i++) {
      for (let j = 0; j + 1 < ys.length; j++) out.push({ minX: xs[i]!, maxX: xs[i + 1]!, minY: ys[j]!, maxY: ys[j + 1]! })
    }
    return out
  }
  const touched = new Map<Sheet, Rect[]>()
  for (const s of sheets) {
    if (s.empty) continue
    touched.set(s, parts(s).filter((r) => content.polygons.some((p) => polygonTouchesRect(p, r))))
  }
  const carried = (s: Sheet, r: Rect): boolean => {
    const cx = (r.minX + r.maxX) / 2
    const cy = (r.minY + r.maxY) / 2
    for (let dr = -1; dr <= 1; dr++) {
      for (let dc = -1; dc <= 1; dc++) {
        const o = dr === 0 && dc === 0 ? undefined : at(s.row + dr, s.col + dc)
        if (o && !o.empty && rectContains(o.window, [cx, cy]) && rectContains(o.window, [r.minX, r.minY]) && rectContains(o.window, [r.maxX, r.maxY])) return true
      }
    }
    return false
  }
  const order = [...touched.entries()].sort((a, b) => a[1].length - b[1].length)
  for (const [s, rects] of order) {
    if (rects.every((r) => carried(s, r))) s.empty = true
  }
}

/** Split any content over sheets of the chosen paper. */
export function tileContent(content: TileContent, options: TilingOptions): Tiling {
  const { paper } = options
  if (!(paper in PAPERS)) {
    throw new RangeError(`Unknown paper ${JSON.stringify(paper)}: use one of ${PAPER_NAMES.join(', ')}.`)
  }
  const margin = options.margin ?? DEFAULT_MARGIN
  const overlap = options.overlap ?? DEFAULT_OVERLAP
  checkLength('margin', margin)
  checkLength('overlap', overlap)
  const orientation = options.orientation ?? 'auto'
  const anchor = options.anchor ?? 'centre'
  if (orientation === 'portrait' || orientation === 'landscape') {
    return layout(content, paper, orientation, margin, overlap, anchor)
  }
  if (orientation !== 'auto') {
    throw new RangeError(`Unknown orientation ${JSON.stringify(orientation)}: use auto, portrait or landscape.`)
  }
  const portrait = layout(content, paper, 'portrait', margin, overlap, anchor)
  const landscape = layout(content, paper, 'landscape', margin, overlap, anchor)
  const paperUsed = (t: Tiling) => t.printed * t.pageWidth * t.pageHeight
  if (landscape.printed !== portrait.printed) return landscape.printed < portrait.printed ? landscape : portrait
  if (PAPERS[paper].height === null && Math.abs(paperUsed(landscape) - paperUsed(portrait)) > 1) {
    return paperUsed(landscape) < paperUsed(portrait) ? landscape : portrait
  }
  return landscape.sheets.length < portrait.sheets.length ? landscape : portrait
}

export interface PlateTilingOptions extends TilingOptions {
  /** Further closed outlines that are drawn and must be covered, e.g. a router-pattern offset line. */
  extraOutlines?: Point[][]
  /** Clear space round the outline, mm. Default 4. */
  pad?: number
}

/** The plate's content: its outline (and any extra outlines) with a little clear space round it. */
export function plateTileContent(plate: Pick<Plate, 'outline'>, extraOutlines: Point[][] = [], pad = DEFAULT_PAD): TileContent {
  const polygons = [plate.outline, ...extraOutlines].filter((p) => p.length > 0)
  return { bounds: boundsOf(polygons.flat(), pad), polygons }
}

/** Tile a plate; the live preview and the template writer both call this. */
export function tilePlate(plate: Pick<Plate, 'outline'>, options: PlateTilingOptions): Tiling {
  return tileContent(plateTileContent(plate, options.extraOutlines, options.pad), options)
}

/** Plate millimetres to PDF points on a sheet: page = scale * plate + (tx, ty). */
export interface SheetTransform {
  scale: number
  tx: number
  ty: number
}

/** Exactly 1:1: the window's lower-left corner lands on the printable corner of the page. */
export function sheetTransform(tiling: Tiling, sheet: Sheet): SheetTransform {
  return {
    scale: PT_PER_MM,
    tx: (tiling.margin - sheet.window.minX) * PT_PER_MM,
    ty: (tiling.margin - sheet.window.minY) * PT_PER_MM,
  }
}

/** Where a plate point is printed on a sheet, in PDF points from the page's lower-left corner. */
export function plateToPage(tiling: Tiling, sheet: Sheet, point: Point): Point {
  const t = sheetTransform(tiling, sheet)
  return [point[0] * t.scale + t.tx, point[1] * t.scale + t.ty]
}

/** Page size in PDF points. */
export function pageSizePt(tiling: Tiling): [number, number] {
  return [tiling.pageWidth * PT_PER_MM, tiling.pageHeight * PT_PER_MM]
}

/**
 * Registration crosses in plate coordinates: two along every seam between
 * printed neighbours, in the middle of the shared strip, and one where four
 * sheets overlap at a corner. Each sheet prints those inside its window, so
 * the same cross appears on every sheet that shares the spot.
 */
export function registrationPoints(tiling: Tiling): Point[] {
  const { rows, cols, sheets, overlap } = tiling
  const printed = (r: number, c: number): boolean =>
    r >= 0 && r < rows && c >= 0 && c < cols && sheets[r * cols + c]?.empty === false
  const points: Point[] = []
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const s = sheets[r * cols + c]!
      const w = s.window
      const midX = (w.minX + w.maxX) / 2
      const midY = (w.minY + w.maxY) / 2
      const seamX = w.maxX - overlap / 2
      const seamY = w.minY + overlap / 2
      if (c + 1 < cols && printed(r, c) && printed(r, c + 1)) {
        points.push([seamX, midY - tiling.printableHeight / 4], [seamX, midY + tiling.printableHeight / 4])
      }
      if (r + 1 < rows && printed(r, c) && printed(r + 1, c)) {
        points.push([midX - tiling.printableWidth / 4, seamY], [midX + tiling.printableWidth / 4, seamY])
      }
      if (r + 1 < rows && c + 1 < cols) {
        const around = [printed(r, c), printed(r, c + 1), printed(r + 1, c), printed(r + 1, c + 1)]
        if (around.filter(Boolean).length >= 2) points.push([seamX, seamY])
      }
    }
  }
  return points
}

export function rectContains(r: Rect, p: Point, tolerance = 1e-6): boolean {
  return p[0] >= r.minX - tolerance && p[0] <= r.maxX + tolerance && p[1] >= r.minY - tolerance && p[1] <= r.maxY + tolerance
}

// The build sheet: two pages a carpenter works from (a page more where the
// content runs on, never cut off at the foot). Page one draws the plate
// to a stated scale with its main dimensions and the caster orientation;
// page two lists the cut list, the hardware, the build steps in order and the
// shop math with its cautions. Written in the reader's units.

import fontkit from '@pdf-lib/fontkit'
import { PDFDocument, PDFName, type PDFFont } from 'pdf-lib'
import type { Plate, Point } from '../types'
import type { PlateParams } from '../params'
import { MM_PER_INCH, formatInches, formatMillimetres } from '../units'
import { analyseUnit, type UnitAnalysis } from '../stability/analyse'
import { COUNTERWEIGHT_MATERIALS } from '../stability/unit-params'
import { formatAngle, formatForce, formatMass } from '../stability/format'
import { motionNotes, STABILITY_CAUTIONS, tippingSequence } from '../stability/cautions'
import { resolveFontBytes, unpackWoff, type FontBytes } from './fonts'
import { COLOURS, Ops, type Rgb } from './pdf-ops'
import { PT_PER_MM, type ExportUnits } from './units'
import { savedErrors, savedErrorsLine } from './plate-notes'

const FONT = 'F1'

/**
 * A length as the carpenter measures it: inches to the nearest 1/16 (a tape's
 * marks), and to the nearest 1/32 below an inch, where a sheet's thickness, a
 * rabbet's depth or a drill's size is read (23/32 in is not 3/4 in);
 * millimetres to the nearest 1, and to 0.5 below 25 mm.
 */
export function sheetLength(mm: number, units: ExportUnits): string {
  const small = Math.abs(mm) < MM_PER_INCH - MM_PER_INCH / 64
  if (units === 'in') return formatInches(mm, { denominator: small ? 32 : 16 }).replace(/"$/, ' in')
  return formatMillimetres(mm, { step: small ? 0.5 : 1 })
}

/**
 * Retail names of the plywood performance categories of PS 1-19: a panel is
 * sold by a nominal size thicker than it is. 23/32 for "3/4 in" is in
 * REFERENCES (0.688-0.750 in); the other pairs are from memory.
 */
const SOLD_AS: readonly { category: number; sold: string; min: number; max: number }[] = [
  { category: 23 / 32, sold: '3/4 in', min: 0.688, max: 0.75 },
  { category: 19 / 32, sold: '5/8 in', min: 0.563, max: 0.625 },
  { category: 15 / 32, sold: '1/2 in', min: 0.438, max: 0.5 },
  { category: 11 / 32, sold: '3/8 in', min: 0.313, max: 0.375 },
]

/** One sheet of plywood as the shop buys it: `23/32 in plywood (sold as 3/4 in)`. */
export function plywoodName(mm: number, units: ExportUnits): string {
  const inches = mm / MM_PER_INCH
  const cat = SOLD_AS.find((c) => inches >= c.min - 1e-6 && inches <= c.max + 1e-6)
  if (!cat) return `${sheetLength(mm, units)} plywood`
  return units === 'in'
    ? `${sheetLength(mm, 'in')} plywood (sold as ${cat.sold})`
    : `${sheetLength(mm, 'mm')} plywood (sold as ${cat.sold}, category ${sheetLength(cat.category * MM_PER_INCH, 'in')})`
}

/** Trim left all round a plate's blank for the saw and the router to clean the edge to the line: 1/2 in or 12 mm (common shop practice, from memory). */
export function blankAllowance(units: ExportUnits): number {
  return units === 'in' ? MM_PER_INCH / 2 : 12
}

export interface BuildSheetMeta {
  designName: string
  sizeLabel?: string
  revision: number
  /** YYYY-MM-DD. */
  date: string
  author?: string | null
  note?: string
}

export interface BuildSheetOptions {
  units: ExportUnits
  /** Letter with inches, A4 with millimetres unless given. */
  paper?: 'letter' | 'a4'
  meta: BuildSheetMeta
  font?: FontBytes
}

/** Page sizes, pt: Letter 8.5 x 11 in (ASME Y14.1), A4 210 x 297 mm (ISO 216). */
const PAGES = { letter: [612, 792], a4: [595.28, 841.89] } as const
const MARGIN = 36

/** Scales a shop reads off a rule: 1:s. Inch scales are the architect's (so many inches to the foot). */
const SCALES = { in: [2, 4, 8, 12, 16, 24, 48, 96], mm: [2, 5, 10, 20, 25, 50, 100] } as const

export function chooseScale(width: number, height: number, boxW: number, boxH: number, units: ExportUnits): number {
  const list = SCALES[units]
  for (const s of list) {
    if ((width * PT_PER_MM) / s <= boxW && (height * PT_PER_MM) / s <= boxH) return s
  }
  return list[list.length - 1]!
}

export function scaleLabel(s: number, units: ExportUnits): string {
  if (units === 'mm') return `Scale 1:${s}`
  return `Scale 1:${s} (${sheetLength((12 * MM_PER_INCH) / s, 'in')} = 1 ft)`
}

class Page {
  y: number
  /** Pages already filled before this one's content ran on (each written as its own PDF page). */
  readonly filled: Ops[] = []
  constructor(
    public ops: Ops,
    readonly width: number,
    readonly height: number,
    private readonly fresh: () => Ops = () => new Ops(null, FONT),
    /** Written at the top of a page the content runs on to. */
    private readonly continued = '(continued)',
  ) {
    this.y = height - MARGIN
  }

  /** Makes room for `h` pt: past the foot of the page, the content runs on onto a new one. */
  room(h: number): void {
    if (this.y - h >= MARGIN) return
    this.filled.push(this.ops)
    this.ops = this.fresh()
    this.y = this.height - MARGIN
    this.ops.text(this.continued, this.width - MARGIN, this.y - 8, 8, { align: 'right', colour: COLOURS.muted })
    this.y -= 16
  }

  /** Words wrapped to `width` pt; returns the lines. */
  wrap(text: string, size: number, width: number): string[] {
    const lines: string[] = []
    let line = ''
    for (const word of text.split(/\s+/)) {
      const next = line ? `${line} ${word}` : word
      if (line && this.ops.textWidth(next, size) > width) {
        lines.push(line)
        line = word
      } else line = next
    }
    if (line) lines.push(line)
    return lines
  }

  para(text: string, size = 8.5, x = MARGIN, width = this.width - 2 * MARGIN, colour: Rgb = COLOURS.ink): void {
    for (const l of this.wrap(text, size, width)) {
      this.room(size * 1.3)
      this.ops.text(l, x, this.y - size, size, { colour })
      this.y -= size * 1.3
    }
  }

  heading(text: string, x = MARGIN): void {
    // A heading never ends a page: it keeps room for a line or two after it.
    this.room(50)
    this.y -= 6
    this.ops.text(text, x, this.y - 11, 11, { colour: COLOURS.accent })
    this.y -= 16
  }

  /** Rows of cells at the given column offsets; the first row in the muted colour. */
  table(rows: string[][], columns: number[], size = 8.5, x = MARGIN): void {
    const widths = columns.map((c, i) => (columns[i + 1] ?? this.width - 2 * MARGIN) - c - 6)
    rows.forEach((row, r) => {
      const cells = row.map((cell, i) => this.wrap(cell, size, widths[i]!))
      const lines = Math.max(...cells.map((c) => c.length))
      this.room(lines * size * 1.25 + 3)
      cells.forEach((c, i) => c.forEach((l, k) => this.ops.text(l, x + columns[i]!, this.y - size - k * size * 1.25, size, { colour: r === 0 ? COLOURS.muted : COLOURS.ink })))
      this.y -= lines * size * 1.25 + 3
      if (r === 0) {
        this.ops.style({ colour: COLOURS.tint, width: 0.6 }).line(x, this.y + 1.5, this.width - MARGIN, this.y + 1.5).stroke()
      }
    })
  }
}

function header(page: Page, meta: BuildSheetMeta, pageNo: number, units: ExportUnits, errors: readonly string[]): void {
  const { ops, width } = page
  ops.text('Build sheet', MARGIN, page.y - 16, 16, { colour: COLOURS.accent })
  const title = `${meta.designName}${meta.sizeLabel ? ` (${meta.sizeLabel})` : ''}`
  ops.text(title, MARGIN + 110, page.y - 16, 13)
  ops.text(`Page ${pageNo}`, width - MARGIN, page.y - 12, 8, { align: 'right', colour: COLOURS.muted })
  page.y -= 30
  const line = `Revision r${meta.revision} · ${meta.date} · drawn by ${meta.author ?? 'unknown'} · sizes in ${units === 'in' ? 'inches' : 'millimetres'}${meta.note ? ` · ${meta.note}` : ''}`
  page.para(line, 8.5, MARGIN, width - 2 * MARGIN, COLOURS.muted)
  ops.style({ colour: COLOURS.accent, width: 0.8 }).line(MARGIN, page.y - 2, width - MARGIN, page.y - 2).stroke()
  page.y -= 8
  if (errors.length) {
    // Saved anyway with errors: the builder, who only prints, must learn of it before cutting.
    const top = page.y
    page.y -= 4
    page.para(savedErrorsLine(errors.length), 10, MARGIN + 8, width - 2 * MARGIN - 16, COLOURS.warn)
    const shown = pageNo === 1 ? errors.slice(0, 4) : []
    for (const e of shown) page.para(`- ${e}`, 8, MARGIN + 8, width - 2 * MARGIN - 16, COLOURS.ink)
    if (pageNo === 1 && errors.length > shown.length) page.para(`and ${errors.length - shown.length} more: open the design in Rootplate.`, 8, MARGIN + 8, width - 2 * MARGIN - 16, COLOURS.ink)
    page.y -= 3
    ops.style({ colour: COLOURS.warn, width: 1.5 }).rect(MARGIN, page.y, width - 2 * MARGIN, top - page.y).stroke()
    page.y -= 8
  }
}

interface Frame {
  /** Plate mm to page pt. */
  x: (mm: number) => number
  y: (mm: number) => number
  k: number
}

function frameFor(plate: Plate, box: { x: number; y: number; w: number; h: number }, scale: number): Frame {
  const b = plate.metrics.bounds
  const k = PT_PER_MM / scale
  const cx = box.x + box.w / 2 - ((b.minX + b.maxX) / 2) * k
  const cy = box.y + box.h / 2 - ((b.minY + b.maxY) / 2) * k
  return { x: (mm) => cx + mm * k, y: (mm) => cy + mm * k, k }
}

function polygon(ops: Ops, f: Frame, pts: readonly Point[]): Ops {
  return ops.polygon(pts.map(([x, y]) => [f.x(x), f.y(y)] as Point))
}

function dimension(ops: Ops, x0: number, y0: number, x1: number, y1: number, label: string, vertical: boolean): void {
  ops.style({ colour: COLOURS.ink, width: 0.5 }).line(x0, y0, x1, y1)
  const t = 3
  if (vertical) ops.line(x0 - t, y0, x0 + t, y0).line(x1 - t, y1, x1 + t, y1)
  else ops.line(x0, y0 - t, x0, y0 + t).line(x1, y1 - t, x1, y1 + t)
  ops.stroke()
  if (vertical) ops.text(label, x0 + 5, (y0 + y1) / 2, 8, { angle: 90, align: 'center' })
  else ops.text(label, (x0 + x1) / 2, y0 - 10, 8, { align: 'center' })
}

function drawPlate(page: Page, plate: Plate, a: UnitAnalysis, units: ExportUnits, box: { x: number; y: number; w: number; h: number }): void {
  const { ops } = page
  const L = (mm: number) => sheetLength(mm, units)
  // Room for the dimension lines below and to the right.
  const scale = chooseScale(plate.metrics.width, plate.metrics.height, box.w - 40, box.h - 40, units)
  const f = frameFor(plate, { x: box.x, y: box.y + 20, w: box.w - 30, h: box.h - 20 }, scale)
  const b = plate.metrics.bounds

  ops.style({ colour: COLOURS.reference, width: 0.5, dash: [4, 2] }).circle(f.x(0), f.y(0), (plate.trunk.diameter / 2) * f.k).stroke()
  ops.style({ colour: COLOURS.reference, width: 0.3, dash: [1.5, 1.5] }).circle(f.x(0), f.y(0), (plate.trunk.innerDiameter / 2) * f.k).stroke()
  for (const s of a.layout.spots.filter((s) => s.layer === 0)) {
    ops.fillColour(COLOURS.tint)
    polygon(ops, f, s.corners).fill()
  }
  ops.style({ colour: COLOURS.cut, width: 1 })
  polygon(ops, f, plate.outline).stroke()
  ops.style({ colour: COLOURS.rabbet, width: 0.6 })
  for (const r of plate.rabbets) ops.circle(f.x(r.x), f.y(r.y), (r.diameter / 2) * f.k)
  ops.stroke()
  ops.style({ colour: COLOURS.hole, width: 0.7 })
  for (const h of plate.holes) ops.circle(f.x(h.x), f.y(h.y), Math.max(0.6, (h.diameter / 2) * f.k))
  ops.stroke()
  ops.style({ colour: COLOURS.mount, width: 0.5 })
  for (const m of plate.casterMounts) polygon(ops, f, m.corners)
  ops.stroke()
  const line = a.stability.tippingLine
  if (line) {
    ops.style({ colour: COLOURS.warn, width: 1, dash: [5, 2] }).line(f.x(line[0][0]), f.y(line[0][1]), f.x(line[1][0]), f.y(line[1][1])).stroke()
    const mx = (line[0][0] + line[1][0]) / 2
    const my = (line[0][1] + line[1][1]) / 2
    ops.text('tipping line', f.x(mx) + 3, f.y(my) + 3, 7, { colour: COLOURS.warn })
  }
  ops.style({ colour: COLOURS.warn, width: 0.6 }).cross(f.x(a.stability.centreOfMass.x), f.y(a.stability.centreOfMass.y), 4).stroke()

  dimension(ops, f.x(b.minX), f.y(b.minY) - 12, f.x(b.maxX), f.y(b.minY) - 12, `overall ${L(plate.metrics.width)}`, false)
  dimension(ops, f.x(b.maxX) + 12, f.y(b.minY), f.x(b.maxX) + 12, f.y(b.maxY), `overall ${L(plate.metrics.height)}`, true)
  ops.text(scaleLabel(scale, units), box.x, box.y + box.h - 8, 8.5, { colour: COLOURS.muted })
  // A scale bar, so a reader can check the print.
  const bar = units === 'in' ? 12 * MM_PER_INCH : 100
  const bx = box.x
  const by = box.y + box.h - 20
  ops.style({ colour: COLOURS.ink, width: 1 }).line(bx, by, bx + bar * f.k, by).line(bx, by - 2, bx, by + 2).line(bx + bar * f.k, by - 2, bx + bar * f.k, by + 2).stroke()
  ops.text(units === 'in' ? '1 ft at this scale' : '100 mm at this scale', bx + bar * f.k + 4, by - 3, 7, { colour: COLOURS.muted })
}

function casterDiagram(page: Page, plate: Plate, box: { x: number; y: number; w: number; h: number }): void {
  const { ops } = page
  const p = plate.params
  const reach = p.casterOffset + Math.max(p.caster.topPlateLength, p.caster.topPlateWidth) / 2 + p.caster.swivelLead + p.caster.wheelDiameter / 2
  const k = Math.min(box.w, box.h - 20) / 2 / reach
  const cx = box.x + box.w / 2
  const cy = box.y + (box.h - 20) / 2
  const X = (mm: number) => cx + mm * k
  const Y = (mm: number) => cy + mm * k
  ops.style({ colour: COLOURS.reference, width: 0.5, dash: [3, 2] }).circle(cx, cy, p.casterOffset * k).stroke()
  plate.casterMounts.forEach((m, i) => {
    const pocket = plate.holes.find((h) => h.id === m.pocketId)
    if (!pocket) return
    const a = (m.angle * Math.PI) / 180
    ops.style({ colour: COLOURS.reference, width: 0.5 }).line(cx, cy, X(pocket.x + Math.cos(a) * 30), Y(pocket.y + Math.sin(a) * 30)).stroke()
    ops.style({ colour: COLOURS.mount, width: 0.9 }).polygon(m.corners.map(([x, y]) => [X(x), Y(y)] as Point)).stroke()
    ops.style({ colour: COLOURS.muted, width: 0.4, dash: [1.5, 1.5] }).circle(X(pocket.x), Y(pocket.y), (p.caster.swivelLead + p.caster.wheelDiameter / 2) * k).stroke()
    ops.style({ colour: COLOURS.ink, width: 0.6 }).cross(X(pocket.x), Y(pocket.y), 2.5).stroke()
    const lx = X(pocket.x + Math.cos(a) * (p.caster.topPlateLength / 2 + 25))
    const ly = Y(pocket.y + Math.sin(a) * (p.caster.topPlateLength / 2 + 25))
    ops.text(`C${i + 1} ${Math.round(((m.angle % 360) + 360) % 360)}°`, lx, ly - 3, 7, { align: 'center' })
  })
  ops.style({ colour: COLOURS.ink, width: 0.6 }).cross(cx, cy, 4).stroke()
  ops.text('Caster orientation: top plates square to their radial lines', box.x, box.y + box.h - 8, 8.5, { colour: COLOURS.muted })
}

function firstPage(page: Page, plate: Plate, a: UnitAnalysis, o: BuildSheetOptions): void {
  header(page, o.meta, 1, o.units, savedErrors(plate, o.units))
  const L = (mm: number) => sheetLength(mm, o.units)
  const p = plate.params
  const total = p.layers * p.sheetThickness
  const drawH = page.y - MARGIN - 250
  drawPlate(page, plate, a, o.units, { x: MARGIN, y: page.y - drawH, w: page.width - 2 * MARGIN, h: drawH })
  page.y -= drawH + 8
  const colW = (page.width - 2 * MARGIN) / 2
  const top = page.y
  page.heading('Main dimensions')
  const access = plate.holes.find((h) => h.kind === 'access')
  const index = plate.holes.filter((h) => h.kind === 'index')
  page.table([
    ['what', 'size'],
    ['Overall', `${L(plate.metrics.width)} × ${L(plate.metrics.height)}`],
    ['Tube (outside, measured)', `${L(p.tubeDiameter)}, wall ${L(p.tubeWall)}`],
    ['Caster offset (centre to pocket)', `${L(p.casterOffset)}, ${p.casterCount} casters from ${p.rotation}°`],
    ['Pockets', `${L(p.pocketDiameter)}, rabbet ${L(p.rabbetWidth)} wide × ${L(p.rabbetDepth)} deep`],
    ['Access openings', access ? `${plate.holes.filter((h) => h.kind === 'access').length} × ${L(access.diameter)} at ${L(Math.hypot(access.x, access.y))} from centre` : 'none'],
    ['Centre and index holes', `${L(p.centreHoleDiameter)}; ${index.length} × ${L(p.indexHoleDiameter)} on the clocking axis`],
    ['Thickness, floor gap', `${L(total)} (${p.layers} × ${L(p.sheetThickness)}), ${L(plate.metrics.floorGap)}`],
  ], [0, 130], 8, MARGIN)
  page.y -= 4
  page.para('Drawing: outline (green), rabbets (amber), holes, caster top plates (blue), trunk (dashed), counterweight blocks (shaded), centre of mass (cross) and the tipping line (red, dashed).', 7.5, MARGIN, colW - 10, COLOURS.muted)
  casterDiagram(page, plate, { x: MARGIN + colW + 10, y: MARGIN, w: colW - 10, h: top - MARGIN })
}

/** The pan fasteners in the carpenter's words, by kind. */
function fastenerWords(f: PlateParams['fasteners'], L: (mm: number) => string): string {
  if (f.kind === 'screw') return `${L(f.diameter)} wood screws into the rabbet floor, ${L(f.length)} below the rim, no hole through the bottom layer`
  if (f.kind === 'bolt-tnut') return `${L(f.diameter)} bolts through both layers into T-nuts in the underside`
  return `${L(f.diameter)} bolts through both layers, nuts in ${L(f.counterboreDiameter)} counterbores ${L(f.counterboreDepth)} deep from the underside`
}

function secondPage(page: Page, plate: Plate, a: UnitAnalysis, o: BuildSheetOptions): void {
  header(page, o.meta, 2, o.units, savedErrors(plate, o.units))
  const u = o.units
  const L = (mm: number) => sheetLength(mm, u)
  const M = (kg: number) => formatMass(kg, u)
  const F = (n: number) => formatForce(n, u)
  const p = plate.params
  const s = a.stability
  const n = p.casterCount
  const w = plate.metrics.width
  const h = plate.metrics.height

  // One total thickness, worked out once and printed the same everywhere.
  const total = p.layers * p.sheetThickness
  const allow = blankAllowance(u)
  const blank = `${L(w + 2 * allow)} × ${L(h + 2 * allow)}`
  page.heading('Cut list')
  const layers = Array.from({ length: p.layers }, (_, i) => [
    `Layer ${i + 1}${i === 0 ? ' (top)' : i === p.layers - 1 ? ' (bottom)' : ''}`,
    plywoodName(p.sheetThickness, u),
    blank,
    i === 0 ? `outline, ${n} pockets with rabbets, openings, centre and index holes` : 'outline, pockets, openings, centre and index holes; no rabbet',
  ])
  page.table([['layer', 'sheet', 'blank', 'cuts'], ...layers], [0, 80, 215, 330])
  page.para(`Each blank is the plate's overall ${L(w)} × ${L(h)} plus ${L(allow)} all round for the saw and the router (common practice). Glued up: ${p.layers} layer${p.layers === 1 ? '' : 's'}, ${L(total)} thick in all.`, 8, MARGIN, page.width - 2 * MARGIN, COLOURS.muted)

  page.heading('Hardware')
  const cw = a.unit.counterweight
  const bolts = plate.casterMounts[0]?.bolts.length ?? 4
  // The circle the pan-rim fasteners stand on, measured from the first one to its pocket's centre.
  const firstFastener = plate.fasteners[0]
  const fastenedPocket = firstFastener && plate.holes.find((h) => h.id === firstFastener.pocketId)
  const rimCircle = firstFastener && fastenedPocket ? 2 * Math.hypot(firstFastener.x - fastenedPocket.x, firstFastener.y - fastenedPocket.y) : 0
  const rows = [
    ['item', 'count', 'size'],
    ['Swivel casters', `${n}`, `${L(p.caster.wheelDiameter)} wheel, ${L(p.caster.overallHeight)} tall, swivel lead ${L(p.caster.swivelLead)}, rated ${a.casterRating !== null ? `${M(a.casterRating)} each (maker's figure)` : `________ ${u === 'in' ? 'lb' : 'kg'} each (fill in the maker's rating)`}`],
    ['Pans', `${n}`, `rim to fit a ${L(p.pocketDiameter + 2 * p.rabbetWidth)} rabbet, ${L(p.panDepth)} from the rim's underside to the crown, over a ${L(p.pocketDiameter)} pocket`],
    ['Pan fasteners', `${plate.fasteners.length}`, `${p.fasteners.count} per pan, ${fastenerWords(p.fasteners, L)}${rimCircle ? ` on a ${L(rimCircle)} circle` : ''} (the rabbet floor is ${L(p.rabbetDepth)} below the top face)`],
    ['Caster bolts, nuts, washers', `${n * bolts}`, `${L(p.caster.boltDiameter)}, on ${L(p.caster.boltSpacingX)} × ${L(p.caster.boltSpacingY)} centres`],
    ['Counterweight blocks', `${cw.count}`, `${COUNTERWEIGHT_MATERIALS[cw.material].label.toLowerCase()} ${L(cw.block.length)} × ${L(cw.block.width)} × ${L(cw.block.thickness)}, ${M(a.block.mass)} each, ${M(cw.count * a.block.mass)} in all`],
  ]
  page.table(rows, [0, 150, 200])

  page.heading('Build steps')
  const rise = Math.max(0, p.panDepth - p.rabbetDepth)
  const openings = plate.holes.filter((x) => x.kind === 'access')
  const steps = [
    `Cut ${p.layers} blank${p.layers === 1 ? '' : 's'} of ${blank} from ${plywoodName(p.sheetThickness, u)}.`,
    p.layers > 1
      ? `Stack the blanks, the top layer's good face up, tape the template on top and drill the centre hole (${L(p.centreHoleDiameter)}) and the index holes (${L(p.indexHoleDiameter)}) through the template and every layer, before the layers part: these holes register them.`
      : `Tape the template on the blank, good face up, and drill the centre hole (${L(p.centreHoleDiameter)}) and the index holes (${L(p.indexHoleDiameter)}) through the template.`,
    p.layers > 1
      ? `Laminate: glue the layers with pins through the centre and index holes, so they line up as drilled; ${L(total)} thick in all. Put the template back on the same pins.`
      : `Leave the template on, pinned through the centre and index holes.`,
    `Mark the outline, the pocket and opening centres through the template; cut the outline with a jigsaw just outside the line and clean it to the line with a router following the pattern.`,
    `Cut the pockets (${L(p.pocketDiameter)}, ${n} of them)${openings.length ? ` and the ${openings.length} access openings (${L(openings[0]!.diameter)})` : ''} through the whole panel, before any rabbet: the rabbeting bit's bearing follows the pocket's wall.`,
    `Route each rabbet round its pocket in the top face with a rabbeting bit whose bearing rides the pocket's wall: ${L(p.rabbetWidth)} wide, ${L(p.rabbetDepth)} deep.`,
    p.fasteners.kind === 'screw'
      ? `Drill pilot holes for the ${plate.fasteners.length} pan screws (${L(p.fasteners.diameter)}) in the rabbet floors, ${p.fasteners.count} round each pocket, no deeper than ${L(p.fasteners.length)}: nothing goes through the bottom layer.`
      : `Drill the ${plate.fasteners.length} pan-bolt holes (${L(p.fasteners.diameter)}) through the rabbet floors and the bottom layer, ${p.fasteners.count} round each pocket${p.fasteners.kind === 'bolt-counterbore' ? `, and counterbore them from the underside ${L(p.fasteners.counterboreDiameter)} across, ${L(p.fasteners.counterboreDepth)} deep` : ', and drive a T-nut into each from the underside'}.`,
    rise > 0
      ? `Fit the pans: set each pan crown up on the plate, its rim down in the rabbet and its body standing ${L(rise)} above the top face, and fasten the rim through the ${p.fasteners.count} holes.`
      : `Fit the pans: set each flat pan in its rabbet, flush with the top face, and fasten it through the ${p.fasteners.count} holes.`,
    `Bolt each caster under its pan's crown, up through the pocket, with each top plate square to its radial line (see the caster orientation on page 1).`,
    cw.count > 0 ? `Load the counterweight: ${cw.count} blocks through the access openings, laid flat inside the tube clear of the pans, locked in place.` : 'Counterweight: none entered; add blocks in the editor if the figures below ask for them.',
  ]
  steps.forEach((t, i) => page.para(`${i + 1}. ${t}`, 8.5))

  page.heading('Shop math (estimates)')
  const need = (k: number | null) => (k === null ? 'more than fit' : `${k} block${k === 1 ? '' : 's'}`)
  const motion = motionNotes(s)
  page.table([
    ['figure', 'value', 'against'],
    ['Total weight', `${M(s.totalWeight)}`, `plate ${M(s.parts.plate.kg)}, load ${M(s.parts.load.kg)}, counterweight ${M(s.parts.counterweight.kg)}, casters and pans ${M(s.parts.hardware.kg)}`],
    ['Centre of mass height', L(s.centreOfMassHeight), 'above the floor'],
    ['Leaves its wheels at (worst direction)', formatAngle(s.tippingAngle), `target ${formatAngle(a.unit.targetAngle)}: ${a.anglePasses ? 'reached' : `not reached; caster offset about ${a.remedy?.casterOffset != null ? L(a.remedy.casterOffset) : '-'} or ${need(a.blocksForAngle)}`}`],
    ['Overturns at', formatAngle(s.overturnAngle), `about the outline's outer edge (${L(s.overturnDistance)} from the centre of mass); a root touches at ${s.rootTouchAngle >= 90 ? 'no lean' : formatAngle(s.rootTouchAngle)}`],
    ['Raked stage, stops', motion.rakes.map((r) => `${r.label} ${formatAngle(r.angle)}`).join(', '), `a stop or start over ${motion.liftStop.g.toFixed(3)} g lifts its wheels; ${motion.rakes.filter((r) => r.left <= 0).map((r) => `off its wheels on ${r.label}`).join(', ') || 'on its wheels on both rakes'}`],
    ['Push that lifts its wheels', `${F(s.tippingPush)} at ${L(s.pushHeight)}`, `check push ${F(a.checkPush)} (analogy): ${a.pushPasses ? 'stands it' : `does not, needs ${need(a.blocksForPush)}`}`],
    ['Load per caster (worst)', M(s.loadPerCaster), `any three of ${n} wheels; even share ${M(s.evenShare)}; rating ${a.casterRating !== null ? M(a.casterRating) : '________ (fill in)'}`],
    ['Rolling push', `${F(s.rollingPush.low)} to ${F(s.rollingPush.high)}`, '1-3 % of the weight on a smooth floor (from memory)'],
  ], [0, 150, 260])
  page.para(tippingSequence(s, formatAngle), 7.5)
  for (const f of a.findings) page.para(`${f.severity === 'error' ? 'Problem' : 'Check'}: ${f.message}`, 8.5, MARGIN, page.width - 2 * MARGIN, COLOURS.warn)

  page.heading('Cautions')
  for (const c of STABILITY_CAUTIONS) page.para(c, 7.5, MARGIN, page.width - 2 * MARGIN, COLOURS.ink)
}

/** Two pages (or more, where the lists run on) in the reader's units. */
export async function renderBuildSheetPdf(plate: Plate, options: BuildSheetOptions): Promise<Uint8Array> {
  const u = options.units
  const analysis = analyseUnit(plate, undefined, {
    length: (mm) => sheetLength(mm, u),
    mass: (kg) => formatMass(kg, u),
    force: (n) => formatForce(n, u),
  })
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  const font: PDFFont = await doc.embedFont(await unpackWoff(await resolveFontBytes(options.font)), { subset: true })
  doc.setTitle(`${options.meta.designName} - build sheet r${options.meta.revision}`)
  doc.setCreator('Rootplate')
  doc.setProducer('Rootplate')
  const [pw, ph] = PAGES[options.paper ?? (u === 'in' ? 'letter' : 'a4')]
  for (const draw of [firstPage, secondPage]) {
    const m = options.meta
    const page = new Page(new Ops(font, FONT), pw, ph, () => new Ops(font, FONT), `${m.designName} · revision r${m.revision} · build sheet, continued`)
    draw(page, plate, analysis, options)
    for (const ops of [...page.filled, page.ops]) {
      const pdfPage = doc.addPage([pw, ph])
      pdfPage.node.addContentStream(doc.context.register(doc.context.flateStream(ops.toString())))
      pdfPage.node.setFontDictionary(PDFName.of(FONT), font.ref)
    }
  }
  return doc.save()
}

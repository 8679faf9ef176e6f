// The full-size plate template: everything a carpenter needs to lay out and
// cut the plate from paper, at exactly 1:1, tiled over ordinary sheets.

import type { Plate, Point } from '../types'
import { signedArea } from '../math/polygon'
import type { FontBytes } from './fonts'
import { withExtraMarks, type ExtraMarks } from './extra-marks'
import { COLOURS, Ops, type LineStyle } from './pdf-ops'
import { guideOffset, guidePattern, type GuidePattern, type UnreachableRun } from './guide-line'
import { assertPlateLayer, PLATE_LAYER_LABEL, type PlateLayer } from './layers'
import { renderTiledPdf, type LegendEntry, type TemplateMeta, type TiledDrawing } from './tiled-pdf'
import { tilePlate, type Orientation, type PaperName, type Tiling } from './tiling'
import { assertExportUnits, formatTapeLength, type ExportUnits } from './units'
import { cutListLines, piecesFor, savedErrors, savedErrorsLine } from './plate-notes'

export interface BushingOptions {
  /** Outside diameter of the router guide bushing, mm. */
  bushingDiameter: number
  /** Cutting diameter of the bit, mm. */
  bitDiameter: number
}

export interface TemplateOptions {
  paper: PaperName
  /** Default 'auto': the orientation that prints fewer sheets. */
  orientation?: 'auto' | Orientation
  /** Strip shared by neighbouring sheets, mm. Default 12.7 (1/2 in). */
  overlap?: number
  /** Blank printer margin each side, mm. Default 6.35 (1/4 in). */
  margin?: number
  /** Units of the written sizes. Default 'in'. */
  units?: ExportUnits
  /**
   * Adds the pattern lines for routing with a guide bushing: the bushing rides
   * the pattern and the bit cuts (bushing - bit) / 2 beyond it, so the pattern
   * for the outside profile lies that far inside the cut line, and the pattern
   * for each routed opening that far outside its circle. Default none.
   */
  bushing?: BushingOptions
  /** 'top' draws the rabbets, 'bottom' leaves them out, 'all' is one template for both. Default 'all'. */
  layer?: PlateLayer
  /** Default: design name `Plate`, no size, no revision, today's date. */
  meta?: TemplateMeta
  /** Font file bytes (WOFF or TTF). Default: read on the server from @fontsource/ibm-plex-sans. */
  font?: FontBytes
  /** Marks another feature adds (e.g. skirt stations), drawn over the plate. */
  extraMarks?: ExtraMarks[]
}

/** Full-size line styles, widths and dashes in mm. */
export const TEMPLATE_STYLES = {
  cut: { colour: COLOURS.cut, width: 0.8 },
  hole: { colour: COLOURS.hole, width: 0.55 },
  rabbet: { colour: COLOURS.rabbet, width: 0.4, dash: [3, 1.6] },
  reference: { colour: COLOURS.reference, width: 0.3, dash: [8, 2, 1.5, 2] },
  drill: { colour: COLOURS.drill, width: 0.35 },
  mount: { colour: COLOURS.mount, width: 0.35 },
  notch: { colour: COLOURS.notch, width: 1.4 },
  router: { colour: COLOURS.router, width: 0.45, dash: [5, 2] },
  unreachable: { colour: COLOURS.warn, width: 0.9, dash: [1.2, 1.2] },
  centre: { colour: COLOURS.ink, width: 0.2 },
} satisfies Record<string, LineStyle>

/** Offset for a guide bushing: (bushing outside diameter - bit diameter) / 2 (router pattern practice). */
export function bushingOffset(bushing: BushingOptions): number {
  return guideOffset({ bushing: bushing.bushingDiameter, bit: bushing.bitDiameter })
}

/** What a bushing cannot follow is said in words on the sheet, not only by a line style. */
export const UNREACHABLE_LABEL = 'bushing cannot reach: cut by hand or flush-trim'

const TEXT = 3.2
const SMALL = 2.6

function topmost(points: Point[]): Point {
  let best = points[0] ?? [0, 0]
  for (const p of points) if (p[1] > best[1]) best = p
  return best
}

/** A circle as an n-gon: 32 sides keep a title block off it; 128 stand within 0.05 % of the radius for labels. */
function ring(x: number, y: number, r: number, n = 32): Point[] {
  return Array.from({ length: n }, (_, i) => [x + r * Math.cos((2 * i * Math.PI) / n), y + r * Math.sin((2 * i * Math.PI) / n)] as Point)
}

/** Text rotated along a direction but never upside down. */
function readableAngle(deg: number): number {
  const a = ((deg % 360) + 360) % 360
  return a > 90 && a < 270 ? a - 180 : a
}

/** Hatch ticks on the waste side (right of travel) of a missed run, and its label beside the middle. */
function drawUnreachable(ops: Ops, run: UnreachableRun): void {
  const S = TEMPLATE_STYLES
  const pts = run.points
  const closed = run.closed
  ops.style(S.unreachable).polygon(pts, closed).stroke()
  const ticks: [number, number, number, number][] = []
  const step = 2.5
  let carry = 0
  const n = pts.length
  let mid: { x: number; y: number; nx: number; ny: number } | null = null
  let walked = 0
  for (let i = 0; i < (closed ? n : n - 1); i++) {
    const a = pts[i]!
    const b = pts[(i + 1) % n]!
    const len = Math.hypot(b[0] - a[0], b[1] - a[1])
    if (len === 0) continue
    const ux = (b[0] - a[0]) / len
    const uy = (b[1] - a[1]) / len
    // Right of travel is the waste: outside a counter-clockwise outline, inside a clockwise opening.
    const nx = uy
    const ny = -ux
    if (!mid && walked + len >= run.length / 2) {
      const t = run.length / 2 - walked
      mid = { x: a[0] + ux * t, y: a[1] + uy * t, nx, ny }
    }
    walked += len
    let t = carry
    for (; t <= len; t += step) {
      const x = a[0] + ux * t
      const y = a[1] + uy * t
      ticks.push([x, y, x + 3 * nx + 1.5 * ux, y + 3 * ny + 1.5 * uy])
    }
    carry = t - len
  }
  ops.style({ colour: COLOURS.warn, width: 0.3 })
  for (const [x0, y0, x1, y1] of ticks) ops.line(x0, y0, x1, y1)
  ops.stroke()
  if (mid) {
    const angle = readableAngle((Math.atan2(mid.ny, mid.nx) * 180) / Math.PI - 90)
    ops.text(UNREACHABLE_LABEL, mid.x + 6 * mid.nx, mid.y + 6 * mid.ny, SMALL, { align: 'center', angle, colour: COLOURS.warn })
  }
}

function drawPlateBody(ops: Ops, plate: Plate, units: ExportUnits, pattern: GuidePattern | null, layer: PlateLayer): void {
  const len = (mm: number) => formatTapeLength(mm, units)
  const S = TEMPLATE_STYLES

  // Reference lines first, so cut lines print over them.
  const trunkR = plate.trunk.diameter / 2
  ops.style(S.reference).circle(plate.trunk.x, plate.trunk.y, trunkR).stroke()
  ops.text(`trunk circle Ø ${len(plate.trunk.diameter)}`, plate.trunk.x, plate.trunk.y + trunkR + 2, SMALL, {
    align: 'center',
    colour: COLOURS.reference,
  })
  const [ax0, ay0] = plate.axis.from
  const [ax1, ay1] = plate.axis.to
  ops.style(S.reference).line(ax0, ay0, ax1, ay1).stroke()
  ops.text('clocking axis', ax1 - 2 * Math.cos((plate.axis.angle * Math.PI) / 180), ay1 + 1.5, SMALL, {
    align: 'right',
    angle: readableAngle(plate.axis.angle),
    colour: COLOURS.reference,
  })

  for (const n of plate.notches) {
    ops.style(S.notch).arc(plate.trunk.x, plate.trunk.y, trunkR, n.startAngle, n.endAngle).stroke()
    const ends = [n.startAngle, n.endAngle].map((a) => (a * Math.PI) / 180)
    ops.style({ ...S.notch, width: 0.4 })
    for (const a of ends) {
      ops.line(
        plate.trunk.x + (trunkR - 4) * Math.cos(a),
        plate.trunk.y + (trunkR - 4) * Math.sin(a),
        plate.trunk.x + (trunkR + 4) * Math.cos(a),
        plate.trunk.y + (trunkR + 4) * Math.sin(a),
      )
    }
    ops.stroke()
    const mid = (n.angle * Math.PI) / 180
    ops.text(
      `tube notch ${len(n.width)}`,
      plate.trunk.x + (trunkR - 7) * Math.cos(mid),
      plate.trunk.y + (trunkR - 7) * Math.sin(mid),
      SMALL,
      { align: 'center', angle: readableAngle(n.angle - 90), colour: COLOURS.notch },
    )
  }

  for (const m of plate.casterMounts) {
    ops.style(S.mount).polygon(m.corners).stroke()
    const bolt = m.bolts[0]
    for (const b of m.bolts) {
      ops.style(S.drill).circle(b.x, b.y, b.diameter / 2).cross(b.x, b.y, b.diameter / 2 + 2).stroke()
    }
    const a = (m.angle * Math.PI) / 180
    const cx = m.corners.reduce((s, p) => s + p[0], 0) / Math.max(1, m.corners.length)
    const cy = m.corners.reduce((s, p) => s + p[1], 0) / Math.max(1, m.corners.length)
    const reach = Math.max(...m.corners.map((p) => (p[0] - cx) * Math.cos(a) + (p[1] - cy) * Math.sin(a)))
    const text = `caster plate${bolt ? `  ·  ${m.bolts.length} bolts Ø ${len(bolt.diameter)}` : ''}`
    ops.text(text, cx + (reach + 2.5) * Math.cos(a), cy + (reach + 2.5) * Math.sin(a), SMALL, {
      align: 'center',
      angle: readableAngle(m.angle - 90),
      colour: COLOURS.mount,
    })
  }

  // The bottom layer has no rabbets: drawing them would invite cutting one.
  for (const r of layer === 'bottom' ? [] : plate.rabbets) {
    const rr = r.diameter / 2
    ops.style(S.rabbet).circle(r.x, r.y, rr).stroke()
    ops.text(`rabbet Ø ${len(r.diameter)}, ${len(r.depth)} deep`, r.x, r.y - rr + 1.6, SMALL, {
      align: 'center',
      colour: COLOURS.rabbet,
    })
  }

  const names: Record<string, string> = { pocket: 'pocket', access: 'access', centre: 'centre hole', index: 'index hole' }
  for (const h of plate.holes) {
    const r = h.diameter / 2
    if (h.kind === 'index') {
      ops.style(S.drill).circle(h.x, h.y, r).cross(h.x, h.y, r + 4).stroke()
      ops.text(`drill Ø ${len(h.diameter)}  index`, h.x + r + 2.5, h.y + 1.5, SMALL, { colour: COLOURS.drill })
      continue
    }
    ops.style(S.hole).circle(h.x, h.y, r).stroke()
    const arm = Math.min(6, r * 0.45)
    ops.style(S.centre).cross(h.x, h.y, arm).stroke()
    const label = `${names[h.kind] ?? h.kind} Ø ${len(h.diameter)}`
    if (h.diameter >= 45) ops.text(label, h.x, h.y + arm + 2, TEXT, { align: 'center' })
    else ops.text(label, h.x + r * 0.75 + 1.5, h.y + r * 0.75 + 1.5, TEXT)
  }

  if (pattern) {
    ops.style(S.router)
    for (const ring of pattern.rings) ops.polygon(ring)
    ops.stroke()
    const outside = pattern.rings.filter((r) => signedArea(r) > 0)
    if (outside.length > 0) {
      const [tx, ty] = topmost(outside.flat())
      ops.text(`router pattern line, ${len(pattern.offset)} inside the cut line`, tx, ty - 4, SMALL, {
        align: 'center',
        colour: COLOURS.router,
      })
    }
    for (const run of pattern.unreachable) drawUnreachable(ops, run)
  }

  ops.style(S.cut).polygon(plate.outline).stroke()
  ops.style(S.centre).cross(plate.trunk.x, plate.trunk.y, 10).stroke()
}

/** `cut 2 per plate · both layers · top face up · 0.703 in plywood`: the cut list in one line for every sheet. */
function sheetNote(plate: Plate, layer: PlateLayer, units: ExportUnits): string {
  const { top, bottom } = piecesFor(plate, layer)
  return `cut ${top + bottom} per plate  ·  ${PLATE_LAYER_LABEL[layer]}  ·  top face up  ·  ${formatTapeLength(plate.params.sheetThickness, units)} plywood`
}

/** The cover's red box and each sheet's warning line, for a revision saved with errors. */
export function savedErrorsAlert(plate: Plate, units: ExportUnits): Pick<TiledDrawing, 'alerts'> {
  const errors = savedErrors(plate, units)
  return errors.length ? { alerts: { heading: savedErrorsLine(errors.length), lines: errors } } : {}
}

export interface PlateTemplate {
  drawing: TiledDrawing
  tiling: Tiling
}

/** The drawing and its tiling, without writing the PDF (for previews and tests). */
export function planTemplate(plate: Plate, options: TemplateOptions): PlateTemplate {
  const units = options.units ?? 'in'
  assertExportUnits(units)
  const layer = options.layer ?? 'all'
  assertPlateLayer(layer)
  const pattern = options.bushing
    ? guidePattern(plate, { bushing: options.bushing.bushingDiameter, bit: options.bushing.bitDiameter })
    : null
  const routerLines = pattern ? pattern.rings.filter((r) => signedArea(r) > 0) : []
  const tiling = tilePlate(plate, {
    paper: options.paper,
    ...(options.orientation ? { orientation: options.orientation } : {}),
    ...(options.margin !== undefined ? { margin: options.margin } : {}),
    ...(options.overlap !== undefined ? { overlap: options.overlap } : {}),
    extraOutlines: routerLines,
  })
  const S = TEMPLATE_STYLES
  const legend: LegendEntry[] = [
    { label: 'cut line (outside)', style: S.cut },
    { label: 'hole: cut, centre cross, diameter', style: S.hole },
    ...(layer === 'bottom' ? [] : [{ label: 'rabbet ring round a pocket', style: S.rabbet }]),
    { label: 'drill: index and bolt holes', style: S.drill },
    { label: 'caster plate outline', style: S.mount },
    { label: 'tube notch on the trunk circle', style: S.notch },
    { label: 'reference: trunk circle, clocking axis', style: S.reference },
  ]
  if (pattern) legend.push({ label: 'router pattern line (guide bushing)', style: S.router })
  if (pattern && pattern.unreachable.length > 0) legend.push({ label: 'bushing cannot reach (hatched): cut by hand', style: S.unreachable })
  const notes: string[] = []
  if (pattern) {
    notes.push(
      `Router pattern for a guide bushing: make the pattern to the long-dashed lines, ${formatTapeLength(pattern.offset, units)} ((bushing - bit) / 2) inside the outside cut line and outside each routed opening; the bushing rides the pattern and the bit cuts on the cut lines.`,
    )
    const missed = pattern.unreachable
    if (missed.length > 0) {
      const total = missed.reduce((s, r) => s + r.length, 0)
      // A total to tape-measure precision: 1/8 in or 1 mm.
      const step = units === 'in' ? 3.175 : 1
      notes.push(
        `The bushing cannot reach ${missed.length} stretch${missed.length === 1 ? '' : 'es'} of the cut line (about ${formatTapeLength(Math.max(step, Math.round(total / step) * step), units)} in all, hatched and labelled): a root, tip or web there is narrower than the pattern allows. Cut them by hand to the line or trim them with a flush-trim bit; a smaller bushing reaches more.`,
      )
    }
  }
  const title = layer === 'all' ? 'Plate template' : `Plate template, ${layer} layer`
  const drawing: TiledDrawing = {
    title,
    content: { bounds: tiling.content, polygons: [plate.outline, ...routerLines] },
    drawBody: (ops) => drawPlateBody(ops, plate, units, pattern, layer),
    mapShapes: [plate.outline],
    avoid: [
      { shape: plate.outline, weight: 10 },
      ...routerLines.map((shape) => ({ shape, weight: 10 })),
      ...(pattern ? pattern.rings.filter((r) => signedArea(r) < 0).map((shape) => ({ shape, weight: 3 })) : []),
      ...plate.holes.map((h) => ({ shape: ring(h.x, h.y, h.diameter / 2), weight: 3 })),
      ...(layer === 'bottom' ? [] : plate.rabbets).map((r) => ({ shape: ring(r.x, r.y, r.diameter / 2), weight: 2 })),
      ...plate.casterMounts.map((m) => ({ shape: m.corners, weight: 1 })),
      { shape: ring(plate.trunk.x, plate.trunk.y, plate.trunk.diameter / 2), weight: 1 },
    ],
    cutLines: [
      { shape: plate.outline, width: S.cut.width },
      ...(pattern ? pattern.rings.map((shape) => ({ shape, width: S.router.width })) : []),
      ...plate.holes.map((h) => ({ shape: ring(h.x, h.y, h.diameter / 2, 128), width: h.kind === 'index' ? S.drill.width : S.hole.width })),
      ...(layer === 'bottom' ? [] : plate.rabbets).map((r) => ({ shape: ring(r.x, r.y, r.diameter / 2, 128), width: S.rabbet.width })),
    ],
    legend,
    notes,
    cutList: cutListLines(plate, layer, units),
    sheetNote: sheetNote(plate, layer, units),
    ...savedErrorsAlert(plate, units),
  }
  return { drawing: withExtraMarks(drawing, options.extraMarks), tiling }
}

/** The tiled full-size template as PDF bytes: a cover sheet, then each printed sheet. */
export async function renderTemplatePdf(plate: Plate, options: TemplateOptions): Promise<Uint8Array> {
  const { drawing, tiling } = planTemplate(plate, options)
  return renderTiledPdf(drawing, tiling, {
    units: options.units ?? 'in',
    meta: options.meta ?? { designName: 'Plate' },
    ...(options.font ? { font: options.font } : {}),
  })
}

// The full-size plate template: everything a carpenter needs to lay out and
// cut the plate from paper, at exactly 1:1, tiled over ordinary sheets.

import type { Plate, Point } from '../types'
import type { FontBytes } from './fonts'
import { withExtraMarks, type ExtraMarks } from './extra-marks'
import { COLOURS, Ops, type LineStyle } from './pdf-ops'
import { offsetPolygon } from './polyline'
import { renderTiledPdf, type LegendEntry, type TemplateMeta, type TiledDrawing } from './tiled-pdf'
import { tilePlate, type Orientation, type PaperName, type Tiling } from './tiling'
import { assertExportUnits, formatShopLength, type ExportUnits } from './units'

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
  centre: { colour: COLOURS.ink, width: 0.2 },
} satisfies Record<string, LineStyle>

/** Offset for a guide bushing: (bushing outside diameter - bit diameter) / 2 (router pattern practice). */
export function bushingOffset(bushing: BushingOptions): number {
  const { bushingDiameter, bitDiameter } = bushing
  if (!(Number.isFinite(bushingDiameter) && Number.isFinite(bitDiameter)) || bitDiameter <= 0 || bushingDiameter <= bitDiameter) {
    throw new RangeError(
      `The bushing (${bushingDiameter} mm) must be wider than the bit (${bitDiameter} mm), both above zero.`,
    )
  }
  return (bushingDiameter - bitDiameter) / 2
}

const TEXT = 3.2
const SMALL = 2.6

function topmost(points: Point[]): Point {
  let best = points[0] ?? [0, 0]
  for (const p of points) if (p[1] > best[1]) best = p
  return best
}

/** A circle as a 32-gon, close enough to keep a title block off it. */
function ring(x: number, y: number, r: number): Point[] {
  return Array.from({ length: 32 }, (_, i) => [x + r * Math.cos((i * Math.PI) / 16), y + r * Math.sin((i * Math.PI) / 16)] as Point)
}

/** Text rotated along a direction but never upside down. */
function readableAngle(deg: number): number {
  const a = ((deg % 360) + 360) % 360
  return a > 90 && a < 270 ? a - 180 : a
}

function drawPlateBody(ops: Ops, plate: Plate, units: ExportUnits, routerLine: Point[] | null, offset: number): void {
  const len = (mm: number) => formatShopLength(mm, units)
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

  for (const r of plate.rabbets) {
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

  if (routerLine) {
    ops.style(S.router).polygon(routerLine).stroke()
    const [tx, ty] = topmost(routerLine)
    for (const h of plate.holes) {
      if (h.kind === 'pocket' || h.kind === 'access') ops.style(S.router).circle(h.x, h.y, h.diameter / 2 + offset).stroke()
    }
    ops.text(`router pattern line, ${len(offset)} inside the cut line`, tx, ty - 4, SMALL, {
      align: 'center',
      colour: COLOURS.router,
    })
  }

  ops.style(S.cut).polygon(plate.outline).stroke()
  ops.style(S.centre).cross(plate.trunk.x, plate.trunk.y, 10).stroke()
}

export interface PlateTemplate {
  drawing: TiledDrawing
  tiling: Tiling
}

/** The drawing and its tiling, without writing the PDF (for previews and tests). */
export function planTemplate(plate: Plate, options: TemplateOptions): PlateTemplate {
  const units = options.units ?? 'in'
  assertExportUnits(units)
  const offset = options.bushing ? bushingOffset(options.bushing) : 0
  const routerLine = options.bushing ? offsetPolygon(plate.outline, -offset) : null
  const tiling = tilePlate(plate, {
    paper: options.paper,
    ...(options.orientation ? { orientation: options.orientation } : {}),
    ...(options.margin !== undefined ? { margin: options.margin } : {}),
    ...(options.overlap !== undefined ? { overlap: options.overlap } : {}),
    extraOutlines: routerLine ? [routerLine] : [],
  })
  const S = TEMPLATE_STYLES
  const legend: LegendEntry[] = [
    { label: 'cut line (outside)', style: S.cut },
    { label: 'hole: cut, centre cross, diameter', style: S.hole },
    { label: 'rabbet ring round a pocket', style: S.rabbet },
    { label: 'drill: index and bolt holes', style: S.drill },
    { label: 'caster plate outline', style: S.mount },
    { label: 'tube notch on the trunk circle', style: S.notch },
    { label: 'reference: trunk circle, clocking axis', style: S.reference },
  ]
  if (routerLine) legend.push({ label: 'router pattern line (guide bushing)', style: S.router })
  const notes = routerLine
    ? [
        `Router pattern for a guide bushing: make the pattern to the long-dashed lines, ${formatShopLength(offset, units)} ((bushing - bit) / 2) inside the outside cut line and outside each routed opening; the bushing rides the pattern and the bit cuts on the cut lines.`,
      ]
    : []
  const drawing: TiledDrawing = {
    title: 'Plate template',
    content: { bounds: tiling.content, polygons: [plate.outline, ...(routerLine ? [routerLine] : [])] },
    drawBody: (ops) => drawPlateBody(ops, plate, units, routerLine, offset),
    mapShapes: [plate.outline],
    avoid: [
      { shape: plate.outline, weight: 10 },
      ...(routerLine ? [{ shape: routerLine, weight: 10 }] : []),
      ...plate.holes.map((h) => ({ shape: ring(h.x, h.y, h.diameter / 2), weight: 3 })),
      ...plate.rabbets.map((r) => ({ shape: ring(r.x, r.y, r.diameter / 2), weight: 2 })),
      ...plate.casterMounts.map((m) => ({ shape: m.corners, weight: 1 })),
      { shape: ring(plate.trunk.x, plate.trunk.y, plate.trunk.diameter / 2), weight: 1 },
    ],
    legend,
    notes,
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

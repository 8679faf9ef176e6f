// The wrap-around template for the tube: a paper strip as long as the tube's
// outside circumference, wrapped round its foot, showing where to cut the
// notches that clear the pockets and where the index line (the clocking axis)
// falls. Printed side out, bottom edge on the plate.

import type { Plate, Point } from '../types'
import type { FontBytes } from './fonts'
import { withExtraMarks, type ExtraMarks } from './extra-marks'
import { COLOURS, Ops } from './pdf-ops'
import { renderTiledPdf, type LegendEntry, type TemplateMeta, type TiledDrawing } from './tiled-pdf'
import { boundsOf, DEFAULT_PAD, tileContent, type Orientation, type PaperName, type Tiling } from './tiling'
import { savedErrorsAlert, TEMPLATE_STYLES } from './template-pdf'
import { MM_PER_INCH } from '../units'
import { RIM_RELIEF } from '../features/casters'
import { assertExportUnits, formatTapeLength, type ExportUnits } from './units'

export interface TubeWrapOptions {
  paper: PaperName
  /** Default 'auto'. */
  orientation?: 'auto' | Orientation
  /** mm; default 12.7 (1/2 in). */
  overlap?: number
  /** mm; default 6.35 (1/4 in). */
  margin?: number
  /** Default 'in'. */
  units?: ExportUnits
  /** Strip height, mm. Default 152.4 (6 in). */
  height?: number
  /**
   * Height drawn for each notch, mm. Default: each notch's own height from the
   * plate (the pan's rise above the top face plus a clearance).
   */
  notchHeight?: number
  /** Extra length past the index line for gluing the strip to itself, mm. Default 25.4 (1 in). */
  tab?: number
  meta?: TemplateMeta
  font?: FontBytes
  /** Marks another feature adds (e.g. where skirt strips land), drawn over the strip. */
  extraMarks?: ExtraMarks[]
}

export interface WrapNotch {
  pocketId: string
  /** Intervals along the strip, mm from the index line, split where a notch crosses the seam. */
  spans: [number, number][]
  centre: number
  width: number
  /** Cut height over the middle (the pan's body, or the whole notch when only a rim lies under the wall), mm. */
  height: number
  /** Cut height at the sides, where only the rim lies under the wall, mm. */
  rimHeight: number
  /** Width of the full-height middle, mm (the whole width when the notch is one height). */
  bodyWidth: number
}

export interface TubeWrapLayout {
  /** Outside circumference, pi x tube outside diameter. */
  circumference: number
  height: number
  notchHeight: number
  tab: number
  notches: WrapNotch[]
}

function positive(name: string, v: number): number {
  if (!Number.isFinite(v) || v <= 0) throw new RangeError(`${name} must be a positive length in mm, got ${v}.`)
  return v
}

/** Where everything falls along the unrolled strip (pure numbers, for tests and previews). */
export function tubeWrapLayout(plate: Plate, options: Pick<TubeWrapOptions, 'height' | 'notchHeight' | 'tab'> = {}): TubeWrapLayout {
  const circumference = positive('tube diameter', Math.PI * plate.trunk.diameter)
  const height = positive('height', options.height ?? 6 * MM_PER_INCH)
  const tallest = plate.notches.reduce((h, n) => Math.max(h, n.height), 0)
  const notchHeight = Math.min(height, positive('notchHeight', options.notchHeight ?? (tallest > 0 ? tallest : MM_PER_INCH)))
  const tab = options.tab ?? MM_PER_INCH
  if (!Number.isFinite(tab) || tab < 0) throw new RangeError(`tab must be zero or more, got ${tab}.`)
  const notches = plate.notches.map((n) => {
    const c = ((n.offsetAlongWrap % circumference) + circumference) % circumference
    const a = c - n.width / 2
    const b = c + n.width / 2
    const spans: [number, number][] = []
    // A notch across the seam is drawn in two parts, one at each end of the strip.
    if (a < 0) spans.push([0, b], [a + circumference, circumference])
    else if (b > circumference) spans.push([a, circumference], [0, b - circumference])
    else spans.push([a, b])
    const h = Math.min(height, options.notchHeight ?? n.height)
    const body = n.body === undefined ? { width: n.width } : n.body
    return {
      pocketId: n.pocketId,
      spans,
      centre: c,
      width: n.width,
      height: h,
      rimHeight: body && options.notchHeight === undefined ? Math.min(h, n.rimHeight ?? h) : h,
      bodyWidth: body ? Math.min(n.width, body.width) : n.width,
    }
  })
  return { circumference, height, notchHeight, tab, notches }
}

function drawWrapBody(ops: Ops, layout: TubeWrapLayout, plate: Plate, units: ExportUnits): void {
  const { circumference: C, height: H, tab } = layout
  // Marks are measured with a tape round the tube: fractions, not decimals.
  const len = (mm: number) => formatTapeLength(mm, units)
  const S = TEMPLATE_STYLES

  // Each notch as cut: the rim's low relief at the sides, the pan body's full height in the middle. Drawn
  // at its centre and a turn either way, clipped to the strip and its glue tab, so a notch across the seam
  // shows its parts at both ends and the tab repeats the start.
  for (const n of layout.notches) {
    const half = n.width / 2
    const mid = n.bodyWidth / 2
    const profile = (c: number): Point[] => n.bodyWidth < n.width - 1e-6 && n.rimHeight < n.height
      ? [[c - half, 0], [c - half, n.rimHeight], [c - mid, n.rimHeight], [c - mid, n.height], [c + mid, n.height], [c + mid, n.rimHeight], [c + half, n.rimHeight], [c + half, 0]]
      : [[c - half, 0], [c - half, n.height], [c + half, n.height], [c + half, 0]]
    ops.save().rect(0, 0, C + tab, H).clip()
    for (const c of [n.centre - C, n.centre, n.centre + C]) {
      const pts = profile(c)
      ops.fillColour(COLOURS.warnTint).polygon(pts).fill()
      ops.style({ colour: COLOURS.notch, width: 0.6 }).polygon(pts, false).stroke()
    }
    ops.restore()
    ops.style(S.centre).line(n.centre, 0, n.centre, n.height + 6).stroke()
    const pocket = n.pocketId.replace(/^pocket-(\d+)$/, (_, i: string) => `pocket ${Number(i) + 1}`)
    // A notch split by the index line is labelled on each part, the text kept on the strip.
    for (const [a, b] of n.spans) {
      const align = a <= 0 ? 'left' : b >= C ? 'right' : 'center'
      const x = align === 'left' ? a + 2 : align === 'right' ? b - 2 : (a + b) / 2
      ops.text(`notch over ${pocket}`, x, n.height + 12, 3.2, { align, colour: COLOURS.notch })
      const size = n.bodyWidth < n.width - 1e-6 && n.rimHeight < n.height
        ? `${len(n.width)} wide, ${len(n.rimHeight)} high over the rim, ${len(n.bodyWidth)} of it ${len(n.height)} high over the pan`
        : `${len(n.width)} wide, ${len(n.height)} high`
      ops.text(`${size}, centre ${len(n.centre)} from the index line`, x, n.height + 7.5, 2.6, {
        align,
        colour: COLOURS.muted,
      })
    }
  }

  // Length ticks along the top edge: every inch or every 10 mm, numbered every 6 in or 100 mm.
  const tick = units === 'in' ? MM_PER_INCH : 10
  const every = units === 'in' ? 6 : 10
  ops.style({ colour: COLOURS.reference, width: 0.2 })
  for (let i = 0; i * tick <= C + tab; i++) {
    const x = i * tick
    const long = i % every === 0
    ops.line(x, H, x, H - (long ? 6 : 3))
  }
  ops.stroke()
  for (let i = every; i * tick <= C; i += every) {
    ops.text(len(i * tick), i * tick, H - 9.5, 2.4, { align: 'center', colour: COLOURS.muted })
  }

  ops.style({ ...S.reference, colour: COLOURS.ink, width: 0.45 }).line(0, 0, 0, H).line(C, 0, C, H).stroke()
  for (const x of [0, C]) {
    ops.text('index line: on the clocking axis mark', x + 2.5, H / 2, 3, { angle: 90, align: 'center' })
  }
  if (tab > 0) ops.text('glue tab: under the start of the strip', C + tab / 2 + 1, H / 2, 2.6, { angle: 90, align: 'center', colour: COLOURS.muted })

  const info = `tube wrap  ·  tube Ø ${len(plate.trunk.diameter)} outside  ·  circumference ${len(C)}  ·  printed side out, this edge on the plate`
  for (let x = 40; x < C - 60; x += 400) ops.text(info, x, 3, 3, { colour: COLOURS.muted })

  ops.style(S.cut).polygon([
    [0, 0],
    [C + tab, 0],
    [C + tab, H],
    [0, H],
  ]).stroke()
}

export interface TubeWrap {
  drawing: TiledDrawing
  tiling: Tiling
  layout: TubeWrapLayout
}

export function planTubeWrap(plate: Plate, options: TubeWrapOptions): TubeWrap {
  const units = options.units ?? 'in'
  assertExportUnits(units)
  const layout = tubeWrapLayout(plate, options)
  const strip: Point[] = [
    [0, 0],
    [layout.circumference + layout.tab, 0],
    [layout.circumference + layout.tab, layout.height],
    [0, layout.height],
  ]
  const content = { bounds: boundsOf(strip, DEFAULT_PAD), polygons: [strip] }
  const tiling = tileContent(content, {
    paper: options.paper,
    anchor: 'bottom',
    ...(options.orientation ? { orientation: options.orientation } : {}),
    ...(options.margin !== undefined ? { margin: options.margin } : {}),
    ...(options.overlap !== undefined ? { overlap: options.overlap } : {}),
  })
  const legend: LegendEntry[] = [
    { label: 'cut line (strip edge)', style: TEMPLATE_STYLES.cut },
    { label: 'notch over a pocket: cut out of the tube', style: { colour: COLOURS.notch, width: 0.6 } },
    { label: 'index line', style: { ...TEMPLATE_STYLES.reference, colour: COLOURS.ink, width: 0.45 } },
  ]
  const drawing: TiledDrawing = {
    title: 'Tube wrap',
    content,
    drawBody: (ops) => drawWrapBody(ops, layout, plate, units),
    mapShapes: [strip],
    avoid: [{ shape: strip, weight: 1 }],
    cutLines: [{ shape: strip, width: TEMPLATE_STYLES.cut.width }],
    legend,
    notes: [
      `Wrap the strip round the foot of the tube, printed side out, bottom edge on the plate, the index line on the tube's clocking mark. Mark the notches and cut them.`,
      `Notches are cut only where a pan or its rim lies under the tube wall, as high as what is under it: over a pan's body, how far the pan rises above the plate plus a clearance for its crown and the caster's nuts (${formatTapeLength(layout.notchHeight, units)} at most here); where only the flush rim lies under the wall, a ${formatTapeLength(RIM_RELIEF, units)} relief over its fastener heads. They follow from the caster offset, the pan depth and the rabbet depth set in the editor; change those to change them.`,
      `Tube ${formatTapeLength(plate.trunk.diameter, units)} outside, circumference ${formatTapeLength(layout.circumference, units)}; ${layout.notches.length} notch${layout.notches.length === 1 ? '' : 'es'}, one over each pocket.`,
    ],
    ...savedErrorsAlert(plate, units),
  }
  return { drawing: withExtraMarks(drawing, options.extraMarks), tiling, layout }
}

export async function renderTubeWrapPdf(plate: Plate, options: TubeWrapOptions): Promise<Uint8Array> {
  const { drawing, tiling } = planTubeWrap(plate, options)
  return renderTiledPdf(drawing, tiling, {
    units: options.units ?? 'in',
    meta: options.meta ?? { designName: 'Plate' },
    ...(options.font ? { font: options.font } : {}),
  })
}

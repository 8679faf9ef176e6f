// Full-size profile template of the skirt strips' curves, for a shop that
// cuts ribs instead of bending strips: one rib per distinct size (stations
// with the same run and rise, to the shop's step, share a rib), laid out in
// rows and tiled over ordinary sheets like the plate template.

import type { Plate, Point } from '../types'
import { profilePoints, skirtStrips, cutStep, type SkirtOptions, type SkirtStrip } from '../skirt/strips'
import type { FontBytes } from './fonts'
import { COLOURS } from './pdf-ops'
import { renderTiledPdf, type TemplateMeta, type TiledDrawing } from './tiled-pdf'
import { boundsOf, DEFAULT_PAD, tileContent, type Orientation, type PaperName, type Tiling } from './tiling'
import { TEMPLATE_STYLES } from './template-pdf'
import { assertExportUnits, formatTapeLength, type ExportUnits } from './units'
import { SKIRT_STYLE } from './skirt-marks'

export interface SkirtProfileOptions {
  paper: PaperName
  orientation?: 'auto' | Orientation
  overlap?: number
  margin?: number
  units?: ExportUnits
  /** Widest row of ribs, mm. Default 1200 (about a 4 ft sheet). */
  rowWidth?: number
  /** Overrides of the plate's saved skirt settings. */
  skirt?: SkirtOptions
  meta?: TemplateMeta
  font?: FontBytes
}

export interface ProfileRib {
  run: number
  rise: number
  length: number
  stations: number[]
  /** Where the rib's foot (plate edge, plate top) sits on the drawing. */
  origin: Point
  /** Closed rib outline on the drawing: along the curve, down the tube wall, back along the plate top. */
  shape: Point[]
}

/** Ribs grouped by run and rise rounded to the shop's step, placed in rows (pure numbers, for tests and previews). */
export function skirtProfileLayout(plate: Plate, options: Pick<SkirtProfileOptions, 'units' | 'rowWidth' | 'skirt'> = {}): { ribs: ProfileRib[]; strips: SkirtStrip[] } {
  const units = options.units ?? 'in'
  const rowWidth = options.rowWidth ?? 1200
  const { strips, settings } = skirtStrips(plate, options.skirt ?? {})
  const step = cutStep(units)
  const groups = new Map<string, SkirtStrip[]>()
  for (const s of strips) {
    const key = `${Math.round(s.run / step)}:${Math.round(s.rise / step)}`
    groups.set(key, [...(groups.get(key) ?? []), s])
  }
  const sizes = [...groups.values()].map((g) => {
    const longest = g.reduce((a, b) => (b.length > a.length ? b : a))
    return { run: longest.run, rise: longest.rise, length: longest.length, stations: g.map((s) => s.number) }
  }).sort((a, b) => b.run - a.run)
  const gap = 20
  const label = 14
  const ribs: ProfileRib[] = []
  let x = 0
  let y = 0
  let rowHeight = 0
  for (const r of sizes) {
    if (x > 0 && x + r.run > rowWidth) {
      y -= rowHeight + gap + label
      x = 0
      rowHeight = 0
    }
    const origin: Point = [x, y]
    const curve = profilePoints(r.run, r.rise, settings.profile, 64).map(([px, py]) => [x + px, y + py] as Point)
    const shape: Point[] = [...curve, [x + r.run, y]]
    ribs.push({ ...r, origin, shape })
    x += Math.max(r.run, 40) + gap
    rowHeight = Math.max(rowHeight, r.rise)
  }
  return { ribs, strips }
}

export function planSkirtProfiles(plate: Plate, options: SkirtProfileOptions): { drawing: TiledDrawing; tiling: Tiling; ribs: ProfileRib[] } {
  const units = options.units ?? 'in'
  assertExportUnits(units)
  const { ribs } = skirtProfileLayout(plate, options)
  if (ribs.length === 0) throw new RangeError('This plate has no skirt stations to draw.')
  const all = ribs.flatMap((r) => [...r.shape, [r.origin[0], r.origin[1] - 14] as Point])
  const content = { bounds: boundsOf(all, DEFAULT_PAD), polygons: ribs.map((r) => r.shape) }
  const tiling = tileContent(content, {
    paper: options.paper,
    ...(options.orientation ? { orientation: options.orientation } : {}),
    ...(options.margin !== undefined ? { margin: options.margin } : {}),
    ...(options.overlap !== undefined ? { overlap: options.overlap } : {}),
  })
  const len = (mm: number) => formatTapeLength(mm, units)
  const drawing: TiledDrawing = {
    title: 'Skirt rib profiles',
    content,
    drawBody(ops) {
      for (const r of ribs) {
        ops.style(TEMPLATE_STYLES.cut).polygon(r.shape).stroke()
        const [ox, oy] = r.origin
        ops.style(SKIRT_STYLE).line(ox + r.run, oy, ox + r.run, oy + r.rise + 6).stroke()
        const who = r.stations.length > 6 ? `${r.stations.slice(0, 6).join(', ')} … (${r.stations.length})` : r.stations.join(', ')
        ops.text(`stations ${who}`, ox, oy - 5, 3, { colour: COLOURS.ink })
        ops.text(`run ${len(r.run)}  rise ${len(r.rise)}  curve ${len(r.length)}  x${r.stations.length}`, ox, oy - 10, 2.6, { colour: COLOURS.muted })
        ops.text('tube wall', ox + r.run - 1.5, oy + 3, 2.4, { angle: 90, colour: SKIRT_STYLE.colour })
      }
    },
    mapShapes: ribs.map((r) => r.shape),
    avoid: ribs.map((r) => ({ shape: r.shape, weight: 5 })),
    legend: [
      { label: 'rib outline: curve, tube wall, plate top', style: TEMPLATE_STYLES.cut },
      { label: 'tube wall line', style: SKIRT_STYLE },
    ],
    notes: [
      'Each rib stands on the plate top at its station, its foot at the plate edge and its upright side against the tube. Stations with the same run and rise share a rib: cut one per station listed.',
    ],
  }
  return { drawing, tiling, ribs }
}

export async function renderSkirtProfilesPdf(plate: Plate, options: SkirtProfileOptions): Promise<Uint8Array> {
  const { drawing, tiling } = planSkirtProfiles(plate, options)
  return renderTiledPdf(drawing, tiling, {
    units: options.units ?? 'in',
    meta: options.meta ?? { designName: 'Plate' },
    ...(options.font ? { font: options.font } : {}),
  })
}

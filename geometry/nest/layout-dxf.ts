// One DXF per nested sheet for the CNC shop: every part with every hole
// (pockets, access openings, pilots, rabbets, drilled holes), on the same
// layers as a plate's own cut file (geometry/export/cut-layers.ts), turned and
// moved to where the plan put it, and the notes (what each part is, its holes,
// the saw sizes, any errors it was saved with) on RP-NOTES below the sheet.
// The sheet's edge and margin go on a layer that is never cut, so nothing but
// geometry sits on the cut layers.

import Drawing from 'dxf-writer'
import type { Point } from '../types'
import { buildCutDrawing, holeSawLayerName, LAYER_NOTES, type CutEntity, type LayerRole } from '../export/cut-layers'
import { formatShopLength, type ExportUnits } from '../export/units'
import type { OpeningCut } from '../export/layers'
import { PLATE_LAYER_LABEL } from '../export/layers'
import { holeListLines, savedErrors, savedErrorsLine } from '../export/plate-notes'
import type { PlanEntry, SheetPlan } from './plan'

/** Never cut: the sheet's outline and the margin line. */
export const LAYER_SHEET = 'RP-SHEET'

/** AutoCAD Color Index per operation, as in the plate's own cut file. */
const COLOUR: Record<LayerRole, number> = { outside: 3, inside: 5, rabbet: 30, drill: 1, reference: 8 }

export interface LayoutDxfOptions {
  units: ExportUnits
  /** Pockets and openings routed as inside profiles (default) or marked for a hole saw with pilots, as in a plate's own cut file. */
  openings?: OpeningCut
}

function place(p: Point, turn: number, at: Point, k: number): Point {
  const t = (turn * Math.PI) / 180
  const c = turn % 90 === 0 ? Math.round(Math.cos(t)) : Math.cos(t)
  const s = turn % 90 === 0 ? Math.round(Math.sin(t)) : Math.sin(t)
  return [p[0] * c - p[1] * s + at[0] * k, p[0] * s + p[1] * c + at[1] * k]
}

/** The DXF text of sheet `index` (0-based) of the plan. */
export function renderLayoutDxf(plan: SheetPlan, entries: PlanEntry[], index: number, options: LayoutDxfOptions): string {
  const layout = plan.layouts[index]
  if (!layout) throw new RangeError(`The plan has ${plan.layouts.length} sheets; there is no sheet ${index + 1}.`)
  const k = options.units === 'in' ? 1 / 25.4 : 1
  const d = new Drawing()
  d.setUnits(options.units === 'in' ? 'Inches' : 'Millimeters')
  d.header('MEASUREMENT', [[70, options.units === 'in' ? 0 : 1]])
  const layers = new Map<string, CutEntity[]>()
  const roles = new Map<string, { role: LayerRole; cut: boolean }>()
  for (const part of layout.parts) {
    const entry = entries[part.entry]!
    // Glued first, a panel is cut with the top layer's rabbets; cut alone, each layer has its own file content.
    const cut = buildCutDrawing(entry.plate, { units: options.units, layer: part.layer, includeReference: false, openings: options.openings ?? 'routed' })
    // Without reference marks, every layer left is the plate's: the cut ones and the hole-saw marks.
    for (const layer of cut.layers) {
      roles.set(layer.name, { role: layer.role, cut: layer.cut })
      const list = layers.get(layer.name) ?? []
      layers.set(layer.name, list)
      for (const e of layer.entities) {
        if (e.type === 'circle') {
          const [x, y] = place([e.x, e.y], part.turn, part.at, k)
          list.push({ type: 'circle', x, y, r: e.r })
        } else if (e.type === 'line') {
          list.push({ type: 'line', from: place(e.from, part.turn, part.at, k), to: place(e.to, part.turn, part.at, k) })
        } else {
          list.push({ type: 'polyline', closed: e.closed, points: e.points.map((p) => place(p, part.turn, part.at, k)) })
        }
      }
    }
  }
  for (const [name, { role, cut }] of roles) d.addLayer(name, COLOUR[role], cut ? 'CONTINUOUS' : 'DASHED')
  d.addLayer(LAYER_SHEET, 8, 'DASHED')
  d.addLayer(LAYER_NOTES, 7, 'CONTINUOUS')
  for (const [name, list] of layers) {
    d.setActiveLayer(name)
    for (const e of list) {
      if (e.type === 'circle') d.drawCircle(e.x, e.y, e.r)
      else if (e.type === 'line') d.drawLine(e.from[0], e.from[1], e.to[0], e.to[1])
      else d.drawPolyline(e.points, e.closed)
    }
  }
  d.setActiveLayer(LAYER_SHEET)
  const { width, height, margin } = plan.sheet
  const rect = (x0: number, y0: number, x1: number, y1: number): Point[] => [
    [x0 * k, y0 * k],
    [x1 * k, y0 * k],
    [x1 * k, y1 * k],
    [x0 * k, y1 * k],
  ]
  d.drawPolyline(rect(0, 0, width, height), true)
  if (margin > 0) d.drawPolyline(rect(margin, margin, width - margin, height - margin), true)
  writeNotes(d, plan, entries, index, options)
  return d.toDxfString()
}

const PART_WORDS = { all: 'panel (every layer glued, top layer up)', top: 'top layer', bottom: 'bottom layer' } as const

/** The sheet's notes, below the sheet on RP-NOTES (text only, never cut). */
function writeNotes(d: Drawing, plan: SheetPlan, entries: PlanEntry[], index: number, options: LayoutDxfOptions): void {
  const units = options.units
  const openings = options.openings ?? 'routed'
  const layout = plan.layouts[index]!
  const L = (mm: number) => formatShopLength(mm, units)
  const lines: string[] = [
    `Sheet ${index + 1} of ${plan.layouts.length} - ${L(plan.sheet.width)} x ${L(plan.sheet.height)}, ${L(plan.sheet.margin)} margin, ${L(plan.sheet.kerf)} kerf - units ${units === 'in' ? 'inches' : 'millimetres'}${layout.sheets > 1 ? ` - a panel of ${layout.sheets} sheets glued` : ''}`,
  ]
  layout.parts.forEach((part, k) => {
    const e = entries[part.entry]!
    lines.push(`Part ${k + 1}: ${e.name}${e.size ? ` ${e.size}` : ''}, ${PART_WORDS[part.layer]}${part.layerNumber > 1 ? ` ${part.layerNumber}` : ''}, turned ${Number(part.turn.toFixed(2))} deg.`)
  })
  // Each design and layer once: its saved errors, then its holes.
  const seen = new Set<string>()
  for (const part of layout.parts) {
    const plateLayer = part.layer === 'all' ? 'all' : part.layer
    const key = `${part.entry} ${plateLayer}`
    if (seen.has(key)) continue
    seen.add(key)
    const e = entries[part.entry]!
    const errors = savedErrors(e.plate, units)
    lines.push(`${e.name}${e.size ? ` ${e.size}` : ''}, ${PLATE_LAYER_LABEL[plateLayer]}:`)
    if (errors.length) lines.push(`  ${savedErrorsLine(errors.length)}`, ...errors.map((t) => `    ${t}`))
    lines.push(...holeListLines(e.plate, plateLayer, units, openings, (saw) => holeSawLayerName(saw, units)).map((t) => `  ${t}`))
  }
  lines.push('This layer (RP-NOTES) is notes only: do not cut it.')
  const height = units === 'in' ? 0.4 : 10
  const gap = height * 1.7
  d.setActiveLayer(LAYER_NOTES)
  let y = -2 * gap
  for (const line of lines) {
    // DXF TEXT is one line of plain characters: keep it to what every reader shows.
    d.drawText(0, y, height, 0, line.replace(/[^\x20-\x7e]/g, (c) => (c === '\u00b0' ? ' deg' : c === '\u00b7' ? '-' : '?')))
    y -= gap
  }
}

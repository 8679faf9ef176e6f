// One DXF per nested sheet for the CNC shop: every part with its holes, on
// the same layers as a plate's own cut file (geometry/export/cut-layers.ts),
// turned and moved to where the plan put it. The sheet's edge and margin go on
// a layer that is never cut, so nothing but geometry sits on the cut layers.

import Drawing from 'dxf-writer'
import type { Point } from '../types'
import { buildCutDrawing, type CutEntity, type LayerRole } from '../export/cut-layers'
import type { ExportUnits } from '../export/units'
import type { PlanEntry, SheetPlan } from './plan'

/** Never cut: the sheet's outline and the margin line. */
export const LAYER_SHEET = 'RP-SHEET'

/** AutoCAD Color Index per operation, as in the plate's own cut file. */
const COLOUR: Record<LayerRole, number> = { outside: 3, inside: 5, rabbet: 30, drill: 1, reference: 8 }

export interface LayoutDxfOptions {
  units: ExportUnits
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
    const cut = buildCutDrawing(entry.plate, { units: options.units, layer: part.layer, includeReference: false })
    for (const layer of cut.layers) {
      if (!layer.cut) continue
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
  for (const [name, { role }] of roles) d.addLayer(name, COLOUR[role], 'CONTINUOUS')
  d.addLayer(LAYER_SHEET, 8, 'DASHED')
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
  return d.toDxfString()
}

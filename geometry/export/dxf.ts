// The cut file for a CNC shop as DXF: real units in the header, one layer per
// operation, closed outlines, round holes as circles, nothing but geometry on
// the layers that are cut.

import Drawing from 'dxf-writer'
import type { Plate } from '../types'
import { buildCutDrawing, type CutOptions, type LayerRole } from './cut-layers'

export type DxfOptions = CutOptions

/** AutoCAD Color Index numbers per operation, chosen so the layers are easy to tell apart on screen. */
const LAYER_COLOUR: Record<LayerRole, number> = {
  outside: 3,
  inside: 5,
  rabbet: 30,
  drill: 1,
  reference: 8,
}

/**
 * Write the plate as DXF text. Units 'in' set `$INSUNITS` 1, 'mm' set 4 (DXF
 * Reference, HEADER section); `$MEASUREMENT` follows (0 imperial, 1 metric).
 */
export function renderCutDxf(plate: Plate, options: DxfOptions): string {
  const cut = buildCutDrawing(plate, options)
  const d = new Drawing()
  d.setUnits(cut.units === 'in' ? 'Inches' : 'Millimeters')
  d.header('MEASUREMENT', [[70, cut.units === 'in' ? 0 : 1]])
  for (const layer of cut.layers) {
    d.addLayer(layer.name, LAYER_COLOUR[layer.role], layer.cut ? 'CONTINUOUS' : 'DASHED')
  }
  for (const layer of cut.layers) {
    d.setActiveLayer(layer.name)
    for (const e of layer.entities) {
      if (e.type === 'circle') d.drawCircle(e.x, e.y, e.r)
      else if (e.type === 'line') d.drawLine(e.from[0], e.from[1], e.to[0], e.to[1])
      else d.drawPolyline(e.points, e.closed)
    }
  }
  return d.toDxfString()
}

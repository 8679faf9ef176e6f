// The cut file for a CNC shop as DXF: real units in the header, one layer per
// operation, closed outlines, round holes as circles, nothing but geometry on
// the layers that are cut.

import Drawing from 'dxf-writer'
import type { Plate } from '../types'
import { buildCutDrawing, holeSawLayerName, LAYER_NOTES, type CutOptions, type LayerRole } from './cut-layers'
import { PLATE_LAYER_LABEL } from './layers'
import { cutListLines, holeListLines, savedErrors, savedErrorsLine } from './plate-notes'

/** What the notes layer says about the design the file was made from. */
export interface CutFileMeta {
  designName: string
  sizeLabel?: string
  revision?: number
}

export interface DxfOptions extends CutOptions {
  meta?: CutFileMeta
}

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
  d.addLayer(LAYER_NOTES, 7, 'CONTINUOUS')
  for (const layer of cut.layers) {
    d.setActiveLayer(layer.name)
    for (const e of layer.entities) {
      if (e.type === 'circle') d.drawCircle(e.x, e.y, e.r)
      else if (e.type === 'line') d.drawLine(e.from[0], e.from[1], e.to[0], e.to[1])
      else d.drawPolyline(e.points, e.closed)
    }
  }
  writeNotes(d, plate, options, cut.bounds, cut.units)
  return d.toDxfString()
}

/**
 * The notes, as TEXT on a layer no machine cuts, below the drawing: a CNC
 * shop reading only this file still learns what it is, how many to cut, the
 * face up and the thickness, and that the revision was saved with errors.
 */
function writeNotes(d: Drawing, plate: Plate, options: DxfOptions, bounds: { minX: number; minY: number }, units: 'in' | 'mm'): void {
  const layer = options.layer ?? 'all'
  const meta = options.meta
  const errors = savedErrors(plate, units)
  const title = [
    meta?.designName ?? 'Rootplate plate',
    meta?.sizeLabel,
    meta?.revision !== undefined ? `revision ${meta.revision}` : undefined,
    PLATE_LAYER_LABEL[layer],
    `units ${units === 'in' ? 'inches' : 'millimetres'}`,
  ].filter((s): s is string => !!s).join(' - ')
  const lines = [
    ...(errors.length ? [savedErrorsLine(errors.length), ...errors.map((e) => `  ${e}`)] : []),
    title,
    ...cutListLines(plate, layer, units, options.mirror ?? false),
    ...holeListLines(plate, layer, units, options.openings ?? 'routed', (saw) => holeSawLayerName(saw, units)),
    'This layer (RP-NOTES) is notes only: do not cut it.',
  ]
  const height = units === 'in' ? 0.2 : 5
  const gap = height * 1.7
  d.setActiveLayer(LAYER_NOTES)
  let y = bounds.minY - 2 * gap
  for (const line of lines) {
    // DXF TEXT is one line of plain characters: keep it to what every reader shows.
    d.drawText(bounds.minX, y, height, 0, line.replace(/[^\x20-\x7e]/g, (c) => (c === '\u00b0' ? ' deg' : c === '\u00b7' ? '-' : '?')))
    y -= gap
  }
}

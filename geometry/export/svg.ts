// The cut geometry as SVG at real size: the same entities and layer names as
// the DXF, each layer a group, y turned so the drawing reads as in the editor.

import type { Plate } from '../types'
import { buildCutDrawing, holeSawLayerName, type CutOptions, type LayerRole } from './cut-layers'
import { cutListLines, holeListLines, savedErrors, savedErrorsLine } from './plate-notes'

export type SvgOptions = CutOptions

/** Rootplate's own palette: deep green for cuts, warm grey for what is only drawn. */
const LAYER_STROKE: Record<LayerRole, string> = {
  outside: '#0b5d3b',
  inside: '#1f6f8b',
  rabbet: '#b07219',
  drill: '#a8322d',
  reference: '#8a817c',
}

function n(v: number): string {
  return String(Number(v.toFixed(5)))
}

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
}

export function renderCutSvg(plate: Plate, options: SvgOptions): string {
  const cut = buildCutDrawing(plate, options)
  const u = cut.units
  // Room for the stroke so the outline is not clipped at the edge of the drawing.
  const pad = u === 'in' ? 0.1 : 2.5
  const stroke = u === 'in' ? 0.01 : 0.25
  const minX = cut.bounds.minX - pad
  const maxY = cut.bounds.maxY + pad
  const width = cut.bounds.maxX - cut.bounds.minX + 2 * pad
  const height = cut.bounds.maxY - cut.bounds.minY + 2 * pad
  const y = (v: number) => n(-v)
  const lines: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}${u}" height="${n(height)}${u}" viewBox="${n(minX)} ${n(-maxY)} ${n(width)} ${n(height)}" fill="none" stroke-linecap="round" stroke-linejoin="round">`,
  ]
  // The notes the DXF carries on RP-NOTES, as the file's description: never drawn, so never cut.
  const errors = savedErrors(plate, u)
  const notes = [...(errors.length ? [savedErrorsLine(errors.length), ...errors] : []), ...cutListLines(plate, cut.layer, u, options.mirror ?? false), ...holeListLines(plate, cut.layer, u, options.openings ?? 'routed', (saw) => holeSawLayerName(saw, u))]
  lines.push(`<desc>${escapeXml(notes.join('\n'))}</desc>`)
  for (const layer of cut.layers) {
    const dash = layer.cut ? '' : ` stroke-dasharray="${n(stroke * 12)} ${n(stroke * 6)}"`
    lines.push(
      `<g id="${escapeXml(layer.name)}" data-operation="${layer.role}" stroke="${LAYER_STROKE[layer.role]}" stroke-width="${n(stroke)}"${dash}>`,
    )
    for (const e of layer.entities) {
      if (e.type === 'circle') lines.push(`<circle cx="${n(e.x)}" cy="${y(e.y)}" r="${n(e.r)}"/>`)
      else if (e.type === 'line') {
        lines.push(`<line x1="${n(e.from[0])}" y1="${y(e.from[1])}" x2="${n(e.to[0])}" y2="${y(e.to[1])}"/>`)
      } else {
        const pts = e.points.map((p) => `${n(p[0])},${y(p[1])}`).join(' ')
        lines.push(e.closed ? `<polygon points="${pts}"/>` : `<polyline points="${pts}"/>`)
      }
    }
    lines.push('</g>')
  }
  lines.push('</svg>')
  return lines.join('\n')
}

// Skirt marks for the templates: station ticks and numbers on the plate
// template's edge, and on the tube wrap where each strip lands and how high.
// Handed to the writers through their `extraMarks` option.

import type { Plate } from '../types'
import type { SkirtStrip } from '../skirt/strips'
import type { ExtraMarks } from './extra-marks'
import type { LineStyle, Rgb } from './pdf-ops'
import { formatTapeLength, type ExportUnits } from './units'

export const SKIRT_COLOUR: Rgb = [0.63, 0.32, 0.18]
export const SKIRT_STYLE: LineStyle = { colour: SKIRT_COLOUR, width: 0.4 }

/** A tick across the plate edge on each station's ray (4 mm in, 8 mm out) and the station number beyond it. */
export function plateStationMarks(strips: readonly SkirtStrip[]): ExtraMarks {
  return {
    legend: [{ label: 'skirt station: tick across the edge, number', style: SKIRT_STYLE }],
    notes: strips.length
      ? [`Skirt: ${strips.length} stations, numbered counter-clockwise from the clocking axis; strip numbers on the cut list and the tube wrap match them.`]
      : [],
    draw(ops) {
      ops.style(SKIRT_STYLE)
      for (const s of strips) {
        const a = (s.angle * Math.PI) / 180
        const c = Math.cos(a)
        const d = Math.sin(a)
        ops.line(s.at[0] - 4 * c, s.at[1] - 4 * d, s.at[0] + 8 * c, s.at[1] + 8 * d)
      }
      ops.stroke()
      for (const s of strips) {
        const a = (s.angle * Math.PI) / 180
        const r = 12
        // Numbers upright along the ray, read from outside the plate.
        const deg = ((s.angle % 360) + 360) % 360
        const flip = deg > 90 && deg < 270
        const x = s.at[0] + r * Math.cos(a)
        const y = s.at[1] + r * Math.sin(a)
        ops.text(String(s.number), x, y - 1.2, 3.2, { angle: flip ? deg - 180 : deg, align: flip ? 'right' : 'left', colour: SKIRT_COLOUR })
      }
    },
  }
}

/**
 * On the unrolled wrap (x from the index line along the outside circumference,
 * y up from the plate): a line up from the plate at each strip's landing, a
 * bar at the strip's top, and its number and height. A top above the strip
 * is written as an arrow and the height at the strip's upper edge.
 */
export function wrapStripMarks(plate: Plate, strips: readonly SkirtStrip[], height: number, units: ExportUnits): ExtraMarks {
  const C = Math.PI * plate.trunk.diameter
  return {
    legend: [{ label: 'skirt strip landing: number and height of its top', style: SKIRT_STYLE }],
    notes: [],
    draw(ops) {
      for (const s of strips) {
        const x = ((s.offsetAlongWrap % C) + C) % C
        const top = Math.min(s.rise, height - 2)
        ops.style({ ...SKIRT_STYLE, width: 0.25, dash: [2, 1.5] }).line(x, 0, x, top).stroke()
        if (s.rise <= height - 2) ops.style({ ...SKIRT_STYLE, width: 0.6 }).line(x - 3, s.rise, x + 3, s.rise).stroke()
        const label = `${s.number}: ${s.rise > height - 2 ? 'top above, at ' : ''}${formatTapeLength(s.rise, units)}`
        ops.text(label, x - 0.8, Math.min(s.rise, height - 2) - 2, 2.2, { angle: 90, align: 'right', colour: SKIRT_COLOUR })
      }
    },
  }
}

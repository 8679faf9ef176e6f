// What every template and cut file tells the person cutting: how many pieces,
// which plate layer gets what, which face is up, the sheet thickness, and
// whether the revision was saved with errors. Written once here so the
// template, the cut file and the build sheet say the same thing.

import type { Plate } from '../types'
import { problemRows } from '../checks/messages'
import type { PlateLayer } from './layers'
import { formatShopLength, type ExportUnits } from './units'

/** Heading of the warning carried by every file made from a revision saved with errors. */
export const SAVED_WITH_ERRORS = 'SAVED WITH ERRORS'

/**
 * The error rows of the plate as rebuilt from the stored revision, in the
 * file's units: empty for a revision saved clean. Saving with errors is
 * allowed ("save anyway"), so the files must carry it to the builder.
 */
export function savedErrors(plate: Pick<Plate, 'params' | 'holes' | 'findings'>, units: ExportUnits): string[] {
  return problemRows(plate, { units, denominator: 16, suggest: false }).filter((r) => r.severity === 'error').map((r) => r.text)
}

/** The one-line warning, e.g. `SAVED WITH ERRORS (2): check with the designer before cutting.` */
export function savedErrorsLine(count: number): string {
  return `${SAVED_WITH_ERRORS} (${count}): check with the designer before cutting or building.`
}

export interface PieceCount {
  /** Pieces of the top layer (with the rabbets) this file is for. */
  top: number
  /** Pieces of the other layers (no rabbets). */
  bottom: number
}

/** Pieces one plate needs from a file for `layer`: one top layer, and `layers - 1` without rabbets. */
export function piecesFor(plate: Pick<Plate, 'params'>, layer: PlateLayer): PieceCount {
  const layers = plate.params.layers
  const bottom = Math.max(0, layers - 1)
  if (layer === 'top') return { top: 1, bottom: 0 }
  if (layer === 'bottom') return { top: 0, bottom }
  return { top: 1, bottom }
}

/**
 * The cut list as sentences for a file of one plate: pieces, what each layer
 * gets, the face up and the sheet thickness. `mirrored` files are drawn
 * looking at the bottom face.
 */
export function cutListLines(plate: Pick<Plate, 'params'>, layer: PlateLayer, units: ExportUnits, mirrored = false): string[] {
  const p = plate.params
  const t = formatShopLength(p.sheetThickness, units)
  const total = formatShopLength(p.layers * p.sheetThickness, units)
  const { top, bottom } = piecesFor(plate, layer)
  const face = mirrored
    ? 'Drawn looking at the BOTTOM face: lay the sheet bottom face up.'
    : 'Drawn looking at the TOP face (the face the trunk stands on): lay the sheet top face up.'
  const lines: string[] = []
  if (layer === 'all') {
    lines.push(p.layers > 1
      ? `Cut ${top + bottom} pieces per plate from ${t} plywood (${p.layers} layers, ${total} glued): 1 top layer with the rabbets, ${bottom} bottom layer${bottom === 1 ? '' : 's'} without; or glue the ${p.layers} sheets first and cut 1 panel ${total} thick.`
      : `Cut 1 piece per plate from ${t} plywood, with the rabbets.`)
  } else if (layer === 'top') {
    lines.push(`Cut 1 piece per plate: the top layer, from ${t} plywood, with the rabbets cut into its top face.`)
  } else {
    lines.push(bottom > 0
      ? `Cut ${bottom} piece${bottom === 1 ? '' : 's'} per plate: the bottom layer${bottom === 1 ? '' : 's'}, from ${t} plywood, no rabbets (pockets, openings and holes go right through).`
      : `This plate has one layer: it is the top layer; use the top layer's file.`)
  }
  if (layer !== 'bottom') lines.push(`Rabbets: ${formatShopLength(p.rabbetDepth, units)} deep into the top face of the top layer only.`)
  lines.push(face)
  return lines
}

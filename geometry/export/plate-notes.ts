// What every template and cut file tells the person cutting: how many pieces,
// which plate layer gets what, which face is up, the sheet thickness, and
// whether the revision was saved with errors. Written once here so the
// template, the cut file and the build sheet say the same thing.

import type { Plate } from '../types'
import type { PlateParams } from '../params'
import { problemRows } from '../checks/messages'
import type { OpeningCut, PlateLayer } from './layers'
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

const KIND_WORDS: Record<string, [string, string]> = {
  pocket: ['pocket', 'pockets'],
  access: ['access opening', 'access openings'],
  centre: ['centre hole', 'centre holes'],
  index: ['index hole', 'index holes'],
}

/**
 * Every hole a file of one plate carries, one line per kind and size, and how
 * each is cut, so the operator can check the file against the plate: the
 * saw size of every opening a hole saw can cut (whether this file routes it
 * or marks it for the saw), the drilled holes, the pan fasteners and the
 * rabbets. Layer names as in cut-layers.ts.
 */
export function holeListLines(
  plate: Pick<Plate, 'params' | 'holes' | 'fasteners' | 'rabbets'>,
  layer: PlateLayer,
  units: ExportUnits,
  openings: OpeningCut,
  /** Layer name a saw's circle goes on (cut-layers.ts holeSawLayerName). */
  sawLayer: (sawMm: number) => string,
): string[] {
  const L = (v: number) => formatShopLength(v, units)
  const groups = new Map<string, { kind: string; diameter: number; method: string; saw?: number; count: number }>()
  for (const h of plate.holes) {
    const key = `${h.kind} ${h.diameter.toFixed(3)} ${h.method}`
    const g = groups.get(key)
    if (g) g.count++
    else groups.set(key, { kind: h.kind, diameter: h.diameter, method: h.method, saw: h.sawSize, count: 1 })
  }
  const lines: string[] = ['Holes in this file (every layer of the plate has them unless said):']
  const saws = new Map<string, string[]>()
  for (const g of groups.values()) {
    const [one, many] = KIND_WORDS[g.kind] ?? [g.kind, `${g.kind}s`]
    const what = `${g.count} ${g.count === 1 ? one : many} ${L(g.diameter)}`
    if (g.method === 'drill') lines.push(`  ${what}: drilled (RP-DRILL).`)
    else if (g.method === 'routed') lines.push(`  ${what}: routed as inside profiles (RP-INSIDE-CUT); larger than a common hole saw.`)
    else {
      const saw = g.saw ?? g.diameter
      const list = saws.get(L(saw)) ?? []
      list.push(`${g.count} ${g.count === 1 ? one : many}`)
      saws.set(L(saw), list)
      lines.push(openings === 'routed'
        ? `  ${what}: routed as inside profiles (RP-INSIDE-CUT); by hand, a ${L(saw)} hole saw.`
        : `  ${what}: ${L(saw)} hole saw, circle on ${sawLayer(saw)} (not cut), ${L(HOLE_SAW_PILOT_MM)} pilot on RP-DRILL.`)
    }
  }
  const through = (plate.fasteners ?? []).filter((x) => x.through)
  const fp = plate.params.fasteners as PlateParams['fasteners'] | undefined
  if (fp?.kind === 'screw') {
    lines.push(`  Pan fasteners: ${fp.count} screws per pan into the rabbet floor, ${L(fp.diameter)}: no holes cut (drive them through the rim at fitting).`)
  } else if (through.length > 0) {
    const nut = !fp ? 'nuts' : fp.kind === 'bolt-tnut' ? 'T-nuts in the underside' : `nuts in ${L(fp.counterboreDiameter)} counterbores ${L(fp.counterboreDepth)} deep from the underside (drill after gluing)`
    lines.push(`  ${through.length} pan-fastener holes ${L(through[0]!.diameter)}: drilled right through (RP-DRILL), bolts with ${nut}.`)
  }
  if (layer !== 'bottom' && plate.rabbets.length > 0) {
    const r = plate.rabbets[0]!
    lines.push(`  ${plate.rabbets.length} rabbets ${L(r.diameter)} across, ${L(r.depth)} deep, top layer only (RP-RABBET-...).`)
  }
  if (saws.size > 0) {
    lines.push(`Hole saws: ${[...saws].map(([size, what]) => `${size} (${what.join(', ')})`).join('; ')}.`)
  }
  return lines
}

/** A hole saw's pilot drill, mm: 1/4 in on common arbors (from memory). Also in cut-layers.ts. */
const HOLE_SAW_PILOT_MM = 6.35

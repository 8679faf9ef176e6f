// The sheet plan: plates of several designs, each with a count, nested on
// plywood sheets the way the shop works, and the figures a technical director
// buys by. Two workflows:
//  - panels: full sheets are glued into panels first and every layer of a
//    plate is cut at once, so a plate is one part on a panel and each panel
//    costs as many sheets as the plate has layers;
//  - layers: every layer is cut from single sheets and the parts are glued
//    after, so each layer of each plate is a part.

import type { Plate, Point } from '../types'
import { signedArea } from '../math/polygon'
import { drain, drainAsync, nestSteps, PartTooLargeError, type NestOptions, type Nesting } from './nest'

export type Workflow = 'panels' | 'layers'
export const WORKFLOWS: readonly Workflow[] = ['panels', 'layers']

/** Which layer a part is: the whole panel, the top layer (it carries the rabbets) or a layer below it. */
export type PartLayer = 'all' | 'top' | 'bottom'

export interface PlanEntry {
  /** Design name and size label, for labels and messages. */
  name: string
  size?: string | null
  plate: Plate
  /** Plates of this design wanted. */
  count: number
}

export interface PlanSheet {
  /** mm */
  width: number
  height: number
  margin: number
  kerf: number
  /** One sheet's thickness, mm. */
  thickness: number
}

export interface PlanSettings {
  sheet: PlanSheet
  workflow: Workflow
  /** Keep every part's grain along the sheet's length (0 and 180 degree turns only). */
  grain?: boolean
  /** Glue film thickness, mm. Default 6 mil (0.1524 mm), common practice (from memory) for a rolled film of wood glue. */
  glueFilm?: number
  /** See NestOptions. */
  timeLimit?: number
  onProgress?: NestOptions['onProgress']
}

export interface PlanPart {
  /** Index into the entries. */
  entry: number
  layer: PartLayer
  /** 1 for the top layer, counting down; 0 for a whole panel. */
  layerNumber: number
  /** The plate's outline on the sheet, mm, origin at the sheet's lower-left corner. */
  outline: Point[]
  /** sheet point = rotate(plate point, turn) + at */
  turn: number
  at: Point
}

export interface PlanLayout {
  /** Sheets in this layout: the panel's layers (panels) or 1 (layers). */
  sheets: number
  parts: PlanPart[]
  /** Area of the parts' outlines, mm2. */
  partArea: number
  /** The clear strip left at the far end, inside the margin, or null when it is under OFFCUT_LEAST. */
  offcut: { x: number; y: number; width: number; height: number } | null
}

export interface SheetPlan {
  workflow: Workflow
  sheet: PlanSheet
  layouts: PlanLayout[]
  /** Plywood sheets to buy. */
  sheetsToBuy: number
  /** Panels to glue up before cutting (panels workflow), else 0. */
  panels: number
  plates: number
  parts: number
  /** The fewest sheets any nesting could use: the area bound (REFERENCES: ceil(part area / usable sheet area)). */
  areaLowerBound: number
  /** Part outline area over the area of the sheets used (0-1). */
  yield: number
  glue: {
    /** Glued face area, mm2. */
    area: number
    /** Film thickness, mm. */
    film: number
    /** Glue volume, mm3 (area x film; coverage = 231 in3 per US gallon / film, REFERENCES). */
    volume: number
  }
  /** Per entry: one more plate of it fits on the sheets (or panels) already in the plan. */
  spare: boolean[]
  /** Plates drawn for another sheet thickness than the plan's. */
  thicknessMismatch: number[]
}

/** A plate too big for the sheet, named by its plan entry. */
export class PlatePlanTooLargeError extends Error {
  constructor(readonly entry: number, override readonly cause: PartTooLargeError) {
    super(cause.message)
    this.name = 'PlatePlanTooLargeError'
  }
}

export const DEFAULT_GLUE_FILM = 0.1524
/** A strip narrower than this (2 in) is waste, not an offcut worth keeping (common practice, from memory). */
export const OFFCUT_LEAST = 50.8

interface Group {
  /** Layers per plate in this group (panels), or 0 (layers workflow: one group). */
  layers: number
  /** Per nesting part: the entry and the layers it stands for. */
  parts: { entry: number; layers: PartLayer[]; count: number; outline: Point[] }[]
}

function groupsFor(entries: PlanEntry[], workflow: Workflow): Group[] {
  if (workflow === 'layers') {
    // Every layer of a plate has the same outline: one part with the copies of all its layers.
    return [
      {
        layers: 0,
        parts: entries.map((e, entry) => {
          const n = e.plate.params.layers
          const layers: PartLayer[] = []
          for (let k = 0; k < n; k++) for (let c = 0; c < e.count; c++) layers.push(k === 0 ? 'top' : 'bottom')
          return { entry, layers, count: e.count * n, outline: e.plate.outline }
        }),
      },
    ]
  }
  const byLayers = new Map<number, Group>()
  entries.forEach((e, entry) => {
    const n = e.plate.params.layers
    let g = byLayers.get(n)
    if (!g) byLayers.set(n, (g = { layers: n, parts: [] }))
    g.parts.push({ entry, layers: Array<PartLayer>(e.count).fill('all'), count: e.count, outline: e.plate.outline })
  })
  return [...byLayers.values()].sort((a, b) => a.layers - b.layers)
}

/** Nest the plan's plates and work out what to buy and glue. */
export function planSheets(entries: PlanEntry[], settings: PlanSettings): SheetPlan {
  return drain(planSteps(entries, settings))
}

/** planSheets, handing the thread back every few tens of milliseconds (see drainAsync). */
export function planSheetsAsync(entries: PlanEntry[], settings: PlanSettings): Promise<SheetPlan> {
  return drainAsync(planSteps(entries, settings))
}

/** The plan as steps: one per part placed and per spare plate tried. */
export function* planSteps(entries: PlanEntry[], settings: PlanSettings): Generator<void, SheetPlan> {
  const { sheet, workflow } = settings
  const film = settings.glueFilm ?? DEFAULT_GLUE_FILM
  const usable = (sheet.width - 2 * sheet.margin) * (sheet.height - 2 * sheet.margin)
  const sheetArea = sheet.width * sheet.height
  const outlineArea = entries.map((e) => Math.abs(signedArea(e.plate.outline)))
  const layouts: PlanLayout[] = []
  const spare = entries.map(() => false)
  let lowerBound = 0
  const started = Date.now()
  const remaining = () => (settings.timeLimit === undefined ? undefined : Math.max(1, settings.timeLimit - (Date.now() - started)))

  for (const group of groupsFor(entries, workflow)) {
    let nesting: Nesting
    try {
      nesting = yield* nestSteps(
        group.parts.map((p) => ({ outline: p.outline, count: p.count })),
        { width: sheet.width, height: sheet.height, margin: sheet.margin, kerf: sheet.kerf },
        { grain: settings.grain ?? false, timeLimit: remaining(), onProgress: settings.onProgress },
      )
    } catch (e) {
      if (e instanceof PartTooLargeError) throw new PlatePlanTooLargeError(group.parts[e.part]!.entry, e)
      throw e
    }
    const sheetsPer = group.layers || 1
    let area = 0
    for (const p of group.parts) area += outlineArea[p.entry]! * p.count
    lowerBound += Math.ceil(area / usable - 1e-9) * sheetsPer
    // Copies of one part are interchangeable: hand out its layer names in placement order.
    const handed = group.parts.map(() => 0)
    for (const s of nesting.result.sheets) {
      const parts: PlanPart[] = s.parts.map((placed) => {
        const gp = group.parts[placed.part]!
        const k = handed[placed.part]!++
        const layer = gp.layers[k] ?? 'all'
        const layerNumber = layer === 'all' ? 0 : Math.floor(k / Math.max(1, entries[gp.entry]!.count)) + 1
        return { entry: gp.entry, layer, layerNumber, outline: placed.outline, turn: placed.turn, at: placed.at }
      })
      const partArea = parts.reduce((sum, p) => sum + outlineArea[p.entry]!, 0)
      let top = -Infinity
      for (const p of parts) for (const q of p.outline) top = Math.max(top, q[1])
      const y = top + sheet.kerf
      const height = sheet.height - sheet.margin - y
      layouts.push({
        sheets: sheetsPer,
        parts,
        partArea,
        offcut: height >= OFFCUT_LEAST ? { x: sheet.margin, y, width: sheet.width - 2 * sheet.margin, height } : null,
      })
    }
    for (const [i, p] of group.parts.entries()) {
      const plateLayers = entries[p.entry]!.plate.params.layers
      spare[p.entry] = nesting.fitsMore([{ part: i, count: workflow === 'layers' ? plateLayers : 1 }])
      yield
    }
  }

  const sheetsToBuy = layouts.reduce((s, l) => s + l.sheets, 0)
  const partArea = layouts.reduce((s, l) => s + l.partArea * l.sheets, 0)
  // Panels: every glue line covers a whole sheet. Layers: only the plates' faces are glued
  // (their net area: the through-holes take no glue).
  const glueArea =
    workflow === 'panels'
      ? layouts.reduce((s, l) => s + (l.sheets - 1) * sheetArea, 0)
      : entries.reduce((s, e) => s + e.count * (e.plate.params.layers - 1) * e.plate.metrics.area, 0)
  const plates = entries.reduce((s, e) => s + e.count, 0)
  return {
    workflow,
    sheet,
    layouts,
    sheetsToBuy,
    panels: workflow === 'panels' ? layouts.length : 0,
    plates,
    parts: layouts.reduce((s, l) => s + l.parts.length, 0),
    areaLowerBound: lowerBound,
    yield: sheetsToBuy > 0 ? partArea / (sheetsToBuy * sheetArea) : 0,
    glue: { area: glueArea, film, volume: glueArea * film },
    spare,
    thicknessMismatch: entries.flatMap((e, i) => (Math.abs(e.plate.params.sheetThickness - sheet.thickness) > 0.5 ? [i] : [])),
  }
}

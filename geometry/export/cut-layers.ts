// The cut file's content, once, for both writers: DXF and SVG show the same
// entities on the same layers. One layer per machining operation, so a CNC
// shop can assign a tool and a depth to each without sorting anything.

import type { Plate, Point } from '../types'
import { assertExportUnits, fromMm, type ExportUnits } from './units'
import { counterClockwise, flattenPath, simplifyClosed } from './polyline'
import { assertOpeningCut, assertPlateLayer, MirrorRabbetError, type OpeningCut, type PlateLayer } from './layers'

/** The outline polygon's guaranteed chord error (the geometry contract), mm. */
export const OUTLINE_CHORD_ERROR = 0.1

export const LAYER_OUTSIDE = 'RP-OUTSIDE-CUT'
export const LAYER_INSIDE = 'RP-INSIDE-CUT'
export const LAYER_RABBET_PREFIX = 'RP-RABBET-'
export const LAYER_DRILL = 'RP-DRILL'
export const LAYER_REFERENCE = 'RP-REFERENCE'
export const LAYER_HOLESAW_PREFIX = 'RP-HOLESAW-'
/** Text only, never cut: design, revision, pieces, layer, face up, thickness, and any errors it was saved with. */
export const LAYER_NOTES = 'RP-NOTES'
/** A hole saw's pilot drill, mm: 1/4 in on common arbors (from memory). */
export const HOLE_SAW_PILOT = 6.35

/** `RP-HOLESAW-4.25IN`, `RP-HOLESAW-107.95MM`: a non-cut layer whose name carries the saw size. */
export function holeSawLayerName(sawMm: number, units: ExportUnits): string {
  return `${LAYER_HOLESAW_PREFIX}${Number(fromMm(sawMm, units).toFixed(3))}${units.toUpperCase()}`
}

export interface CutOptions {
  units: ExportUnits
  /** Trunk circle, clocking axis and caster plate outlines on a layer never cut. Default true. */
  includeReference?: boolean
  /**
   * Flip x, to cut the plate from its back face. Default false. Refused
   * (MirrorRabbetError) for a file that carries rabbets: they are cut into the
   * top face, which faces the table when the layer is cut from the back.
   */
  mirror?: boolean
  /** 'top' (with rabbets), 'bottom' (no rabbets) or 'all' (one file for both). Default 'all'. */
  layer?: PlateLayer
  /**
   * Pockets and access openings as inside profiles on RP-INSIDE-CUT ('routed',
   * the default: a CNC router cuts every opening) or, where a hole saw that
   * size exists, as its pilot on RP-DRILL and its circle on a non-cut layer
   * named with the saw ('hole-saw': a hand shop).
   */
  openings?: OpeningCut
  /**
   * Largest distance between the written outline and the true curve, mm,
   * whatever the output units. Default 0.1 (the outline polygon as built);
   * coarser values thin the polygon, finer ones flatten the cubic outline path.
   */
  chordTolerance?: number
}

export type LayerRole = 'outside' | 'inside' | 'rabbet' | 'drill' | 'reference'

export type CutEntity =
  | { type: 'polyline'; points: Point[]; closed: boolean }
  | { type: 'circle'; x: number; y: number; r: number }
  | { type: 'line'; from: Point; to: Point }

export interface CutLayer {
  name: string
  role: LayerRole
  /** False for reference marks: nothing on this layer is machined. */
  cut: boolean
  /** Rabbet depth in output units, for rabbet layers. */
  depth?: number
  entities: CutEntity[]
}

export interface CutDrawing {
  units: ExportUnits
  layer: PlateLayer
  layers: CutLayer[]
  /** Extent of every entity, output units. */
  bounds: { minX: number; minY: number; maxX: number; maxY: number }
}

/** `0.375IN`, `9.525MM`: plain characters every DXF reader accepts in a layer name. */
function depthTag(depth: number, units: ExportUnits): string {
  return `${Number(depth.toFixed(3))}${units.toUpperCase()}`
}

export function rabbetLayerName(depthMm: number, units: ExportUnits): string {
  return `${LAYER_RABBET_PREFIX}${depthTag(fromMm(depthMm, units), units)}`
}

export function normaliseCutOptions(options: CutOptions): Required<CutOptions> {
  if (options === null || typeof options !== 'object') throw new TypeError('Cut file options are required.')
  assertExportUnits(options.units)
  const chordTolerance = options.chordTolerance ?? OUTLINE_CHORD_ERROR
  if (!Number.isFinite(chordTolerance) || chordTolerance <= 0) {
    throw new RangeError(`chordTolerance must be a positive length in mm, got ${chordTolerance}.`)
  }
  const layer = options.layer ?? 'all'
  assertPlateLayer(layer)
  const openings = options.openings ?? 'routed'
  assertOpeningCut(openings)
  return {
    units: options.units,
    includeReference: options.includeReference ?? true,
    mirror: options.mirror ?? false,
    layer,
    openings,
    chordTolerance,
  }
}

/** The outside profile in mm, within `tolerance` of the true outline. */
export function outlineWithin(plate: Pick<Plate, 'outline' | 'outlinePath'>, tolerance: number): Point[] {
  if (tolerance < OUTLINE_CHORD_ERROR) {
    const flat = plate.outlinePath ? flattenPath(plate.outlinePath, tolerance) : null
    if (!flat) {
      throw new RangeError(
        `A chord tolerance under ${OUTLINE_CHORD_ERROR} mm needs the outline's curve path, which could not be read.`,
      )
    }
    return counterClockwise(flat)
  }
  // The polygon is already within 0.1 mm of the curve; thinning it by the rest keeps the total in bounds.
  return counterClockwise(simplifyClosed(plate.outline, tolerance - OUTLINE_CHORD_ERROR))
}

function entityKey(e: CutEntity): string {
  const r = (v: number) => v.toFixed(6)
  switch (e.type) {
    case 'circle':
      return `c ${r(e.x)} ${r(e.y)} ${r(e.r)}`
    case 'line': {
      const [a, b] = [e.from, e.to].map((p) => `${r(p[0])} ${r(p[1])}`).sort()
      return `l ${a} ${b}`
    }
    case 'polyline':
      return `p ${e.closed} ${e.points.map((p) => `${r(p[0])} ${r(p[1])}`).join(' ')}`
  }
}

/** Build the layered cut drawing in output units. */
export function buildCutDrawing(plate: Plate, options: CutOptions): CutDrawing {
  const o = normaliseCutOptions(options)
  const withRabbets = o.layer !== 'bottom' && plate.rabbets.length > 0
  if (o.mirror && withRabbets) throw new MirrorRabbetError()
  const k = o.units === 'in' ? 1 / 25.4 : 1
  const sx = o.mirror ? -1 : 1
  const pt = (x: number, y: number): Point => [sx * x * k, y * k]
  const closedRing = (points: Point[]): Point[] => {
    const mapped = points.map((p) => pt(p[0], p[1]))
    // Mirroring reverses the winding; turn it back so every outline stays counter-clockwise.
    return o.mirror ? mapped.reverse() : mapped
  }
  const circle = (x: number, y: number, diameter: number): CutEntity => {
    const [cx, cy] = pt(x, y)
    return { type: 'circle', x: cx, y: cy, r: (diameter / 2) * k }
  }

  const layers = new Map<string, CutLayer>()
  const seen = new Set<string>()
  const add = (name: string, role: LayerRole, entity: CutEntity, depth?: number): void => {
    let layer = layers.get(name)
    if (!layer) {
      layer = { name, role, cut: role !== 'reference', entities: [] }
      if (depth !== undefined) layer.depth = depth
      layers.set(name, layer)
    }
    const key = `${name} ${entityKey(entity)}`
    if (seen.has(key)) return
    seen.add(key)
    layer.entities.push(entity)
  }

  add(LAYER_OUTSIDE, 'outside', { type: 'polyline', points: closedRing(outlineWithin(plate, o.chordTolerance)), closed: true })
  // Routed openings are inside profiles: every pocket and opening when the file is for a CNC
  // router. For a hand shop a hole-sawn one is not machined as a profile: its saw's pilot point
  // goes on the drill layer, and its circle on a layer that is never cut and names the saw
  // (`RP-HOLESAW-4.25IN`), so the size travels with the file and no cut layer carries text.
  for (const h of plate.holes) {
    if (h.method === 'routed' || (h.method === 'hole-saw' && o.openings === 'routed')) add(LAYER_INSIDE, 'inside', circle(h.x, h.y, h.diameter))
    else if (h.method === 'hole-saw') {
      add(LAYER_DRILL, 'drill', circle(h.x, h.y, HOLE_SAW_PILOT))
      add(holeSawLayerName(h.sawSize ?? h.diameter, o.units), 'reference', circle(h.x, h.y, h.diameter))
    }
  }
  // The bottom layer has no rabbets: the pan rims sit in the top layer only.
  const rabbets = withRabbets ? [...plate.rabbets].sort((a, b) => a.depth - b.depth) : []
  for (const r of rabbets) {
    add(rabbetLayerName(r.depth, o.units), 'rabbet', circle(r.x, r.y, r.diameter), Number(fromMm(r.depth, o.units).toFixed(3)))
  }
  // Drilled through the plywood: the centre and index holes (they register the layers and the
  // pattern) and the pan-rim bolts through the rabbet floor. Screws into the rabbet floor need no hole.
  for (const h of plate.holes) {
    if (h.method === 'drill') add(LAYER_DRILL, 'drill', circle(h.x, h.y, h.diameter))
  }
  for (const f of plate.fasteners ?? []) if (f.through) add(LAYER_DRILL, 'drill', circle(f.x, f.y, f.diameter))
  // The caster's own bolts go through the pan's steel crown, not the wood: drawn for reference only.
  if (o.includeReference) {
    for (const m of plate.casterMounts) {
      for (const b of m.bolts) add(LAYER_REFERENCE, 'reference', circle(b.x, b.y, b.diameter))
    }
  }
  if (o.includeReference) {
    add(LAYER_REFERENCE, 'reference', circle(plate.trunk.x, plate.trunk.y, plate.trunk.diameter))
    add(LAYER_REFERENCE, 'reference', { type: 'line', from: pt(...plate.axis.from), to: pt(...plate.axis.to) })
    for (const m of plate.casterMounts) {
      add(LAYER_REFERENCE, 'reference', { type: 'polyline', points: closedRing(m.corners), closed: true })
    }
  }

  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  const grow = (x: number, y: number, r = 0) => {
    minX = Math.min(minX, x - r)
    maxX = Math.max(maxX, x + r)
    minY = Math.min(minY, y - r)
    maxY = Math.max(maxY, y + r)
  }
  for (const layer of layers.values()) {
    for (const e of layer.entities) {
      if (e.type === 'circle') grow(e.x, e.y, e.r)
      else if (e.type === 'line') {
        grow(...e.from)
        grow(...e.to)
      } else for (const p of e.points) grow(p[0], p[1])
    }
  }
  return { units: o.units, layer: o.layer, layers: [...layers.values()], bounds: { minX, minY, maxX, maxY } }
}

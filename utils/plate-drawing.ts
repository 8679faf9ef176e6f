// Draws a plate into a paper.js scope. Client only (paper is loaded in the
// browser after mount). Plate coordinates are mm with y up; paper's project
// has y down, so every point goes through `pt` (x, -y).
import type { Plate, Point as PlatePoint } from '~~/geometry/core'

type Scope = paper.PaperScope
/** Style properties set on an item (paper's own Style type wants Color objects; it accepts CSS strings). */
type StyleProps = Record<string, unknown>

export const plateColours = {
  outline: '#1e4b36',
  fill: '#f3e7cf',
  trunk: '#c98a2e',
  pocket: '#23281f',
  rabbet: '#8d5e1a',
  access: '#2f7352',
  mount: '#7c8475',
  axis: '#6b5b95',
  notch: '#c98a2e',
  problem: '#b4452f',
  compare: '#3f6fb0',
  grid: '#e4dfd3',
  gridMajor: '#cfc7b5',
  handle: '#ffffff',
  handleStroke: '#1e4b36',
  handleHot: '#ebc27f',
  dim: '#5b6355',
} as const

export interface DrawOptions {
  /** Screen pixels per mm, to keep marks a constant size on screen. */
  zoom: number
  units: 'in' | 'mm'
  /** Only the outline and holes, in the comparison colour. */
  ghost?: boolean
  formatLength: (mm: number) => string
}

export function pt(scope: Scope, x: number, y: number) {
  return new scope.Point(x, -y)
}

function circle(scope: Scope, x: number, y: number, r: number, style: StyleProps) {
  const c = new scope.Path.Circle({ center: pt(scope, x, y), radius: Math.max(r, 0.01), insert: false })
  Object.assign(c, { strokeScaling: false, ...style })
  return c
}

function polyline(scope: Scope, points: PlatePoint[], closed: boolean, style: StyleProps) {
  // Plain pairs: paper reads them as points without a Point object made first for each.
  const p = new scope.Path({ segments: points.map(([x, y]) => [x, -y]), closed, insert: false })
  Object.assign(p, { strokeScaling: false, ...style })
  return p
}

/** The plate's outline as a smooth paper path from its SVG path data (plate coordinates). */
export function outlinePath(scope: Scope, plate: Plate) {
  const path = new scope.CompoundPath({ pathData: plate.outlinePath, insert: false })
  path.scale(1, -1, new scope.Point(0, 0))
  return path
}

export function drawPlate(scope: Scope, layer: paper.Layer, plate: Plate, o: DrawOptions): void {
  const px = (n: number) => n / o.zoom
  const add = (item: paper.Item) => layer.addChild(item)

  if (o.ghost) {
    // Drawn over the newer plate, fill and all, so a change inside the outline shows too:
    // a pale halo under a dashed line of its own colour keeps it readable on wood and holes.
    const halo = outlinePath(scope, plate)
    Object.assign(halo, { strokeColor: '#ffffff', strokeWidth: 5, opacity: 0.7, strokeScaling: false })
    add(halo)
    const ghost = outlinePath(scope, plate)
    Object.assign(ghost, { strokeColor: plateColours.compare, strokeWidth: 2.5, dashArray: [8, 5], strokeScaling: false })
    ghost.data = { compare: 'outline' }
    add(ghost)
    for (const h of plate.holes) add(circle(scope, h.x, h.y, h.diameter / 2, { strokeColor: plateColours.compare, strokeWidth: 2, dashArray: [4, 3] }))
    for (const r of plate.rabbets) add(circle(scope, r.x, r.y, r.diameter / 2, { strokeColor: plateColours.compare, strokeWidth: 1, dashArray: [2, 3] }))
    return
  }

  add(drawOutline(scope, plate))
  drawFeatures(scope, layer, plate, o)
  drawFindingMarks(scope, layer, plate, o)
  drawDimensions(scope, layer, plate, o)
}

export const outlineStyle = { fillColor: plateColours.fill, strokeColor: plateColours.outline, strokeWidth: 2.5, strokeScaling: false }

/** The cut line: the smooth path of a whole plate, or the polygon of a drag preview (empty path data). */
export function drawOutline(scope: Scope, plate: Plate): paper.PathItem {
  const item = plate.outlinePath ? outlinePath(scope, plate) : polyline(scope, plate.outline, true, {})
  Object.assign(item, outlineStyle)
  return item
}

/** Everything inside the outline: tube, rabbets, holes, fasteners, caster plates, notches and the clocking axis. */
export function drawFeatures(scope: Scope, layer: paper.Layer, plate: Plate, o: DrawOptions): void {
  const px = (n: number) => n / o.zoom
  const add = (item: paper.Item) => layer.addChild(item)
  const { trunk } = plate
  add(circle(scope, trunk.x, trunk.y, trunk.diameter / 2, { strokeColor: plateColours.trunk, strokeWidth: 2, dashArray: [10, 4] }))
  add(circle(scope, trunk.x, trunk.y, trunk.innerDiameter / 2, { strokeColor: plateColours.trunk, strokeWidth: 1, dashArray: [3, 4] }))

  for (const r of plate.rabbets) add(circle(scope, r.x, r.y, r.diameter / 2, { strokeColor: plateColours.rabbet, strokeWidth: 1.2, dashArray: [6, 3] }))
  for (const h of plate.holes) {
    const colour = h.kind === 'access' ? plateColours.access : plateColours.pocket
    add(circle(scope, h.x, h.y, h.diameter / 2, { strokeColor: colour, strokeWidth: h.kind === 'pocket' ? 2 : 1.5, fillColor: '#fbfaf6' }))
    const arm = Math.max(h.diameter / 2 + px(4), px(6))
    if (h.kind === 'centre' || h.kind === 'index') {
      add(polyline(scope, [[h.x - arm, h.y], [h.x + arm, h.y]], false, { strokeColor: plateColours.pocket, strokeWidth: 1 }))
      add(polyline(scope, [[h.x, h.y - arm], [h.x, h.y + arm]], false, { strokeColor: plateColours.pocket, strokeWidth: 1 }))
    }
  }
  // Pan-rim fasteners, drilled through the rabbet floor.
  for (const f of plate.fasteners ?? []) add(circle(scope, f.x, f.y, Math.max(f.diameter / 2, px(1.5)), { strokeColor: plateColours.rabbet, strokeWidth: 1, fillColor: plateColours.rabbet }))
  // A hole saw cuts round its pilot drill: mark the centre it is started from.
  for (const h of plate.holes) {
    if (h.method !== 'hole-saw') continue
    add(circle(scope, h.x, h.y, px(2), { fillColor: plateColours.dim, strokeColor: plateColours.dim, strokeWidth: 1 }))
  }
  // Caster top plates hang below the pan, so they show through the pocket openings.
  for (const m of plate.casterMounts) {
    add(polyline(scope, m.corners, true, { strokeColor: plateColours.mount, strokeWidth: 1, dashArray: [4, 2] }))
    for (const b of m.bolts) add(circle(scope, b.x, b.y, b.diameter / 2, { strokeColor: plateColours.mount, strokeWidth: 1 }))
  }
  for (const n of plate.notches) {
    const r = trunk.diameter / 2
    const a0 = (n.startAngle * Math.PI) / 180
    const a1 = (n.endAngle * Math.PI) / 180
    const mid = (a0 + a1) / 2
    const arc = new scope.Path.Arc({
      from: pt(scope, r * Math.cos(a0), r * Math.sin(a0)),
      through: pt(scope, r * Math.cos(mid), r * Math.sin(mid)),
      to: pt(scope, r * Math.cos(a1), r * Math.sin(a1)),
      insert: false,
    })
    Object.assign(arc, { strokeColor: plateColours.notch, strokeWidth: 5, strokeScaling: false, opacity: 0.75 })
    add(arc)
  }
  add(polyline(scope, [plate.axis.from, plate.axis.to], false, { strokeColor: plateColours.axis, strokeWidth: 1, dashArray: [12, 4, 2, 4] }))
}

/**
 * Every finding with a place gets a ring there, solid for an error and dashed
 * for a warning, so problems are seen where they are without opening the list.
 */
export function drawFindingMarks(scope: Scope, layer: paper.Layer, plate: Plate, o: DrawOptions) {
  const px = (n: number) => n / o.zoom
  for (const f of plate.findings) {
    if (!f.at) continue
    const r = Math.max(f.at.radius ?? 0, px(7)) + px(3)
    const mark = circle(scope, f.at.x, f.at.y, r, {
      strokeColor: plateColours.problem,
      strokeWidth: f.severity === 'error' ? 2 : 1.5,
      ...(f.severity === 'error' ? {} : { dashArray: [5, 3] }),
      opacity: 0.85,
    })
    mark.data = { finding: f.code }
    layer.addChild(mark)
  }
}

/**
 * The overall width and height lines beside the plate. Their figures are set
 * in the page's own text over the drawing (see `dimensionLabels`): canvas text
 * is shaped again on every paint, and a drag repaints these lines on every move.
 */
export function drawDimensions(scope: Scope, layer: paper.Layer, plate: Plate, o: DrawOptions) {
  for (const line of dimensionLines(plate, o.zoom)) layer.addChild(polyline(scope, line, false, dimensionStyle))
}

export const dimensionStyle = { strokeColor: plateColours.dim, strokeWidth: 1 }

/** The width line under the plate and the height line to its right, 24 px off, each with its end ticks in one stroke (across the first tick, along, across the last). Plate coordinates. */
export function dimensionLines(plate: Plate, zoom: number): PlatePoint[][] {
  const px = (n: number) => n / zoom
  const { minX, minY, maxX, maxY } = plate.metrics.bounds
  const below = minY - px(24)
  const right = maxX + px(24)
  const tick = px(5)
  return [
    [[minX, below - tick], [minX, below + tick], [minX, below], [maxX, below], [maxX, below + tick], [maxX, below - tick]],
    [[right - tick, minY], [right + tick, minY], [right, minY], [right, maxY], [right + tick, maxY], [right - tick, maxY]],
  ]
}

export interface DimensionLabel {
  /** Where the label's middle goes, plate coordinates (mm, y up). */
  x: number
  y: number
  text: string
  /** Set upright, reading bottom to top. */
  upright: boolean
}

/**
 * The figures of the two dimension lines and where their middles go: the width
 * under its line, the height set upright outside its line (lying flat it ran
 * over the plate's edge, and past the view's edge on a narrow screen; inside
 * the line it sat on the handle of a root reaching furthest right). Both stay
 * within the 48 px the view keeps round a fitted plate.
 */
export function dimensionLabels(plate: Plate, o: Pick<DrawOptions, 'zoom' | 'formatLength'>): [DimensionLabel, DimensionLabel] {
  const px = (n: number) => n / o.zoom
  const { minX, minY, maxX, maxY } = plate.metrics.bounds
  return [
    { x: (minX + maxX) / 2, y: minY - px(36), text: o.formatLength(maxX - minX), upright: false },
    { x: maxX + px(36), y: (minY + maxY) / 2, text: o.formatLength(maxY - minY), upright: true },
  ]
}

/** A light grid in the chosen units: minor lines every inch or 10 mm, major every foot or 100 mm. */
export function drawGrid(scope: Scope, layer: paper.Layer, units: 'in' | 'mm', zoom: number): void {
  const bounds = scope.view.bounds
  const minor = units === 'in' ? 25.4 : 10
  const major = units === 'in' ? 304.8 : 100
  const steps = minor * zoom >= 8 ? [minor, major] : [major]
  // One compound path per colour: a few draw calls instead of one per line.
  for (const step of steps) {
    const colour = step === major ? plateColours.gridMajor : plateColours.grid
    const x0 = Math.floor(bounds.left / step) * step
    const y0 = Math.floor(bounds.top / step) * step
    const lines: paper.Path[] = []
    for (let x = x0; x <= bounds.right; x += step) lines.push(new scope.Path({ segments: [[x, bounds.top], [x, bounds.bottom]], insert: false }))
    for (let y = y0; y <= bounds.bottom; y += step) lines.push(new scope.Path({ segments: [[bounds.left, y], [bounds.right, y]], insert: false }))
    const grid = new scope.CompoundPath({ children: lines, insert: false })
    Object.assign(grid, { strokeColor: colour, strokeWidth: 1, strokeScaling: false })
    layer.addChild(grid)
  }
}

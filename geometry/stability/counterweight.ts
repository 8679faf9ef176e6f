// Counterweight blocks: what one weighs, whether it passes an access opening,
// and where a number of them lie on the plate inside the tube.

import type { Plate, Point } from '../types'
import { COUNTERWEIGHT_MATERIALS, type UnitParams } from './unit-params'

export interface BlockSize {
  length: number
  width: number
  thickness: number
}

/** kg of one block of the given sizes (mm) and density (kg/m3). */
export function blockMass(block: BlockSize, density: number): number {
  return block.length * block.width * block.thickness * 1e-9 * density
}

/**
 * Diagonal of the block's smallest cross-section, mm: a block goes through a
 * round opening end first when this is less than the opening's diameter.
 */
export function blockPassage(block: BlockSize): number {
  const [a, b] = [block.length, block.width, block.thickness].sort((p, q) => p - q)
  return Math.hypot(a!, b!)
}

/** Whether a block passes a round opening of `diameter` mm (strictly less: a block that only just touches jams). */
export function blockPasses(block: BlockSize, diameter: number): boolean {
  return blockPassage(block) < diameter
}

export interface BlockSpot {
  x: number
  y: number
  /** 0 for the layer on the plate. */
  layer: number
  /** Footprint corners, counter-clockwise. */
  corners: Point[]
}

export interface BlockLayout {
  /** Blocks one layer holds inside the tube, clear of the pans and the access openings. */
  perLayer: number
  /** perLayer times the layers allowed. */
  capacity: number
  /** Where the first `min(count, capacity)` blocks lie, nearest the centre first. */
  spots: BlockSpot[]
  /** Blocks that found no place. */
  leftOver: number
  /** Their centre of mass above the plate's top face, mm (0 without blocks). */
  heightAboveTop: number
  /** And in plan, mm. */
  x: number
  y: number
}

/** Grid phases tried, as fractions of a block: a quarter step finds room between pans and openings that a centred grid misses. */
const PHASES: readonly (readonly [number, number])[] = [0, 0.25, 0.5, 0.75].flatMap((a) => [0, 0.25, 0.5, 0.75].map((b) => [a, b] as const))

interface Keep {
  x: number
  y: number
  r: number
}

function rectMissesCircle(cx: number, cy: number, hw: number, hh: number, k: Keep): boolean {
  const dx = Math.max(Math.abs(k.x - cx) - hw, 0)
  const dy = Math.max(Math.abs(k.y - cy) - hh, 0)
  return dx * dx + dy * dy >= k.r * k.r
}

/**
 * Lays blocks flat (largest face down) in a square grid on the plate's top
 * face, inside the tube's inside wall and clear of the pans (which rise into
 * the tube) and of the access openings (which must stay open to reach the
 * caster bolts). Both footprint turns and sixteen grid phases are tried; the
 * one holding most wins. A simple shop layout, not an optimum packing.
 */
export function layoutBlocks(plate: Pick<Plate, 'trunk' | 'rabbets' | 'holes'>, block: BlockSize, count: number, maxLayers: number): BlockLayout {
  const sizes = [block.length, block.width, block.thickness].sort((p, q) => q - p)
  const [long, mid, thick] = sizes as [number, number, number]
  const inner = plate.trunk.innerDiameter / 2
  const keep: Keep[] = [
    ...plate.rabbets.map((r) => ({ x: r.x, y: r.y, r: r.diameter / 2 })),
    ...plate.holes.filter((h) => h.kind === 'access').map((h) => ({ x: h.x, y: h.y, r: h.diameter / 2 })),
  ]
  let best: { x: number; y: number; w: number; h: number }[] = []
  for (const [w, h] of [[long, mid], [mid, long]] as const) {
    for (const [px, py] of PHASES) {
      const cells: { x: number; y: number; w: number; h: number }[] = []
      const nx = Math.ceil(inner / w) + 1
      const ny = Math.ceil(inner / h) + 1
      for (let i = -nx; i <= nx; i++) {
        for (let j = -ny; j <= ny; j++) {
          const cx = (i + px) * w
          const cy = (j + py) * h
          const far = Math.hypot(Math.abs(cx) + w / 2, Math.abs(cy) + h / 2)
          if (far > inner) continue
          if (!keep.every((k) => rectMissesCircle(cx, cy, w / 2, h / 2, k))) continue
          cells.push({ x: cx, y: cy, w, h })
        }
      }
      if (cells.length > best.length) best = cells
    }
  }
  best.sort((a, b) => Math.hypot(a.x, a.y) - Math.hypot(b.x, b.y) || a.y - b.y || a.x - b.x)
  const perLayer = best.length
  const capacity = perLayer * maxLayers
  const placed = Math.min(count, capacity)
  const spots: BlockSpot[] = []
  let sumX = 0
  let sumY = 0
  let sumZ = 0
  for (let k = 0; k < placed; k++) {
    const cell = best[k % perLayer]!
    const layer = Math.floor(k / perLayer)
    const hw = cell.w / 2
    const hh = cell.h / 2
    spots.push({
      x: cell.x,
      y: cell.y,
      layer,
      corners: [[cell.x - hw, cell.y - hh], [cell.x + hw, cell.y - hh], [cell.x + hw, cell.y + hh], [cell.x - hw, cell.y + hh]],
    })
    sumX += cell.x
    sumY += cell.y
    sumZ += (layer + 0.5) * thick
  }
  return {
    perLayer,
    capacity,
    spots,
    leftOver: count - placed,
    heightAboveTop: placed > 0 ? sumZ / placed : 0,
    x: placed > 0 ? sumX / placed : 0,
    y: placed > 0 ? sumY / placed : 0,
  }
}

export function materialDensity(material: UnitParams['counterweight']['material']): number {
  return COUNTERWEIGHT_MATERIALS[material].density
}

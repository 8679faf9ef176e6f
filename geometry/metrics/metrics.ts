// Sizes, area and weight of a plate. Every weight is an estimate: plywood
// density varies by species, grade, glue and moisture.

import type { Hole, Metrics, Point, Rabbet } from '../types'
import { unionArea } from '../math/circles'
import { bounds, enclosingCircle, perimeter, signedArea, simplePolygonHull } from '../math/polygon'

/**
 * Douglas-fir, specific gravity 0.48 at 12 % moisture content;
 * density = 1000 * G * (1 + MC / 100) = 537.6 kg/m3.
 */
export const PLYWOOD_DENSITY = {
  value: 1000 * 0.48 * (1 + 12 / 100),
  source: 'USDA Forest Products Laboratory, Wood Handbook (FPL-GTR-190), ch. 4-5: Douglas-fir, specific gravity 0.48 at 12 % moisture content; density = 1000 x G x (1 + MC/100)',
} as const

export interface MetricsInput {
  outline: readonly Point[]
  /** Through-holes: pockets, access openings, centre and index holes, rim fasteners. */
  holes: readonly Pick<Hole, 'x' | 'y' | 'diameter'>[]
  rabbets: readonly Rabbet[]
  pocketDiameter: number
  thickness: number
  floorGap: number
  tubeBearing: number
}

export function plateMetrics(input: MetricsInput): Metrics {
  const box = bounds(input.outline)
  const circle = enclosingCircle(input.outline, simplePolygonHull)
  const holeArea = unionArea(input.holes.map((h) => ({ x: h.x, y: h.y, radius: h.diameter / 2 })))
  const area = signedArea(input.outline) - holeArea
  // The rabbet ring removes wood to its depth outside the pocket's through-hole.
  const rabbetVolume = input.rabbets.reduce(
    (sum, rb) => sum + Math.PI * ((rb.diameter / 2) ** 2 - (input.pocketDiameter / 2) ** 2) * rb.depth,
    0,
  )
  const volume = area * input.thickness - rabbetVolume
  return {
    area,
    perimeter: perimeter(input.outline),
    width: box.maxX - box.minX,
    height: box.maxY - box.minY,
    bounds: box,
    enclosingCircle: circle,
    thickness: input.thickness,
    volume,
    weight: volume * 1e-9 * PLYWOOD_DENSITY.value,
    density: { value: PLYWOOD_DENSITY.value, source: PLYWOOD_DENSITY.source },
    floorGap: input.floorGap,
    tubeBearing: input.tubeBearing,
  }
}

// What the cutter and the sheet allow: inside bends a round bit can follow,
// root tips and roots that will not break off, a plate that fits the sheet
// with its edge margin and kerf.

import type { PlateParams } from '../params'
import type { Finding, Point } from '../types'
import type { OutlineShape } from '../outline/shape'
import { FIT_EPSILON, fitTurn } from '../math/polygon'

const mm = (v: number) => `${Math.round(v * 10) / 10} mm`

export interface Bend {
  /** Vertex index in the outline. */
  index: number
  /** Signed radius of the circle through the vertex and its neighbours, mm: negative where the outline bends inward (concave). */
  radius: number
}

/**
 * Signed radius of curvature at every vertex of a counter-clockwise polygon
 * sampled from a smooth curve: the circle through each vertex and its two
 * neighbours (R = abc / 4K), negative where the turn is clockwise (an inside
 * bend). The vertices lie on the curve, so on a true circle this is exact at
 * any spacing.
 */
export function bendRadii(ring: readonly Point[]): Float64Array {
  const out = new Float64Array(ring.length)
  for (let i = 0; i < ring.length; i++) out[i] = bendRadiusAt(ring, i)
  return out
}

/** The signed bend radius at one vertex (see bendRadii). */
export function bendRadiusAt(ring: readonly Point[], i: number): number {
  const n = ring.length
  const p = ring[(i + n - 1) % n]!
  const q = ring[i]!
  const r = ring[(i + 1) % n]!
  const ax = q[0] - p[0]
  const ay = q[1] - p[1]
  const bx = r[0] - q[0]
  const by = r[1] - q[1]
  const cross = ax * by - ay * bx
  if (cross === 0) return Infinity
  const cx = r[0] - p[0]
  const cy = r[1] - p[1]
  // sqrt of the product of squares: one root instead of three.
  return Math.sqrt((ax * ax + ay * ay) * (bx * bx + by * by) * (cx * cx + cy * cy)) / (2 * cross)
}

/** Whether the vertex turns clockwise (an inside bend of a counter-clockwise ring). */
function turnsInward(ring: readonly Point[], i: number): boolean {
  const n = ring.length
  const p = ring[(i + n - 1) % n]!
  const q = ring[i]!
  const r = ring[(i + 1) % n]!
  return (q[0] - p[0]) * (r[1] - q[1]) - (q[1] - p[1]) * (r[0] - q[0]) < 0
}

/**
 * Every stretch of the outline that bends inward tighter than the cutter's
 * radius, one finding per stretch at its tightest point. A round cutter of
 * radius r cannot make an inside corner tighter than r (REFERENCES, "smallest
 * inside radius a round cutter leaves").
 */
export function insideRadiusFindings(params: PlateParams, outline: readonly Point[]): Finding[] {
  const limit = params.cutting.bitDiameter / 2
  const n = outline.length
  // Only inward turns need their radius: most vertices are rejected by the sign of one cross product.
  const radii = new Float64Array(n)
  for (let i = 0; i < n; i++) radii[i] = turnsInward(outline, i) ? bendRadiusAt(outline, i) : Infinity
  const tight = (i: number) => radii[i]! < 0 && -radii[i]! < limit
  // Start the walk at a vertex that is not tight, so no stretch is split at the seam.
  let start = 0
  while (start < n && tight(start)) start++
  if (start === n) start = 0
  const found: Finding[] = []
  let worst = -1
  for (let k = 1; k <= n; k++) {
    const i = (start + k) % n
    if (tight(i)) {
      if (worst < 0 || -radii[i]! < -radii[worst]!) worst = i
      continue
    }
    if (worst >= 0) {
      const r = -radii[worst]!
      const [x, y] = outline[worst]!
      found.push({
        code: 'inside-radius',
        severity: 'warning',
        message: `An inside bend of the outline has a radius of ${mm(r)}, tighter than the ${mm(params.cutting.bitDiameter)} cutter can follow (it leaves ${mm(limit)} at least): round the bend or use a smaller bit.`,
        at: { x, y, radius: limit },
        field: 'cutting.bitDiameter',
        values: { radius: r, cutterRadius: limit, bitDiameter: params.cutting.bitDiameter },
      })
      worst = -1
    }
  }
  return found
}

/**
 * Root tips too sharp and roots too thin to survive handling: the tightest
 * outward bend near each lobe's tip, and each lobe's width halfway out along
 * its reach (found along the outline's radius function).
 */
export function rootFindings(params: PlateParams, shape: OutlineShape, outline: readonly Point[], thetas: Float64Array): Finding[] {
  const found: Finding[] = []
  const minTip = params.cutting.minTipRadius
  const minWidth = params.cutting.minRootWidth
  const n = outline.length
  for (const lobe of shape.lobes) {
    if (lobe.reach <= 1e-3) continue
    const tip = shape.radiusAt(lobe.angle)
    // Tip: the tightest outward bend within a third of the lobe's half-width of its tip angle.
    const window = lobe.halfWidth / 3
    let sharpest = Infinity
    let at = -1
    // The vertices' angles rise from 0 to 2 pi: walk from the one nearest the tip both ways.
    const TWO_PI = 2 * Math.PI
    const tipAngle = ((lobe.angle % TWO_PI) + TWO_PI) % TWO_PI
    let lo = 0
    let hi = n
    while (lo < hi) {
      const mid = (lo + hi) >> 1
      if (thetas[mid]! < tipAngle) lo = mid + 1
      else hi = mid
    }
    const visit = (i: number) => {
      const r = bendRadiusAt(outline, i)
      if (r > 0 && r < sharpest) {
        sharpest = r
        at = i
      }
    }
    const off = (i: number) => Math.abs(((thetas[i]! - tipAngle + 3 * Math.PI) % TWO_PI) - Math.PI)
    for (let k = 0; k < n; k++) {
      const i = (lo + k) % n
      if (off(i) > window) break
      visit(i)
    }
    for (let k = 1; k < n; k++) {
      const i = (lo - k + n) % n
      if (off(i) > window) break
      visit(i)
    }
    if (at >= 0 && sharpest < minTip) {
      const [x, y] = outline[at]!
      found.push({
        code: 'root-tip-sharp',
        severity: 'warning',
        message: `Root ${lobe.index + 1} ends in a ${mm(sharpest)} radius, sharper than the ${mm(minTip)} least tip: a sharper tip splinters. Make the root rounder or wider.`,
        at: { x, y, radius: sharpest },
        field: 'lobes.roundness',
        values: { radius: sharpest, least: minTip },
      })
    }
    // Width halfway out: walk each side from the tip until the radius falls below the half-reach level.
    const level = tip - lobe.reach / 2
    const side = (dir: 1 | -1): number | null => {
      let inside = 0
      let outside = lobe.halfWidth * 1.2
      if (shape.radiusAt(lobe.angle + dir * outside) >= level) return null
      // 16 halvings: the crossing to within 1/65 000 of the lobe's width.
      for (let k = 0; k < 16; k++) {
        const mid = (inside + outside) / 2
        if (shape.radiusAt(lobe.angle + dir * mid) >= level) inside = mid
        else outside = mid
      }
      return lobe.angle + dir * (inside + outside) / 2
    }
    const a = side(-1)
    const b = side(1)
    if (a === null || b === null) continue
    const [ax, ay] = shape.pointAt(a)
    const [bx, by] = shape.pointAt(b)
    const width = Math.hypot(bx - ax, by - ay)
    if (width < minWidth) {
      found.push({
        code: 'root-narrow',
        severity: 'warning',
        message: `Root ${lobe.index + 1} is ${mm(width)} wide halfway out, less than the ${mm(minWidth)} least root width: plywood that narrow snaps across the grain. Widen the root or shorten it.`,
        at: { x: (ax + bx) / 2, y: (ay + by) / 2, radius: width / 2 },
        field: 'lobes.width',
        values: { width, least: minWidth },
      })
    }
  }
  return found
}

/**
 * Whether the plate fits the sheet inside its edge margin, in some turn: the
 * rule the nester (geometry/nest/nest.ts) places parts by, through the same
 * fitTurn. The margin is the strip no part may enter; the kerf is kept
 * between parts, so it plays no part for one plate alone (it is in the
 * message, as the nester's spacing). No slack beyond floating-point noise:
 * a part that fits by the user's own figures fits. Any plate inside a circle
 * that fits the usable width fits without turning.
 */
export function sheetFindings(params: PlateParams, outline: readonly Point[], enclosingRadius: number): Finding[] {
  const c = params.cutting
  const usableW = c.sheetWidth - 2 * c.edgeMargin
  const usableL = c.sheetLength - 2 * c.edgeMargin
  if (2 * enclosingRadius <= usableW + FIT_EPSILON) return []
  if (usableW > 0 && usableL > 0 && fitTurn(outline, usableW, usableL) !== null) return []
  return [{
    code: 'larger-than-sheet',
    severity: 'warning',
    message: `The plate does not fit a ${mm(c.sheetWidth)} x ${mm(c.sheetLength)} sheet in any orientation, keeping ${mm(c.edgeMargin)} clear at the sheet's edges: each layer must be pieced.`,
    field: 'lobes.reach',
    values: { sheetWidth: c.sheetWidth, sheetLength: c.sheetLength, edgeMargin: c.edgeMargin, kerf: c.kerf, enclosingDiameter: 2 * enclosingRadius },
  }]
}

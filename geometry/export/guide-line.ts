// The pattern line for routing the plate with a guide bushing. The bushing
// rides the pattern's edge and the bit, turning inside it, cuts
// (bushing - bit) / 2 beyond that edge (router pattern practice). So the
// pattern is the plate's wood shrunk by that offset: the outside profile moves
// in, each routed opening grows. Shrinking is a true offset from clipper2-ts;
// what the shrinking loses (a root narrower than twice the offset, a sharp tip,
// a thin web between an opening and the edge) the bushing cannot bring back,
// so those stretches of the cut line are reported instead of drawn wrong.
// No pdf-lib here: the browser imports this for its previews.

import type { Hole, Plate, Point } from '../types'
import { offsetRing, offsetRings, ringArea } from '../math/offset'

export interface GuideOptions {
  /** Outside diameter of the guide bushing, mm. */
  bushing: number
  /** Cutting diameter of the bit, mm. */
  bit: number
}

/** A stretch of a cut line the bushing cannot follow: cut it by hand or with a flush-trim bit. */
export interface UnreachableRun {
  /** null for the outside profile, else the routed opening's hole id. */
  holeId: string | null
  /** Points of the cut line, mm, in order along it. */
  points: Point[]
  /** True when the whole cut line is out of reach. */
  closed: boolean
  /** Length along the cut line, mm. */
  length: number
}

export interface GuidePattern {
  /** (bushing - bit) / 2, mm. */
  offset: number
  /** Every edge of the pattern: outsides counter-clockwise, openings clockwise. */
  rings: Point[][]
  /** The routed openings the pattern carries. */
  openings: Hole[]
  unreachable: UnreachableRun[]
}

/** A cut point counts as reached when the pattern's edge lies within the offset plus this, mm. */
export const GUIDE_TOLERANCE = 0.1
/** Chord error of the round openings handed to the offset, mm. */
const CIRCLE_CHORD = 0.005

/** Offset for a guide bushing: (bushing outside diameter - bit diameter) / 2 (router pattern practice). */
export function guideOffset(options: GuideOptions): number {
  if (options === null || typeof options !== 'object') throw new TypeError('Give the bushing and bit diameters.')
  const { bushing, bit } = options
  if (!(Number.isFinite(bushing) && Number.isFinite(bit)) || bit <= 0 || bushing <= bit) {
    throw new RangeError(`The bushing (${bushing} mm) must be wider than the bit (${bit} mm), both above zero.`)
  }
  return (bushing - bit) / 2
}

/**
 * The closed rings (mm) a guide bushing follows to cut the outside profile:
 * the outline offset (bushing - bit) / 2 inwards, counter-clockwise. Roots
 * too narrow for the offset drop out, and a plate pinched at a waist can give
 * more than one ring; `guidePattern` says which parts of the cut line that
 * leaves out.
 */
export function guideLine(plate: Pick<Plate, 'outline'>, options: GuideOptions): Point[][] {
  const d = guideOffset(options)
  return offsetRing(plate.outline, -d).filter((r) => ringArea(r) > 0)
}

/**
 * Openings cut with the router and the pattern: pockets and access openings,
 * the holes the geometry marks `routed` (hole-sawn and drilled ones need no pattern).
 */
export function routedOpenings(plate: Pick<Plate, 'holes'>): Hole[] {
  return plate.holes.filter((h) => (h.kind === 'pocket' || h.kind === 'access') && h.method === 'routed')
}

/** A circle as a polygon whose chords stay within `chord` of it, starting at angle 0, in the given winding. */
export function circleRing(x: number, y: number, r: number, chord = CIRCLE_CHORD, clockwise = false): Point[] {
  const n = Math.max(16, Math.ceil(Math.PI / Math.acos(Math.max(-1, 1 - chord / Math.max(r, chord)))))
  const s = clockwise ? -1 : 1
  return Array.from({ length: n }, (_, i) => {
    const a = (s * 2 * Math.PI * i) / n
    return [x + r * Math.cos(a), y + r * Math.sin(a)] as Point
  })
}

/** Segments of the pattern bucketed on a square grid, to ask "is any edge within reach of this point?". */
class SegmentGrid {
  private readonly cells = new Map<string, number[]>()
  private readonly segs: number[] = []

  constructor(rings: Point[][], private readonly size: number) {
    for (const ring of rings) {
      for (let i = 0; i < ring.length; i++) {
        const a = ring[i]!
        const b = ring[(i + 1) % ring.length]!
        const id = this.segs.length / 4
        this.segs.push(a[0], a[1], b[0], b[1])
        const x0 = Math.floor(Math.min(a[0], b[0]) / size)
        const x1 = Math.floor(Math.max(a[0], b[0]) / size)
        const y0 = Math.floor(Math.min(a[1], b[1]) / size)
        const y1 = Math.floor(Math.max(a[1], b[1]) / size)
        for (let cx = x0; cx <= x1; cx++) {
          for (let cy = y0; cy <= y1; cy++) {
            const key = `${cx},${cy}`
            const cell = this.cells.get(key)
            if (cell) cell.push(id)
            else this.cells.set(key, [id])
          }
        }
      }
    }
  }

  /** True when some segment lies within `reach` (at most the cell size) of (px, py). */
  within(px: number, py: number, reach: number): boolean {
    const cx = Math.floor(px / this.size)
    const cy = Math.floor(py / this.size)
    const r2 = reach * reach
    const s = this.segs
    for (let i = cx - 1; i <= cx + 1; i++) {
      for (let j = cy - 1; j <= cy + 1; j++) {
        const cell = this.cells.get(`${i},${j}`)
        if (!cell) continue
        for (const id of cell) {
          const ax = s[4 * id]!
          const ay = s[4 * id + 1]!
          const dx = s[4 * id + 2]! - ax
          const dy = s[4 * id + 3]! - ay
          const len2 = dx * dx + dy * dy
          const t = len2 > 0 ? Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2)) : 0
          const ex = ax + t * dx - px
          const ey = ay + t * dy - py
          if (ex * ex + ey * ey <= r2) return true
        }
      }
    }
    return false
  }
}

/** Largest gap between the cut-line points tested for reach, mm: a missed stretch is placed to within it. */
const MAX_STEP = 1

/** The ring with points added along long edges; its own vertices are kept exactly. */
function densify(ring: Point[], step: number): Point[] {
  const out: Point[] = []
  const n = ring.length
  for (let i = 0; i < n; i++) {
    const a = ring[i]!
    const b = ring[(i + 1) % n]!
    out.push(a)
    const pieces = Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / step)
    for (let k = 1; k < pieces; k++) out.push([a[0] + ((b[0] - a[0]) * k) / pieces, a[1] + ((b[1] - a[1]) * k) / pieces])
  }
  return out
}

function runLength(points: Point[], closed: boolean): number {
  let sum = 0
  const n = points.length
  for (let i = 0; i < (closed ? n : n - 1); i++) {
    const a = points[i]!
    const b = points[(i + 1) % n]!
    sum += Math.hypot(b[0] - a[0], b[1] - a[1])
  }
  return sum
}

/** Runs of consecutive cut-line points the pattern does not reach, each widened by one point either side. */
function missedRuns(cut: Point[], reached: boolean[], holeId: string | null): UnreachableRun[] {
  const n = cut.length
  const start = reached.indexOf(true)
  if (start < 0) return [{ holeId, points: cut, closed: true, length: runLength(cut, true) }]
  const runs: UnreachableRun[] = []
  let k = 0
  while (k < n) {
    const i = (start + k) % n
    if (reached[i]) {
      k++
      continue
    }
    let j = k
    while (j < n && !reached[(start + j) % n]) j++
    // Points start+k .. start+j-1 are missed; start+k-1 and start+j are reached: include them so the run covers its edges.
    const points: Point[] = []
    for (let m = k - 1; m <= j; m++) points.push(cut[(start + m) % n]!)
    runs.push({ holeId, points, closed: false, length: runLength(points, false) })
    k = j
  }
  return runs
}

/**
 * The whole pattern: the plate's wood with its routed openings, shrunk by the
 * offset as one piece (a web too thin between an opening and the edge is
 * lost, as it would be in the pattern), and the stretches of every routed cut
 * line the bushing riding that pattern cannot reach.
 */
export function guidePattern(plate: Pick<Plate, 'outline' | 'holes'>, options: GuideOptions, tolerance = GUIDE_TOLERANCE): GuidePattern {
  const d = guideOffset(options)
  const openings = routedOpenings(plate)
  const outline = ringArea(plate.outline) < 0 ? [...plate.outline].reverse() : plate.outline
  const holeRings = openings.map((h) => circleRing(h.x, h.y, h.diameter / 2, CIRCLE_CHORD, true))
  const rings = offsetRings([outline, ...holeRings], -d)

  const reach = d + tolerance
  const grid = new SegmentGrid(rings, Math.max(reach, 1))
  const check = (ring: Point[], holeId: string | null): UnreachableRun[] => {
    const cut = densify(ring, MAX_STEP)
    const reached = cut.map(([x, y]) => grid.within(x, y, reach))
    return reached.every(Boolean) ? [] : missedRuns(cut, reached, holeId)
  }
  const unreachable = [
    ...check(outline, null),
    ...openings.flatMap((h, i) => check(holeRings[i]!, h.id)),
  ]
  return { offset: d, rings, openings, unreachable }
}

// Shape nesting: parts placed one by one, largest first, each at the lowest
// free spot of the first sheet that has room, over several turns. Free spots
// come from no-fit polygons (Minkowski sums through geometry/math/offset.ts):
// the region where a part's reference point would make it overlap a placed
// part (grown by the kerf) is cut out of the region that keeps it inside the
// sheet's margin, and the best vertex of what is left is where it goes. Parts
// follow their real outlines, so a lobe can sit between another plate's roots.

import type { Point } from '../types'
import { signedArea, bounds, distanceToRing, fitTurn, FIT_EPSILON, type Bounds } from '../math/polygon'
import { convexPieces, differenceRings, minkowskiSumRings, offsetRing, thinRing } from '../math/offset'

export interface NestPartInput {
  /** Closed outline, mm, first point not repeated; either winding. */
  outline: Point[]
  /** How many copies to place (0 allowed). */
  count: number
}

export interface NestSheetInput {
  /** Sheet size along x and y, mm. */
  width: number
  height: number
  /** Strip round the edge no part may enter, mm. */
  margin: number
  /** Least distance between two parts, mm (the cutter's kerf). */
  kerf: number
}

export interface NestOptions {
  /**
   * Turns tried, degrees counter-clockwise. Default 0, 90, 180, 270, and
   * every 45 degrees for a part whose outline is near round (its bounding
   * box about square), where in-between turns let roots interleave.
   */
  turns?: number[]
  /** Keep every part's grain along the sheet's: only 0 and 180 degree turns. */
  grain?: boolean
  /**
   * Stop with a NestTimeoutError once this many milliseconds have passed
   * (checked between parts). Default: no limit.
   */
  timeLimit?: number
  /** Report progress (parts placed, parts in all, and the step just placed) after each part. */
  onProgress?: (placed: number, total: number, step: NestStep) => void
  /**
   * Place the copies in this order (one step per copy: each part's index as
   * often as its count), instead of largest first. A step may fix its turn;
   * a step with `at` and `sheet` is put there unsearched (replaying the start
   * of an earlier layout from its `steps`: trusted, not checked).
   */
  order?: NestStep[]
}

/** One copy placed: which part, and (as a layout's record) its turn, position and sheet. */
export interface NestStep {
  part: number
  turn?: number
  at?: Point
  sheet?: number
}

export interface PlacedPart {
  /** Index into the parts given. */
  part: number
  /** The part's outline in sheet coordinates (origin at the sheet's lower-left corner), same point order as given. */
  outline: Point[]
  /** The turn applied, degrees counter-clockwise about the part's own origin... */
  turn: number
  /** ...then moved by this much: sheet point = rotate(part point, turn) + at. */
  at: Point
}

export interface NestedSheet {
  parts: PlacedPart[]
}

export interface NestResult {
  sheets: NestedSheet[]
}

/** A part that cannot fit the sheet inside its margin at any allowed turn. */
export class PartTooLargeError extends Error {
  constructor(
    readonly part: number,
    /** The part's smallest width and length over the allowed turns, mm. */
    readonly size: { width: number; height: number },
    /** The room inside the margin, mm. */
    readonly room: { width: number; height: number },
  ) {
    super(
      `Part ${part + 1} (${size.width.toFixed(1)} x ${size.height.toFixed(1)} mm at its best allowed turn) ` +
        `does not fit the ${room.width.toFixed(1)} x ${room.height.toFixed(1)} mm inside the sheet's margin.`,
    )
    this.name = 'PartTooLargeError'
  }
}

export class NestTimeoutError extends Error {
  constructor(readonly placed: number, readonly total: number, readonly limit: number) {
    super(`Nesting stopped after ${limit} ms with ${placed} of ${total} parts placed; plan fewer plates at once.`)
    this.name = 'NestTimeoutError'
  }
}

/** How far thinning may move the spacing shape's edges, mm, before it is grown back: fewer points, faster sums. */
const THIN = 2.5
/**
 * Largest gap between a grown outline's corner arcs and their chords, mm: the
 * engine's own micrometre. Parts are kept apart by the user's kerf and inside
 * the user's margin with no slack beyond this and the engine's rounding to
 * the micrometre (geometry/math/offset.ts).
 */
const SPACING_ARC_TOLERANCE = 1e-3
/**
 * The polygon engine's rounding, mm (a micrometre): parts are spaced a kerf
 * less this, so a spot exactly a kerf from a placed part survives rounding.
 */
const FIT_ROUNDING = 1e-3

const DEFAULT_TURNS = [0, 90, 180, 270]
const ROUND_TURNS = [0, 45, 90, 135, 180, 225, 270, 315]

function rotate(ring: readonly Point[], degrees: number): Point[] {
  const t = (((degrees % 360) + 360) % 360) * (Math.PI / 180)
  const c = Math.cos(t)
  const s = Math.sin(t)
  // Exact quarter turns keep coordinates exact.
  const [cc, ss] = degrees % 90 === 0 ? [Math.round(c), Math.round(s)] : [c, s]
  return ring.map(([x, y]) => [x * cc - y * ss, x * ss + y * cc] as Point)
}

interface Prepared {
  /** A digest of the spacing shape: keys the no-fit polygon cache. */
  key: string
  index: number
  /** The spacing shape unturned, and its convex pieces. */
  spacing: Point[]
  pieces: Point[][]
  outline: Point[]
  area: number
  turns: number[]
  /** Per turn: the true outline's bounds and the spacing shape (outline grown by half the kerf, thinned). */
  shapes: Map<number, { bounds: Bounds; spacing: Point[] }>
}

function normaliseTurns(turns: number[], grain: boolean): number[] {
  const set = new Set<number>()
  for (const t of turns) {
    const d = Math.round((((t % 360) + 360) % 360) * 1e6) / 1e6
    if (!grain || d === 0 || d === 180) set.add(d)
  }
  if (set.size === 0) set.add(0)
  return [...set].sort((a, b) => a - b)
}

/** FNV-1a over the ring's coordinates to the micrometre, with its length: equal shapes, equal keys. */
function digest(ring: readonly Point[]): string {
  let h = 0x811c9dc5
  for (const [x, y] of ring) {
    for (const v of [Math.round(x * 1000), Math.round(y * 1000)]) {
      h ^= v & 0xffff
      h = Math.imul(h, 0x01000193)
      h ^= (v >>> 16) & 0xffff
      h = Math.imul(h, 0x01000193)
    }
  }
  return `${ring.length}:${(h >>> 0).toString(36)}`
}

/**
 * No-fit polygons already worked out, shared by every nesting in this
 * process: a plan asked again with one count changed, or its files, reuse
 * them. Bounded; the oldest go first.
 */
const NFP_CACHE = new Map<string, Point[][]>()
const NFP_CACHE_SIZE = 5000
/** Convex pieces of the spacing shapes, by the same digest: a search places the same parts again and again. */
const PIECES_CACHE = new Map<string, Point[][]>()

/**
 * The outline grown by `clearance` (half the kerf each side keeps two parts a
 * whole kerf apart). An outline of few points (drawn polygons, rectangles) is
 * grown exactly, its corner arcs within a micrometre: two such parts stand a
 * kerf apart and no more. A curved outline of many points is thinned for fast
 * Minkowski sums, then grown again by as much as the thinning cut into it, so
 * it still holds the whole grown outline: between two curved parts the gap
 * may exceed the kerf by up to about twice THIN where the thinning left
 * chords (a known cost of speed, not a rule: the margin and the fit on the
 * sheet use the true outline).
 */
function spacingShape(ccw: Point[], clearance: number): Point[] {
  if (clearance <= 0) return [...ccw]
  const few = ccw.length <= 64
  const grown = offsetRing(ccw, clearance, few ? { arcTolerance: SPACING_ARC_TOLERANCE } : {})
  const biggest = grown.reduce<Point[]>((best, r) => (Math.abs(signedArea(r)) > Math.abs(signedArea(best)) ? r : best), grown[0] ?? ccw)
  if (few) return biggest
  const thin = thinRing(biggest, THIN)
  let cut = 0
  for (const [x, y] of biggest) {
    if (!insideRing(thin, x, y)) cut = Math.max(cut, distanceToRing(thin, x, y))
  }
  if (cut < 1e-3) return thin
  const regrown = offsetRing(thin, cut + 1e-3, { join: 'miter' })
  return regrown.reduce<Point[]>((best, r) => (Math.abs(signedArea(r)) > Math.abs(signedArea(best)) ? r : best), regrown[0] ?? thin)
}

/** Even-odd point in polygon. */
function insideRing(ring: readonly Point[], x: number, y: number): boolean {
  let inside = false
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i]!
    const [xj, yj] = ring[j]!
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
  }
  return inside
}

function prepare(index: number, outline: Point[], sheet: NestSheetInput, options: NestOptions): Prepared {
  const ccw = signedArea(outline) < 0 ? [...outline].reverse() : outline
  const b0 = bounds(ccw)
  const w = b0.maxX - b0.minX
  const h = b0.maxY - b0.minY
  const roundish = Math.min(w, h) / Math.max(w, h) > 0.85
  const turns = normaliseTurns(options.turns ?? (roundish ? ROUND_TURNS : DEFAULT_TURNS), options.grain ?? false)
  // The sheet check's rule (geometry/checks/cutting.ts): a part that fits the sheet inside its margin at
  // some turn is placed, at that turn when none of the usual ones fits (unless the grain forbids it).
  if (!turns.some((t) => innerFit(bounds(rotate(ccw, t)), sheet))) {
    const t = fitTurn(ccw, sheet.width - 2 * sheet.margin, sheet.height - 2 * sheet.margin)
    if (t !== null) turns.push(...normaliseTurns([t], options.grain ?? false).filter((d) => !turns.includes(d)))
  }
  const spacing0 = spacingShape(ccw, Math.max(0, sheet.kerf - FIT_ROUNDING) / 2)
  const shapes = new Map<number, { bounds: Bounds; spacing: Point[] }>()
  for (const t of turns) shapes.set(t, { bounds: bounds(rotate(ccw, t)), spacing: rotate(spacing0, t) })
  const key = digest(spacing0)
  let pieces = PIECES_CACHE.get(key)
  if (!pieces) {
    PIECES_CACHE.set(key, (pieces = convexPieces(spacing0)))
    if (PIECES_CACHE.size > NFP_CACHE_SIZE) PIECES_CACHE.delete(PIECES_CACHE.keys().next().value!)
  }
  return { key, index, spacing: spacing0, pieces, outline, area: Math.abs(signedArea(ccw)), turns, shapes }
}

interface Placement {
  prepared: Prepared
  turn: number
  at: Point
}

interface SheetState {
  placed: Placement[]
  /** Room inside the margin not yet covered by a part's outline, mm2: a part larger than this cannot fit, so its sums are skipped. */
  free: number
}

/** Where a part at `turn` may put its origin so that it stays inside the margin (empty when it cannot). */
function innerFit(b: Bounds, sheet: NestSheetInput): Point[] | null {
  let x0 = sheet.margin - b.minX
  let x1 = sheet.width - sheet.margin - b.maxX
  let y0 = sheet.margin - b.minY
  let y1 = sheet.height - sheet.margin - b.maxY
  if (x1 < x0 - FIT_EPSILON || y1 < y0 - FIT_EPSILON) return null
  // A part that fits exactly has one position: centre it (floating-point noise), and give the
  // rectangle half a micrometre each way so the engine keeps an area.
  const e = FIT_ROUNDING / 2
  if (x1 - x0 < 2 * e) [x0, x1] = [(x0 + x1) / 2 - e, (x0 + x1) / 2 + e]
  if (y1 - y0 < 2 * e) [y0, y1] = [(y0 + y1) / 2 - e, (y0 + y1) / 2 + e]
  return [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
  ]
}

/**
 * The nester with its caches. The no-fit polygon of part B turned by tb
 * against part A turned by ta is the one for A unturned and B turned by
 * tb - ta, turned by ta: one Minkowski sum serves every pair of turns with
 * the same difference.
 */
class Nester {
  constructor(private sheet: NestSheetInput) {}

  private nfp(fixed: Placement, moving: Prepared, turn: number): Point[][] {
    const rel = (((turn - fixed.turn) % 360) + 360) % 360
    const key = `${fixed.prepared.key}|${moving.key}|${rel}`
    let base = NFP_CACHE.get(key)
    if (!base) {
      // Positions p where moving + p meets fixed: fixed + (-moving).
      const neg = (ring: Point[]) => rotate(ring, rel + 180)
      base = minkowskiSumRings(fixed.prepared.spacing, neg(moving.spacing), {
        a: fixed.prepared.pieces,
        b: moving.pieces.map(neg),
      })
      NFP_CACHE.set(key, base)
      if (NFP_CACHE.size > NFP_CACHE_SIZE) NFP_CACHE.delete(NFP_CACHE.keys().next().value!)
    }
    const [dx, dy] = fixed.at
    return base.map((ring) => rotate(ring, fixed.turn).map(([x, y]) => [x + dx, y + dy] as Point))
  }

  /** The best spot for one part on one sheet over its turns, or null. */
  bestOn(state: SheetState, part: Prepared, turns = part.turns): Placement | null {
    if (part.area > state.free) return null
    let best: { placement: Placement; score: [number, number] } | null = null
    for (const turn of turns) {
      const shape = part.shapes.get(turn)!
      const fit = innerFit(shape.bounds, this.sheet)
      if (!fit) continue
      const blocked = state.placed.flatMap((p) => this.nfp(p, part, turn))
      const free = differenceRings([fit], blocked)
      for (const ring of free) {
        if (signedArea(ring) <= 0) continue
        for (const [rx, ry] of ring) {
          // The engine rounds to the micrometre: clamp back inside the margin, so a part at the
          // margin is exactly there and never half a micrometre past it.
          const x = Math.min(Math.max(rx, fit[0]![0]), fit[2]![0])
          const y = Math.min(Math.max(ry, fit[0]![1]), fit[2]![1])
          // Lowest top edge first, then furthest left: rows build up from the bottom and leave one
          // clear offcut at the far end.
          const score: [number, number] = [Math.round((y + shape.bounds.maxY) * 10) / 10, x + shape.bounds.maxX]
          if (!best || score[0] < best.score[0] || (score[0] === best.score[0] && score[1] < best.score[1])) {
            best = { placement: { prepared: part, turn, at: [x, y] }, score }
          }
        }
      }
    }
    return best?.placement ?? null
  }
}

function checkInputs(parts: NestPartInput[], sheet: NestSheetInput): void {
  for (const k of ['width', 'height', 'margin', 'kerf'] as const) {
    if (!Number.isFinite(sheet[k]) || sheet[k] < 0) throw new RangeError(`sheet.${k} must be a length of 0 mm or more, got ${sheet[k]}.`)
  }
  if (sheet.width <= 2 * sheet.margin || sheet.height <= 2 * sheet.margin) throw new RangeError('The margin leaves no room on the sheet.')
  parts.forEach((p, i) => {
    if (!Array.isArray(p.outline) || p.outline.length < 3) throw new RangeError(`Part ${i + 1} needs an outline of 3 points or more.`)
    if (p.outline.some((q) => !Number.isFinite(q[0]) || !Number.isFinite(q[1]))) throw new RangeError(`Part ${i + 1} has a point that is not a number.`)
    if (!Number.isInteger(p.count) || p.count < 0) throw new RangeError(`Part ${i + 1}: count must be a whole number of 0 or more.`)
  })
}

function refuseTooLarge(prepared: Prepared[], sheet: NestSheetInput): void {
  const room = { width: sheet.width - 2 * sheet.margin, height: sheet.height - 2 * sheet.margin }
  for (const p of prepared) {
    if (p.turns.some((t) => innerFit(p.shapes.get(t)!.bounds, sheet))) continue
    let size = { width: Infinity, height: Infinity }
    for (const t of p.turns) {
      const b = p.shapes.get(t)!.bounds
      const s = { width: b.maxX - b.minX, height: b.maxY - b.minY }
      if (s.width * s.height < size.width * size.height) size = s
    }
    throw new PartTooLargeError(p.index, size, room)
  }
}

/** An order must hold each part's index as often as its count, with allowed turns only. */
function checkOrder(order: NestStep[], parts: NestPartInput[], prepared: Prepared[]): void {
  const seen = parts.map(() => 0)
  for (const step of order) {
    const p = prepared[step.part]
    if (!p) throw new RangeError(`The order names part ${step.part + 1}, which is not given.`)
    if (step.turn !== undefined && !p.turns.includes(step.turn)) throw new RangeError(`Part ${step.part + 1} may not turn ${step.turn} degrees.`)
    seen[step.part]!++
  }
  seen.forEach((n, i) => {
    if (n !== parts[i]!.count) throw new RangeError(`The order places part ${i + 1} ${n} times; its count is ${parts[i]!.count}.`)
  })
}

function placedPart(p: Placement): PlacedPart {
  const [dx, dy] = p.at
  return {
    part: p.prepared.index,
    outline: rotate(p.prepared.outline, p.turn).map(([x, y]) => [x + dx, y + dy] as Point),
    turn: p.turn,
    at: [dx, dy],
  }
}

/** A nesting in progress that more parts can be tried against (what-if questions). */
export interface Nesting {
  result: NestResult
  /** Every copy in the order placed, with its turn, position and sheet index (NestOptions.order replays them). */
  steps: NestStep[]
  /**
   * Would these further copies of the parts given (index and how many) all
   * still fit on the sheets already used, without a new one?
   */
  fitsMore(extra: { part: number; count: number }[]): boolean
}

/** Nest and keep the state, so the caller can ask what else still fits. */
/**
 * The nesting as steps: it yields after every part placed, so a caller can
 * let other work run in between (nestWithStateAsync) and returns the result.
 */
export function* nestSteps(parts: NestPartInput[], sheet: NestSheetInput, options: NestOptions = {}): Generator<void, Nesting> {
  checkInputs(parts, sheet)
  const prepared = parts.map((p, i) => prepare(i, p.outline, sheet, options))
  refuseTooLarge(prepared.filter((p, i) => parts[i]!.count > 0), sheet)
  const queue: NestStep[] = options.order ?? []
  if (options.order) checkOrder(options.order, parts, prepared)
  else for (const p of [...prepared].sort((a, b) => b.area - a.area || a.index - b.index)) {
    for (let k = 0; k < parts[p.index]!.count; k++) queue.push({ part: p.index })
  }
  const steps: NestStep[] = []
  const nester = new Nester(sheet)
  const sheets: SheetState[] = []
  const usable = (sheet.width - 2 * sheet.margin) * (sheet.height - 2 * sheet.margin)
  const started = Date.now()
  let done = 0
  for (const step of queue) {
    if (options.timeLimit !== undefined && Date.now() - started > options.timeLimit) {
      throw new NestTimeoutError(done, queue.length, options.timeLimit)
    }
    const part = prepared[step.part]!
    const turns = step.turn === undefined ? part.turns : [step.turn]
    let placement: Placement | null = null
    let target: SheetState | undefined
    if (step.at && step.sheet !== undefined) {
      while (sheets.length <= step.sheet) sheets.push({ placed: [], free: usable })
      placement = { prepared: part, turn: turns[0]!, at: step.at }
      target = sheets[step.sheet]
    }
    for (const s of sheets) {
      if (placement) break
      placement = nester.bestOn(s, part, turns)
      if (placement) target = s
    }
    if (!placement) {
      target = { placed: [], free: usable }
      sheets.push(target)
      // A turn fixed by the order may not fit at all: then the part's other turns.
      placement = nester.bestOn(target, part, turns) ?? nester.bestOn(target, part)
      // refuseTooLarge guarantees an empty sheet takes every part.
      if (!placement) throw new Error(`Part ${part.index + 1} did not fit an empty sheet.`)
    }
    target!.placed.push(placement)
    target!.free -= part.area
    steps.push({ part: part.index, turn: placement.turn, at: placement.at, sheet: sheets.indexOf(target!) })
    done++
    options.onProgress?.(done, queue.length, steps[done - 1]!)
    yield
  }
  const result: NestResult = { sheets: sheets.map((s) => ({ parts: s.placed.map(placedPart) })) }
  return {
    result,
    steps,
    fitsMore(extra) {
      const trial = sheets.map((s) => ({ placed: [...s.placed], free: s.free }))
      for (const { part: index, count } of extra) {
        const part = prepared[index]
        if (!part) throw new RangeError(`No part ${index + 1}.`)
        for (let k = 0; k < count; k++) {
          let placed = false
          for (const s of trial) {
            const p = nester.bestOn(s, part)
            if (!p) continue
            s.placed.push(p)
            s.free -= part.area
            placed = true
            break
          }
          if (!placed) return false
        }
      }
      return true
    },
  }
}

/** Run steps to the end without a break. */
export function drain<T>(steps: Generator<void, T>): T {
  for (;;) {
    const r = steps.next()
    if (r.done) return r.value
  }
}

/**
 * Run steps, handing the thread back (a macrotask) whenever `slice` ms of work
 * have passed: a server keeps answering other requests, a page keeps painting.
 */
export async function drainAsync<T>(steps: Generator<void, T>, slice = 30): Promise<T> {
  let since = Date.now()
  for (;;) {
    const r = steps.next()
    if (r.done) return r.value
    if (Date.now() - since >= slice) {
      await new Promise((resolve) => setTimeout(resolve, 0))
      since = Date.now()
    }
  }
}

/** nestSteps run to the end: the nesting and its state. */
export function nestWithState(parts: NestPartInput[], sheet: NestSheetInput, options: NestOptions = {}): Nesting {
  return drain(nestSteps(parts, sheet, options))
}

/**
 * Nest `count` copies of every part on as few sheets as this greedy
 * placement finds. Parts keep their shape: turned and moved, never mirrored
 * or scaled. Throws PartTooLargeError for a part no allowed turn fits inside
 * the margin, NestTimeoutError past `timeLimit`, RangeError for bad input.
 */
export function nestParts(parts: NestPartInput[], sheet: NestSheetInput, options: NestOptions = {}): NestResult {
  return nestWithState(parts, sheet, options).result
}

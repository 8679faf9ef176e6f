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
  /** Turn of the block's long side from +x, degrees counter-clockwise, 0 to 180. */
  angle: number
  /** 0 for the layer on the plate. */
  layer: number
  /** Footprint corners, counter-clockwise. */
  corners: Point[]
}

export interface BlockLayout {
  /** Blocks one layer holds inside the tube, clear of the pans and the access openings; 0 when none fits. */
  perLayer: number
  /** perLayer times the layers allowed. */
  capacity: number
  /** Where the first `min(count, capacity)` blocks lie, nearest the centre first, each layer on the same spots. */
  spots: BlockSpot[]
  /** Blocks that found no place. */
  leftOver: number
  /** Their centre of mass above the plate's top face, mm (0 without blocks). */
  heightAboveTop: number
  /** And in plan, mm. */
  x: number
  y: number
}

/** A disc the blocks keep out of: a pan's rabbet or an access opening. */
interface Disc {
  x: number
  y: number
  r: number
}

/** A block's footprint: centre, the cosine and sine of its turn, half its long and short sides. */
interface Box {
  x: number
  y: number
  c: number
  s: number
  hw: number
  hh: number
}

function boxCorners(b: Box): Point[] {
  const ax = b.c * b.hw
  const ay = b.s * b.hw
  const bx = -b.s * b.hh
  const by = b.c * b.hh
  return [
    [b.x - ax - bx, b.y - ay - by],
    [b.x + ax - bx, b.y + ay - by],
    [b.x + ax + bx, b.y + ay + by],
    [b.x - ax + bx, b.y - ay + by],
  ]
}

/** Whether the box lies inside the circle of radius `r` round the origin and clear of every disc (touching allowed within `eps`). */
function staticFits(b: Box, r: number, discs: readonly Disc[], eps: number): boolean {
  const diag = Math.hypot(b.hw, b.hh)
  const centre = Math.hypot(b.x, b.y)
  if (centre + diag > r + eps) {
    const lim = (r + eps) * (r + eps)
    const ax = b.c * b.hw
    const ay = b.s * b.hw
    const bx = -b.s * b.hh
    const by = b.c * b.hh
    for (const [sx, sy] of SIGNS) {
      const x = b.x + sx * ax + sy * bx
      const y = b.y + sx * ay + sy * by
      if (x * x + y * y > lim) return false
    }
  }
  for (const d of discs) {
    const dx = d.x - b.x
    const dy = d.y - b.y
    const rr = d.r - eps
    if (rr <= 0 || dx * dx + dy * dy >= (rr + diag) * (rr + diag)) continue
    const qx = Math.max(Math.abs(b.c * dx + b.s * dy) - b.hw, 0)
    const qy = Math.max(Math.abs(-b.s * dx + b.c * dy) - b.hh, 0)
    if (qx * qx + qy * qy < rr * rr) return false
  }
  return true
}

const SIGNS: readonly (readonly [number, number])[] = [[-1, -1], [1, -1], [1, 1], [-1, 1]]

/** Separating-axis test: true when the two boxes share area (more than `eps` deep). */
function boxesOverlap(a: Box, b: Box, eps: number): boolean {
  const dx = b.x - a.x
  const dy = b.y - a.y
  const reach = Math.hypot(a.hw, a.hh) + Math.hypot(b.hw, b.hh)
  if (dx * dx + dy * dy >= reach * reach) return false
  return !(separates(a, b, a.c, a.s, dx, dy, eps) || separates(a, b, -a.s, a.c, dx, dy, eps) || separates(a, b, b.c, b.s, dx, dy, eps) || separates(a, b, -b.s, b.c, dx, dy, eps))
}

function separates(a: Box, b: Box, ux: number, uy: number, dx: number, dy: number, eps: number): boolean {
  const ra = a.hw * Math.abs(ux * a.c + uy * a.s) + a.hh * Math.abs(-ux * a.s + uy * a.c)
  const rb = b.hw * Math.abs(ux * b.c + uy * b.s) + b.hh * Math.abs(-ux * b.s + uy * b.c)
  return Math.abs(ux * dx + uy * dy) >= ra + rb - eps
}

function turned(x: number, y: number, angle: number, hw: number, hh: number): Box {
  return { x, y, c: Math.cos(angle), s: Math.sin(angle), hw, hh }
}

/** Placed boxes in square buckets over the tube (cells a block's diagonal wide), so a new box is checked against its neighbours only. */
class Placed {
  readonly boxes: Box[] = []
  private readonly cells: (Box[] | undefined)[]
  private readonly side: number
  constructor(private readonly r: number, private readonly cell: number, private readonly eps: number) {
    this.side = Math.ceil((2 * r) / cell) + 3
    this.cells = new Array(this.side * this.side)
  }
  private index(v: number): number {
    return Math.min(this.side - 2, Math.max(1, Math.floor((v + this.r) / this.cell) + 1))
  }
  clear(b: Box): boolean {
    const i0 = this.index(b.x)
    const j0 = this.index(b.y)
    for (let i = i0 - 1; i <= i0 + 1; i++) {
      for (let j = j0 - 1; j <= j0 + 1; j++) {
        const list = this.cells[i * this.side + j]
        if (list) for (const o of list) if (boxesOverlap(o, b, this.eps)) return false
      }
    }
    return true
  }
  add(b: Box): void {
    this.boxes.push(b)
    const k = this.index(b.x) * this.side + this.index(b.y)
    const list = this.cells[k]
    if (list) list.push(b)
    else this.cells[k] = [b]
  }
}

/**
 * Rows across the tube in one direction (`theta`, radians): a row as deep as
 * the block's short side holds blocks lying along it, one as deep as its long
 * side holds blocks standing across it. Each row holds as many blocks as fit
 * each free stretch of its chord (the circle at the row's outer edge, less
 * what the discs take from it), centred in the stretch. The rows' depths and
 * the gaps between them are chosen by dynamic programming over a fine ladder
 * of heights (a sixteenth of the short side, also at half-block steps from the
 * centre), so the best row stack on that ladder is found.
 */
function rowLayout(r: number, discs: readonly Disc[], long: number, short: number, theta: number, eps: number): Box[] {
  const c = Math.cos(theta)
  const s = Math.sin(theta)
  const local = discs.map((d) => ({ x: c * d.x + s * d.y, y: -s * d.x + c * d.y, r: d.r }))
  const step = short / 16
  const ys: number[] = []
  for (const phase of [0, short / 2, long / 2]) {
    const p = phase % step
    for (let k = Math.ceil((-r - p) / step - 1e-9); p + k * step <= r - short + eps; k++) ys.push(p + k * step)
  }
  ys.sort((a, b) => a - b)
  const y: number[] = []
  for (const v of ys) if (y.length === 0 || v - y[y.length - 1]! > eps) y.push(v)
  const n = y.length
  const next = (v: number): number => {
    let lo = 0
    let hi = n
    while (lo < hi) {
      const mid = (lo + hi) >> 1
      if (y[mid]! < v - eps) lo = mid + 1
      else hi = mid
    }
    return lo
  }
  const rows = long === short ? [{ depth: short, width: long, turn: 0 }] : [{ depth: short, width: long, turn: 0 }, { depth: long, width: short, turn: Math.PI / 2 }]
  // Free stretches of the row [y0, y0 + depth]: the chord at its outer edge less what the discs take; each holds blocks of `width`.
  const lo = new Float64Array(local.length)
  const hi = new Float64Array(local.length)
  const stretches = (y0: number, depth: number, width: number, visit?: (from: number, to: number, k: number) => void): number => {
    const m = Math.max(Math.abs(y0), Math.abs(y0 + depth))
    if (m >= r) return 0
    const half = Math.sqrt(r * r - m * m)
    let nb = 0
    for (const d of local) {
      const gap = Math.max(y0 - d.y, d.y - (y0 + depth), 0)
      if (gap >= d.r - eps) continue
      const w = Math.sqrt(d.r * d.r - gap * gap)
      // Insertion by left end: a handful of discs.
      let at = nb++
      while (at > 0 && lo[at - 1]! > d.x - w) {
        lo[at] = lo[at - 1]!
        hi[at] = hi[at - 1]!
        at--
      }
      lo[at] = d.x - w
      hi[at] = d.x + w
    }
    let total = 0
    let from = -half
    const take = (to: number) => {
      const k = Math.floor((to - from + eps) / width)
      if (k > 0) {
        total += k
        visit?.(from, to, k)
      }
    }
    for (let q = 0; q < nb && from < half; q++) {
      if (lo[q]! > from) take(Math.min(lo[q]!, half))
      from = Math.max(from, hi[q]!)
    }
    if (from < half) take(half)
    return total
  }
  const count = stretches
  const best = new Array<number>(n + 1).fill(0)
  const choice = new Array<number>(n).fill(-1)
  for (let i = n - 1; i >= 0; i--) {
    best[i] = best[i + 1]!
    rows.forEach((row, ri) => {
      const k = count(y[i]!, row.depth, row.width)
      if (k === 0) return
      const v = k + best[next(y[i]! + row.depth)]!
      if (v > best[i]!) {
        best[i] = v
        choice[i] = ri
      }
    })
  }
  const boxes: Box[] = []
  let i = 0
  while (i < n) {
    const ri = choice[i]!
    if (ri < 0) {
      i++
      continue
    }
    const row = rows[ri]!
    const y0 = y[i]!
    stretches(y0, row.depth, row.width, (from, to, k) => {
      const start = (from + to) / 2 - (k * row.width) / 2
      for (let j = 0; j < k; j++) {
        const lx = start + (j + 0.5) * row.width
        const ly = y0 + row.depth / 2
        boxes.push(turned(c * lx - s * ly, s * lx + c * ly, theta + row.turn, long / 2, short / 2))
      }
    })
    i = next(y0 + row.depth)
  }
  return boxes
}

/**
 * Bottom-left greedy in one direction (`theta`, radians), blocks square to it:
 * up a ladder of heights (a sixteenth of the short side), each block goes at
 * the leftmost place along the row where it fits, lying or standing,
 * whichever starts further left. Places are exact along the row (the chord,
 * the discs and the blocks already placed bound them), so blocks may stand
 * staggered where row stacks cannot.
 */
function bottomLeft(r: number, discs: readonly Disc[], long: number, short: number, theta: number, eps: number): Box[] {
  const c = Math.cos(theta)
  const s = Math.sin(theta)
  const local = discs.map((d) => ({ x: c * d.x + s * d.y, y: -s * d.x + c * d.y, r: d.r }))
  const shapes = long === short ? [{ w: long, h: short, turn: 0 }] : [{ w: long, h: short, turn: 0 }, { w: short, h: long, turn: Math.PI / 2 }]
  const placed: { x0: number; x1: number; y0: number; y1: number }[] = []
  const out: Box[] = []
  const blocked: [number, number][] = []
  // Least x >= from where a w x h block at [y, y + h] fits, or null.
  const leftmost = (y: number, w: number, h: number, from: number): number | null => {
    const m = Math.max(Math.abs(y), Math.abs(y + h))
    if (m >= r) return null
    const half = Math.sqrt(r * r - m * m)
    blocked.length = 0
    for (const d of local) {
      const gap = Math.max(y - d.y, d.y - (y + h), 0)
      if (gap >= d.r - eps) continue
      const ww = Math.sqrt(d.r * d.r - gap * gap)
      blocked.push([d.x - ww - w + eps, d.x + ww - eps])
    }
    for (const p of placed) if (p.y0 < y + h - eps && p.y1 > y + eps) blocked.push([p.x0 - w + eps, p.x1 - eps])
    blocked.sort((a, b) => a[0] - b[0])
    let x = Math.max(from, -half)
    for (const [a, b] of blocked) if (a < x && x < b) x = b
    return x <= half - w + eps ? x : null
  }
  const step = short / 16
  // y: the lower edge of a lying block; a standing one is centred on the same line.
  for (let y = -r - long; y <= r; y += step) {
    let from = -Infinity
    for (;;) {
      let best: { x: number; w: number; h: number; turn: number } | null = null
      for (const shape of shapes) {
        const x = leftmost(y + (short - shape.h) / 2, shape.w, shape.h, from)
        if (x !== null && (best === null || x < best.x - eps)) best = { x, ...shape }
      }
      if (best === null) break
      const y0 = y + (short - best.h) / 2
      placed.push({ x0: best.x, x1: best.x + best.w, y0, y1: y0 + best.h })
      const lx = best.x + best.w / 2
      const ly = y0 + best.h / 2
      out.push(turned(c * lx - s * ly, s * lx + c * ly, theta + best.turn, long / 2, short / 2))
      from = best.x
    }
  }
  return out
}

/** Footprints on a fine grid, each turn tried, that lie inside the tube clear of the discs: centres, cosines, sines and distances from the centre. */
interface Candidates {
  x: Float64Array
  y: Float64Array
  c: Float64Array
  s: Float64Array
  d: Float64Array
  /** Grid position of each (row-major over 2k + 1 by 2k + 1 points `step` apart). */
  pos: Int32Array
  k: number
  step: number
  n: number
}

function candidates(r: number, discs: readonly Disc[], long: number, short: number, eps: number): Candidates {
  const turns = long === short ? 6 : 12
  const span = long === short ? Math.PI / 2 : Math.PI
  // At most about 60,000 footprints to try: a big tube with oblong blocks gets a coarser grid.
  const k = Math.min(Math.floor(r / Math.max(short / 16, r / 64)), Math.floor(Math.sqrt(60000 / turns) / 2))
  const step = r / k
  const size = (2 * k + 1) * (2 * k + 1) * turns
  const out: Candidates = { x: new Float64Array(size), y: new Float64Array(size), c: new Float64Array(size), s: new Float64Array(size), d: new Float64Array(size), pos: new Int32Array(size), k, step, n: 0 }
  const trig = Array.from({ length: turns }, (_, t) => [Math.cos((t * span) / turns), Math.sin((t * span) / turns)] as const)
  const probe: Box = { x: 0, y: 0, c: 1, s: 0, hw: long / 2, hh: short / 2 }
  for (let i = -k; i <= k; i++) {
    for (let j = -k; j <= k; j++) {
      probe.x = j * step
      probe.y = i * step
      const d = Math.hypot(probe.x, probe.y)
      // The block holds the circle of half its short side round its centre: where that circle leaves the tube or meets a disc, no turn fits.
      if (d + short / 2 > r + eps) continue
      if (discs.some((q) => Math.hypot(q.x - probe.x, q.y - probe.y) < q.r + short / 2 - eps)) continue
      for (const [c, s] of trig) {
        probe.c = c
        probe.s = s
        if (!staticFits(probe, r, discs, eps)) continue
        const m = out.n++
        out.x[m] = probe.x
        out.y[m] = probe.y
        out.c[m] = c
        out.s[m] = s
        out.d[m] = d
        out.pos[m] = (i + k) * (2 * k + 1) + (j + k)
      }
    }
  }
  return out
}

/** Adds, in the given order of candidates, every footprint that overlaps none placed so far. */
function fill(r: number, start: readonly Box[], cands: Candidates, order: Int32Array, long: number, short: number, eps: number): Box[] {
  const placed = new Placed(r, Math.hypot(long, short), eps)
  for (const b of start) placed.add(b)
  const probe: Box = { x: 0, y: 0, c: 1, s: 0, hw: long / 2, hh: short / 2 }
  // Grid positions nearer a placed block than half the short side: the circle every footprint there
  // holds round its centre would reach into that block, so none fits, at any turn.
  const { k, step } = cands
  const side = 2 * k + 1
  const dead = new Uint8Array(side * side)
  const near = short / 2 - eps
  const bury = (b: Box) => {
    const reach = Math.hypot(b.hw, b.hh) + near
    const i0 = Math.max(-k, Math.ceil((b.y - reach) / step))
    const i1 = Math.min(k, Math.floor((b.y + reach) / step))
    const j0 = Math.max(-k, Math.ceil((b.x - reach) / step))
    const j1 = Math.min(k, Math.floor((b.x + reach) / step))
    for (let i = i0; i <= i1; i++) {
      for (let j = j0; j <= j1; j++) {
        const dx = j * step - b.x
        const dy = i * step - b.y
        const qx = Math.max(Math.abs(b.c * dx + b.s * dy) - b.hw, 0)
        const qy = Math.max(Math.abs(-b.s * dx + b.c * dy) - b.hh, 0)
        if (qx * qx + qy * qy < near * near) dead[(i + k) * side + (j + k)] = 1
      }
    }
  }
  for (const b of start) bury(b)
  for (const m of order) {
    if (dead[cands.pos[m]!]) continue
    probe.x = cands.x[m]!
    probe.y = cands.y[m]!
    probe.c = cands.c[m]!
    probe.s = cands.s[m]!
    if (placed.clear(probe)) {
      const b = { ...probe }
      placed.add(b)
      bury(b)
    }
  }
  return placed.boxes
}

/** Layouts of one layer, kept per tube, discs and block so the figures can ask again cheaply. */
const LAYER_CACHE = new Map<string, Box[]>()
const LAYER_CACHE_SIZE = 32
/** Above this many blocks a layer (by area) only row stacks are tried. */
const MANY = 400

/**
 * One layer of blocks lying flat (largest face down) inside the tube's inside
 * wall, clear of the pans (which rise into the tube) and of the access
 * openings (which must stay open to reach the pan screws). Free placement
 * with turns, keeping the layout that holds most:
 *  - row stacks (rowLayout) in directions every 3 degrees (6 for oblong
 *    blocks), the best then topped up with single blocks at any turn;
 *  - greedy placement from empty over a fine grid of positions and turns (a
 *    sixteenth of the short side, at most a sixty-fourth of the tube's
 *    radius, at most about 60,000 footprints; turns of 15 degrees), tried
 *    wall first, centre first and row by row (the wall-first order finds
 *    the gaps between pans at the rim);
 *  - bottom-left greedy placement square to directions every 15 degrees,
 *    exact along each row (bottomLeft).
 * Ties go to the layout nearest the centre. Blocks so small that more than
 * MANY would cover the tube's area get row stacks every 15 degrees only.
 */
function layerLayout(r: number, discs: readonly Disc[], long: number, short: number): Box[] {
  const key = [r, long, short, ...discs.flatMap((d) => [d.x, d.y, d.r])].join(' ')
  const hit = LAYER_CACHE.get(key)
  if (hit) return hit
  const eps = 1e-7 * Math.max(r, long)
  let best: Box[] = []
  let bestSpread = Infinity
  const consider = (boxes: Box[]) => {
    const spread = boxes.reduce((t, b) => t + b.x * b.x + b.y * b.y, 0)
    if (boxes.length > best.length || (boxes.length === best.length && spread < bestSpread - eps)) {
      best = boxes
      bestSpread = spread
    }
  }
  // Blocks small beside the tube (more than MANY a layer by area): rows in a few directions are close
  // to the best, and the finer search would cost far more than the figures need (at most 500 blocks).
  const many = (Math.PI * r * r) / (long * short) > MANY
  if (many) {
    for (let a = 0; a < 90; a += 15) consider(rowLayout(r, discs, long, short, (a * Math.PI) / 180, eps))
  } else if (r >= Math.hypot(long, short) / 2 - eps) {
    const span = long === short ? 90 : 180
    const stepDeg = long === short ? 3 : 6
    const rowed: Box[][] = []
    for (let a = 0; a < span; a += stepDeg) rowed.push(rowLayout(r, discs, long, short, (a * Math.PI) / 180, eps))
    rowed.sort((p, q) => q.length - p.length)
    const cands = candidates(r, discs, long, short, eps)
    // Candidates come row by row (y, then x); sorted once more by distance from the centre.
    const rowByRow = Int32Array.from({ length: cands.n }, (_, m) => m)
    const centreFirst = Int32Array.from(Array.from(rowByRow).sort((p, q) => cands.d[p]! - cands.d[q]! || p - q))
    const wallFirst = centreFirst.slice().reverse()
    for (const rows of rowed) consider(rows)
    consider(fill(r, rowed[0]!, cands, wallFirst, long, short, eps))
    for (const order of [wallFirst, centreFirst, rowByRow]) consider(fill(r, [], cands, order, long, short, eps))
    for (let a = 0; a < span; a += 15) consider(bottomLeft(r, discs, long, short, (a * Math.PI) / 180, eps))
  }
  if (LAYER_CACHE.size >= LAYER_CACHE_SIZE) LAYER_CACHE.delete(LAYER_CACHE.keys().next().value!)
  LAYER_CACHE.set(key, best)
  return best
}

/**
 * Lays blocks flat (largest face down) on the plate's top face inside the
 * tube, clear of the pans and the access openings: as many a layer as the
 * free placement in layerLayout finds, each layer on the same spots, the
 * spots nearest the centre filled first. Not a proven optimum packing: a
 * careful shop may fit more, never fewer than the layout says (every spot is
 * checked against the tube, the discs and the other blocks).
 */
export function layoutBlocks(plate: Pick<Plate, 'trunk' | 'rabbets' | 'holes'>, block: BlockSize, count: number, maxLayers: number): BlockLayout {
  const sizes = [block.length, block.width, block.thickness].sort((p, q) => q - p)
  const [long, mid, thick] = sizes as [number, number, number]
  const inner = plate.trunk.innerDiameter / 2
  const discs: Disc[] = [
    ...plate.rabbets.map((r) => ({ x: r.x, y: r.y, r: r.diameter / 2 })),
    ...plate.holes.filter((h) => h.kind === 'access').map((h) => ({ x: h.x, y: h.y, r: h.diameter / 2 })),
  ]
  const layer = [...layerLayout(inner, discs, long, mid)]
  layer.sort((a, b) => Math.hypot(a.x, a.y) - Math.hypot(b.x, b.y) || a.y - b.y || a.x - b.x)
  const perLayer = layer.length
  const capacity = perLayer * maxLayers
  const placed = Math.min(count, capacity)
  const spots: BlockSpot[] = []
  let sumX = 0
  let sumY = 0
  let sumZ = 0
  for (let k = 0; k < placed; k++) {
    const b = layer[k % perLayer]!
    const level = Math.floor(k / perLayer)
    let angle = (Math.atan2(b.s, b.c) * 180) / Math.PI
    if (angle < 0) angle += 180
    if (angle >= 180) angle -= 180
    spots.push({ x: b.x, y: b.y, angle, layer: level, corners: boxCorners(b) })
    sumX += b.x
    sumY += b.y
    sumZ += (level + 0.5) * thick
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

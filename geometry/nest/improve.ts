// The improvement phase: after the first (largest first) layout, keep trying
// other placement orders and turns within a budget, and report each better
// layout as it is found. Better means fewer sheets, then a shorter last sheet
// (the far edge of its parts from the sheet's lower edge): on one long sheet,
// a shorter strip.
//
// Two phases, each layout placed by nest.ts's own bottom-left step (so the
// no-fit polygons it caches serve every try):
//  1. multi-start: a few fixed orders (longest side, bounding box, shortest
//     side, perimeter first; largest first with every part at one turn, for
//     each turn, and with copies half a turn apart by turns), the best kept;
//  2. a local search on the order from the best: late-acceptance hill
//     climbing (Burke & Bykov, "The late acceptance hill-climbing heuristic",
//     EJOR 258, 2017) over three moves as in the order-based searches of
//     Gomes & Oliveira (EJOR 141, 2002) and Burke et al. (Operations
//     Research 54, 2006): swap two parts near each other in the order, move
//     one part to another place, fix (or free) one part's turn, and move one
//     of the parts that reach furthest earlier in the order. A try keeps
//     the layout's start up to the first changed step (replayed unsearched),
//     so it only searches the rest again.
// Deterministic for a given seed and layout budget (geometry/math/prng.ts); a
// time budget only cuts the search short. Anytime: a generator that yields
// after every part placed (so one step is one placement's work), with the
// fraction of the budget used and, when a step completes a better layout,
// that layout. Stop it by not asking for more.

import { mulberry32, type Random } from '../math/prng'
import { bounds, perimeter, signedArea } from '../math/polygon'
import { nestSteps, type NestOptions, type NestPartInput, type NestResult, type NestSheetInput, type NestStep, type Nesting } from './nest'

export interface ImproveOptions extends Pick<NestOptions, 'turns' | 'grain'> {
  /** Seed of the search's random choices. Default 1. */
  seed?: number
  /** Stop once this many milliseconds have passed (checked after every part placed). */
  timeBudget?: number
  /** Stop once this many layouts have been tried, the first included. Default 200 without a time budget, else no limit. */
  layouts?: number
  /** The clock, ms (default Date.now). */
  now?: () => number
}

/** How good a layout is: fewer sheets first, then a shorter last sheet. */
export interface LayoutScore {
  sheets: number
  /** The last sheet's parts' far edge along y from the sheet's lower edge, mm. */
  length: number
}

export interface ImprovedLayout {
  result: NestResult
  score: LayoutScore
  /** Which layout tried this was (1 = the first, largest first). */
  tried: number
}

export interface ImproveProgress {
  /** Fraction of the budget used, 0-1. */
  progress: number
  /** Layouts tried so far. */
  tried: number
  /** Set when this step completed a layout better than every one before (the first layout included). */
  better?: ImprovedLayout
}

export function scoreLayout(result: NestResult): LayoutScore {
  const last = result.sheets[result.sheets.length - 1]
  let length = 0
  for (const p of last?.parts ?? []) for (const q of p.outline) length = Math.max(length, q[1])
  return { sheets: result.sheets.length, length }
}

/** Strictly better, with a hair of tolerance so rounding never counts as progress. */
export function betterScore(a: LayoutScore, b: LayoutScore): boolean {
  return a.sheets < b.sheets || (a.sheets === b.sheets && a.length < b.length - 1e-9)
}

/** Late-acceptance list length: how many tries back a worse layout is still compared with. */
const HISTORY = 12

interface Candidate {
  /** The order as searched: a turn only where a move fixed one. */
  order: NestStep[]
  nesting: Nesting
  score: LayoutScore
}

/** The turns a move may fix: the ones every part allows (nest.ts's defaults, or those given). */
function fixableTurns(options: ImproveOptions): number[] {
  const set = new Set<number>()
  for (const t of options.turns ?? [0, 90, 180, 270]) {
    const d = Math.round((((t % 360) + 360) % 360) * 1e6) / 1e6
    if (!options.grain || d === 0 || d === 180) set.add(d)
  }
  if (set.size === 0) set.add(0)
  return [...set].sort((a, b) => a - b)
}

/**
 * The fixed starts: each part's copies together, by one measure each, largest
 * first; then largest first with every copy at one turn, for each turn.
 */
function startOrders(parts: NestPartInput[], turns: number[]): NestStep[][] {
  const info = parts.map((p, i) => {
    const b = bounds(p.outline)
    const w = b.maxX - b.minX
    const h = b.maxY - b.minY
    return { i, long: Math.max(w, h), short: Math.min(w, h), box: w * h, perimeter: perimeter(p.outline), area: Math.abs(signedArea(p.outline)) }
  })
  const keys: ((x: (typeof info)[number]) => number)[] = [(x) => x.long, (x) => x.box, (x) => x.short, (x) => x.perimeter]
  const seen = new Set<string>()
  const orders: NestStep[][] = []
  for (const key of keys) {
    const sorted = [...info].sort((a, b) => key(b) - key(a) || b.area - a.area || a.i - b.i)
    const sig = sorted.map((x) => x.i).join(',')
    if (seen.has(sig)) continue
    seen.add(sig)
    orders.push(sorted.flatMap((x) => Array.from({ length: parts[x.i]!.count }, () => ({ part: x.i }))))
  }
  const byArea = [...info].sort((a, b) => b.area - a.area || a.i - b.i)
  for (const turn of turns.length > 1 ? turns : []) {
    orders.push(byArea.flatMap((x) => Array.from({ length: parts[x.i]!.count }, () => ({ part: x.i, turn }))))
  }
  // Copies turned half a turn from each other by turns, so they can interlock.
  for (const turn of turns.filter((t) => t < 180 && turns.includes(t + 180))) {
    orders.push(byArea.flatMap((x) => Array.from({ length: parts[x.i]!.count }, (_, k) => ({ part: x.i, turn: k % 2 ? turn + 180 : turn }))))
  }
  return orders
}

/**
 * A move on the order: the new order and the first step it changes (steps
 * before it are the same, so their placements can be replayed).
 */
function move(order: NestStep[], random: Random, turns: number[], tops: number[]): { order: NestStep[]; from: number } | null {
  const n = order.length
  if (n < 2 && turns.length < 2) return null
  const next = order.map((s) => ({ ...s }))
  const window = Math.max(3, Math.ceil(n / 5))
  const near = (i: number) => Math.min(n - 1, Math.max(0, i + Math.round((random() * 2 - 1) * window)))
  const r = random()
  // Half the moves start late in the order: later parts sit high, and a try replays all before its first change.
  const i = Math.floor((random() < 0.5 ? Math.sqrt(random()) : random()) * n)
  if (r < 0.2 && n >= 2) {
    // One of the three parts reaching furthest on the last sheet goes earlier, into room lower down.
    const high = tops.map((t, k) => [t, k] as const).sort((a, b) => b[0] - a[0] || a[1] - b[1]).slice(0, 3)
    const k = high[Math.floor(random() * high.length)]![1]
    if (k === 0) return null
    const j = Math.floor(random() * k)
    const [s] = next.splice(k, 1)
    next.splice(j, 0, s!)
    return { order: next, from: j }
  }
  if (r < 0.55 && n >= 2) {
    const j = near(i)
    if (next[i]!.part === next[j]!.part && next[i]!.turn === next[j]!.turn) return null
    ;[next[i], next[j]] = [next[j]!, next[i]!]
    return { order: next, from: Math.min(i, j) }
  }
  if (r < 0.8 && n >= 2) {
    const j = near(i)
    if (j === i) return null
    const [s] = next.splice(i, 1)
    next.splice(j, 0, s!)
    return { order: next, from: Math.min(i, j) }
  }
  // Fix a turn, or (one time in turns + 1) let the step choose its best turn again.
  const k = Math.floor(random() * (turns.length + 1))
  const turn = k < turns.length ? turns[k] : undefined
  if (next[i]!.turn === turn) return null
  next[i]!.turn = turn
  return { order: next, from: i }
}

/**
 * The search as steps (see the top of this file). Its first report carries the
 * first layout; its return value is the best layout found. Throws as nestParts
 * does for bad input or a part too large.
 */
export function* improveSteps(parts: NestPartInput[], sheet: NestSheetInput, options: ImproveOptions = {}): Generator<ImproveProgress, ImprovedLayout> {
  const now = options.now ?? Date.now
  const started = now()
  const limit = options.layouts ?? (options.timeBudget === undefined ? 200 : Infinity)
  const random = mulberry32(options.seed ?? 1)
  const nestOptions: NestOptions = { turns: options.turns, grain: options.grain }
  const turns = fixableTurns(options)
  const total = parts.reduce((s, p) => s + p.count, 0)
  let tried = 0
  const used = (placed: number) =>
    Math.min(1, Math.max((tried + placed / Math.max(1, total)) / limit, options.timeBudget === undefined ? 0 : (now() - started) / options.timeBudget))
  const spent = () => tried >= limit || (options.timeBudget !== undefined && now() - started >= options.timeBudget)

  let best: ImprovedLayout | null = null
  let bestCandidate: Candidate | null = null

  // The far edge (along y) of each part at each turn, from its own origin: a try's score so far.
  const tops = new Map<string, number>()
  const topOf = (part: number, turn: number) => {
    const key = `${part}|${turn}`
    let top = tops.get(key)
    if (top === undefined) {
      const t = (turn * Math.PI) / 180
      const [c, s] = turn % 90 === 0 ? [Math.round(Math.cos(t)), Math.round(Math.sin(t))] : [Math.cos(t), Math.sin(t)]
      top = Math.max(...parts[part]!.outline.map(([x, y]) => x * s + y * c))
      tops.set(key, top)
    }
    return top
  }
  const cost = (s: LayoutScore) => s.sheets * (sheet.height + 1) + s.length
  /** Per step of a layout, its part's far edge when on the last sheet (else -Infinity). */
  const topsOf = (c: Candidate) => {
    const last = c.score.sheets - 1
    return c.nesting.steps.map((st) => (st.sheet === last ? st.at![1] + topOf(st.part, st.turn!) : -Infinity))
  }

  /**
   * Place one order. A layout's score only grows as parts are placed (a new
   * sheet, or the last one longer), so a try is given up as soon as it is
   * worse than `bound`: 'worse'. null when the budget ran out part way (the
   * first layout is always finished).
   */
  function* tryOrder(
    order: NestStep[] | undefined,
    bound = Infinity,
    replay?: { steps: NestStep[]; upTo: number },
  ): Generator<ImproveProgress, Candidate | 'worse' | null> {
    const given = order && replay ? order.map((s, k) => (k < replay.upTo ? replay.steps[k]! : s)) : order
    const sofar: LayoutScore = { sheets: 0, length: 0 }
    const steps = nestSteps(parts, sheet, {
      ...nestOptions,
      order: given,
      onProgress(_placed, _total, step) {
        const top = step.at![1] + topOf(step.part, step.turn!)
        if (step.sheet! + 1 > sofar.sheets) {
          sofar.sheets = step.sheet! + 1
          sofar.length = top
        } else if (step.sheet! + 1 === sofar.sheets) sofar.length = Math.max(sofar.length, top)
      },
    })
    let placed = 0
    for (;;) {
      const r = steps.next()
      if (r.done) {
        tried++
        const nesting = r.value
        const score = scoreLayout(nesting.result)
        const candidate: Candidate = { order: order ?? nesting.steps.map((s) => ({ part: s.part })), nesting, score }
        if (!best || betterScore(score, best.score)) {
          best = { result: nesting.result, score, tried }
          bestCandidate = candidate
          yield { progress: used(0), tried, better: best }
        }
        return candidate
      }
      placed++
      if (cost(sofar) > bound + 1e-9) {
        steps.return(undefined as never)
        tried++
        return 'worse'
      }
      if (best && spent()) {
        steps.return(undefined as never)
        return null
      }
      yield { progress: used(placed), tried }
    }
  }

  // The first layout, largest first: always finished, whatever the budget.
  yield* tryOrder(undefined)
  if (total === 0) return best!

  // 1. Multi-start: only a better layout matters here.
  for (const order of startOrders(parts, turns)) {
    if (spent()) return best!
    const c = yield* tryOrder(order, cost(best!.score))
    if (!c) return best!
  }

  // 2. Late-acceptance hill climbing on the order, from the best so far.
  let current: Candidate = bestCandidate!
  const history: number[] = Array(HISTORY).fill(cost(current.score))
  const patience = Math.max(60, 2 * total)
  let sinceBest = 0
  let step = 0
  let idle = 0
  while (!spent()) {
    const m = move(current.order, random, turns, topsOf(current))
    if (!m) {
      // One part with one turn has no other order to try.
      if (++idle > 1000) break
      continue
    }
    idle = 0
    const bestBefore = best!.score
    const v = step++ % HISTORY
    const bound = Math.max(cost(current.score), history[v]!)
    const c = yield* tryOrder(m.order, bound, { steps: current.nesting.steps, upTo: m.from })
    if (!c) break
    // Accepted when no worse than the current layout or the one HISTORY tries back.
    if (c !== 'worse' && cost(c.score) <= bound + 1e-9) current = c
    history[v] = cost(current.score)
    sinceBest = betterScore(best!.score, bestBefore) ? 0 : sinceBest + 1
    // Stuck: start again from the best.
    if (sinceBest >= patience) {
      current = bestCandidate!
      history.fill(cost(current.score))
      sinceBest = 0
    }
  }
  return best!
}

/**
 * improveSteps run to the end: the best layout found within the budget.
 * `onBetter` hears of each better layout as it is found (the first included).
 */
export function improveNesting(
  parts: NestPartInput[],
  sheet: NestSheetInput,
  options: ImproveOptions & { onBetter?: (layout: ImprovedLayout, progress: number) => void } = {},
): ImprovedLayout {
  const steps = improveSteps(parts, sheet, options)
  for (;;) {
    const r = steps.next()
    if (r.done) return r.value
    if (r.value.better) options.onBetter?.(r.value.better, r.value.progress)
  }
}

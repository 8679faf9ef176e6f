// Roots (lobes) one by one: their figures as the shop reads them, typed
// values for a single root, and keeping roots pulled by hand where they are
// when the lobe count changes.
//
// A root pulled by hand is stored as an override of lobe `index`, its angle
// as an offset from that lobe's evenly spaced place. The evenly spaced places
// move whenever the count changes, so the count change re-homes each pulled
// root on the lobe whose new place is nearest to where the root stands, with
// its angle, reach and width pinned: the root stays put, the others spread.

import type { LobeOverride, PlateParams } from './params'
import type { LobeTip } from './types'
import { lobeTipsOf, plateOutlineShape } from './plate'

const DEG = Math.PI / 180

/** Degrees folded into (-180, 180]. */
export function foldDegrees(a: number): number {
  const r = ((((a + 180) % 360) + 360) % 360) - 180
  return r === -180 ? 180 : r
}

const round1 = (v: number) => Math.round(v * 10) / 10

export interface RootFigures {
  index: number
  /** Degrees counter-clockwise from +x, 0 to 360. */
  angle: number
  /** Degrees counter-clockwise from the clocking axis (the first caster and the index holes), 0 to 360. */
  fromAxis: number
  /** mm beyond the valley line. */
  reach: number
  /** mm where it leaves the valley line (an arc length). */
  width: number
  /** Centre of the plate to the tip, mm. */
  tipRadius: number
  /** Changed by hand (a drag or a typed value). */
  pulled: boolean
}

/** The evenly spaced place of lobe `index` among `count`, degrees from +x. */
export function nominalAngle(params: PlateParams, index: number, count = params.lobes.count): number {
  return params.rotation + params.lobes.phase + (index * 360) / Math.max(count, 1)
}

/**
 * Each lobe's figures as built (irregularity and overrides applied). `tips`
 * are the lobe tips of a plate already built from `params` (or of a drag's
 * preview), which saves building the outline again.
 */
export function rootFigures(params: PlateParams, tips: readonly LobeTip[] = lobeTipsOf(plateOutlineShape(params))): RootFigures[] {
  return tips.map(t => ({
    index: t.index,
    angle: t.angle,
    fromAxis: (((t.angle - params.rotation) % 360) + 360) % 360,
    reach: t.reach,
    width: t.width,
    tipRadius: t.radius,
    pulled: params.lobes.overrides.some(o => o.index === t.index),
  }))
}

/** Roots pulled by hand that have no lobe at the present count (they are kept, and saving is refused, until the count is raised or they are dropped). */
export function strandedRoots(params: PlateParams): LobeOverride[] {
  return params.lobes.overrides.filter(o => o.index >= params.lobes.count)
}

/**
 * Sets the lobe count on `draft`, re-homing every pulled root by its angle
 * (see the top of this file). With fewer lobes than pulled roots, the roots
 * left over keep their figures on indices past the count: `strandedRoots`
 * names them, and raising the count again puts them back where they stood.
 */
export function setLobeCount(draft: PlateParams, count: number): void {
  const overrides = draft.lobes.overrides
  if (!overrides.length || count === draft.lobes.count) {
    draft.lobes.count = count
    return
  }
  const built = new Map(plateOutlineShape(draft).lobes.map(l => [l.index, l]))
  const roots = overrides.map((o) => {
    const lobe = built.get(o.index)
    return {
      o,
      angle: lobe ? lobe.angle / DEG : nominalAngle(draft, o.index) + (o.angle ?? 0),
      reach: o.reach ?? lobe?.reach,
      width: o.width ?? lobe?.width,
    }
  })
  const pairs: { root: number; lobe: number; distance: number }[] = []
  roots.forEach((r, i) => {
    for (let k = 0; k < count; k++) pairs.push({ root: i, lobe: k, distance: Math.abs(foldDegrees(r.angle - nominalAngle(draft, k, count))) })
  })
  pairs.sort((a, b) => a.distance - b.distance || a.root - b.root)
  const home = new Map<number, number>()
  const taken = new Set<number>()
  for (const p of pairs) {
    if (home.has(p.root) || taken.has(p.lobe)) continue
    home.set(p.root, p.lobe)
    taken.add(p.lobe)
  }
  let spare = count
  draft.lobes.overrides = roots.map((r, i) => {
    const index = home.get(i) ?? spare++
    const next: LobeOverride = { index, angle: round1(foldDegrees(r.angle - nominalAngle(draft, index, count))) }
    if (r.reach !== undefined) next.reach = round1(r.reach)
    if (r.width !== undefined) next.width = round1(r.width)
    return next
  }).sort((a, b) => a.index - b.index)
  draft.lobes.count = count
}

export interface RootValues {
  /** mm beyond the valley line. */
  reach?: number
  /** mm at the valley line. */
  width?: number
  /** Degrees counter-clockwise from the clocking axis. */
  fromAxis?: number
}

/** Types values for one root: only the figures given change, and only for that root. */
export function setRoot(draft: PlateParams, index: number, values: RootValues): void {
  let o = draft.lobes.overrides.find(v => v.index === index)
  if (!o) {
    o = { index }
    draft.lobes.overrides.push(o)
    draft.lobes.overrides.sort((a, b) => a.index - b.index)
  }
  if (values.reach !== undefined) o.reach = round1(Math.min(Math.max(values.reach, 0), 900))
  if (values.width !== undefined) o.width = round1(Math.min(Math.max(values.width, 10), 1200))
  if (values.fromAxis !== undefined) o.angle = round1(foldDegrees(values.fromAxis + draft.rotation - nominalAngle(draft, index)))
}

/** Puts one root back to the shape the plate gives it; the other roots keep theirs. */
export function dropRoot(draft: PlateParams, index: number): void {
  draft.lobes.overrides = draft.lobes.overrides.filter(o => o.index !== index)
}

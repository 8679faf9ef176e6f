// Roots one by one (geometry/roots.ts), the drag preview (geometry/preview.ts)
// and the first nudge of a lobe tip (utils/plate-handles.ts).
//
// Hand values: on a plate with no irregularity, lobe k of n stands at
// rotation + phase + k * 360 / n degrees, and its tip at tube / 2 + valley +
// reach from the centre where no other lobe or hole clearance reaches it
// (the construction documented at the top of geometry/outline/shape.ts).
// Angles are plane trigonometry; nothing below is read from the code first.
import { describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema, type PlateParams } from '../../../geometry/core'
import { dropRoot, rootFigures, setLobeCount, setRoot, strandedRoots } from '../../../geometry/roots'
import { previewPlate } from '../../../geometry/preview'
import { moveLobeTip } from '../../../utils/plate-handles'
import { PRESETS } from '../../../geometry/presets'
import { plateOutlineShape } from '../../../geometry/plate'
import { sampleOutline } from '../../../geometry/outline/sample'

const DEG = Math.PI / 180
// Four even lobes on a 16 in tube (406.4 mm, 1 in = 25.4 mm), rotation 0: lobe k at k * 90 degrees,
// tips at 203.2 + 30 + 120 = 353.2 mm. Casters at 230 mm: the farthest pocket clearance
// (230 + 108/2 + 12.7 + 19.05 = 315.8 mm) stays well inside the tips.
const even = (): PlateParams => plateParamsSchema.parse({ tubeDiameter: 406.4, casterCount: 4, casterOffset: 230, rotation: 0, lobes: { count: 4, reach: 120, width: 160, roundness: 0.5, irregularity: 0, phase: 0, valley: 30 } })
const tipAt = (params: PlateParams, angleDeg: number) => buildPlate(params).lobeTips.find(t => Math.abs(((t.angle - angleDeg + 540) % 360) - 180) < 0.5)

describe('one root typed by hand', () => {
  it('sets the reach, width and angle of that root only', () => {
    const p = even()
    setRoot(p, 2, { reach: 254, fromAxis: 170 })
    const figures = rootFigures(p)
    // Root 3 now at 170 degrees (rotation 0), its tip 203.2 + 30 + 254 = 487.2 mm out.
    expect(figures[2]!.angle).toBeCloseTo(170, 6)
    expect(figures[2]!.tipRadius).toBeCloseTo(487.2, 1)
    expect(figures[2]!.pulled).toBe(true)
    // The others keep 0, 90 and 270 degrees and 353.2 mm.
    for (const [i, a] of [[0, 0], [1, 90], [3, 270]] as const) {
      expect(figures[i]!.angle).toBeCloseTo(a, 6)
      expect(figures[i]!.tipRadius).toBeCloseTo(353.2, 1)
      expect(figures[i]!.pulled).toBe(false)
    }
    dropRoot(p, 2)
    expect(p.lobes.overrides).toEqual([])
    expect(rootFigures(p)[2]!.tipRadius).toBeCloseTo(353.2, 1)
  })
})

describe('the lobe count and roots pulled by hand', () => {
  it('a pulled root keeps its place when the count goes down', () => {
    const p = even()
    setRoot(p, 2, { reach: 254 })
    setLobeCount(p, 3)
    // Three even places are 0, 120 and 240 degrees; the root stays at 180 degrees, 487.2 mm out.
    expect(p.lobes.count).toBe(3)
    const tip = tipAt(p, 180)
    expect(tip).toBeDefined()
    expect(tip!.radius).toBeCloseTo(487.2, 1)
    expect(strandedRoots(p)).toEqual([])
    expect(plateParamsSchema.safeParse(p).success).toBe(true)
  })

  it('a pulled root keeps its place when the count goes up, on an irregular plate', () => {
    const p = plateParamsSchema.parse({ tubeDiameter: 622.3, casterCount: 6, casterOffset: 242.5, access: { offset: 140, diameter: 101.6 }, lobes: { count: 10, reach: 230, width: 95, roundness: 0.2, irregularity: 0.6, seed: 4242, valley: 30 } })
    setRoot(p, 4, { reach: 300 })
    const before = buildPlate(p).lobeTips[4]!
    setLobeCount(p, 13)
    const after = buildPlate(p).lobeTips.find(t => Math.hypot(t.x - before.x, t.y - before.y) < 1)
    expect(after).toBeDefined()
  })

  it('more pulled roots than lobes: the extra root is kept and named, and comes back with the count', () => {
    const p = even()
    setRoot(p, 0, { reach: 200 })
    setRoot(p, 2, { reach: 254 })
    setLobeCount(p, 1)
    expect(p.lobes.overrides).toHaveLength(2)
    expect(strandedRoots(p)).toHaveLength(1)
    // Saving refuses it (a lobe that does not exist), so nothing is lost silently.
    expect(plateParamsSchema.safeParse(p).success).toBe(false)
    setLobeCount(p, 4)
    expect(strandedRoots(p)).toEqual([])
    // Both back where they stood: 0 degrees at 203.2 + 30 + 200 = 433.2 mm, 180 degrees at 487.2 mm.
    expect(tipAt(p, 0)!.radius).toBeCloseTo(433.2, 1)
    expect(tipAt(p, 180)!.radius).toBeCloseTo(487.2, 1)
  })
})

describe('the first nudge of a lobe tip', () => {
  it('moves the tip along the push, not sideways to its even place', () => {
    const p = plateParamsSchema.parse({ lobes: { count: 5, irregularity: 1, seed: 11 } })
    const plate = buildPlate(p)
    const tip = plate.lobeTips[3]!
    // One sixteenth of an inch (1.5875 mm) straight out along the tip's own direction.
    const step = 25.4 / 16
    const a = tip.angle * DEG
    moveLobeTip(p, plate, 3, { x: tip.x + step * Math.cos(a), y: tip.y + step * Math.sin(a) })
    const moved = buildPlate(p).lobeTips[3]!
    // The tip's angle holds to the 0.1 degree the override is rounded to; the distance grows by the step.
    expect(Math.abs(moved.angle - tip.angle)).toBeLessThan(0.11)
    expect(moved.radius - tip.radius).toBeCloseTo(step, 0)
  })
})

describe('the drag preview', () => {
  it('draws the same outline and tips as the whole plate, within its chord tolerance', () => {
    const base = buildPlate(even())
    const next = even()
    setRoot(next, 1, { reach: 200 })
    const preview = previewPlate(next, base)
    const whole = buildPlate(next)
    // Tips are the same radius function evaluated at the same angles.
    preview.lobeTips.forEach((t, i) => expect(Math.hypot(t.x - whole.lobeTips[i]!.x, t.y - whole.lobeTips[i]!.y)).toBeLessThan(1e-6))
    // Lobe 2 at 90 degrees now reaches 203.2 + 30 + 200 = 433.2 mm: the top of the bounds.
    expect(preview.metrics.bounds.maxY).toBeCloseTo(433.2, 0)
    for (const k of ['minX', 'minY', 'maxX', 'maxY'] as const) expect(Math.abs(preview.metrics.bounds[k] - whole.metrics.bounds[k])).toBeLessThan(0.5)
    // Only the lobes changed: the holes are the whole plate's own, not rebuilt.
    expect(preview.holes).toBe(base.holes)
    expect(preview.findings).toEqual([])
  })

  it('on the busy plate, samples afresh only the root being dragged and keeps the rest of the whole outline, within the tolerance of the curve', () => {
    const busy = plateParamsSchema.parse(PRESETS.find(p => p.id === 'banyan-sprawl')!.input)
    const base = buildPlate(busy)
    const tolerance = 2
    // A drag as the editor makes it: each move pulls the tip of root 2 from the preview before it.
    let params = structuredClone(busy)
    let preview = previewPlate(params, base, { tolerance })
    const start = base.lobeTips.find(t => t.index === 1)!
    for (let step = 1; step <= 12; step++) {
      const next = structuredClone(params)
      moveLobeTip(next, preview, 1, { x: start.x + 8 * step, y: start.y + 5 * step })
      params = next
      preview = previewPlate(params, base, { tolerance })
    }
    const whole = buildPlate(params)
    // Distances from each vertex of one polygon to the other's edges, by plain segment distance.
    const far = (from: [number, number][], to: [number, number][]) => Math.max(...from.map(([px, py]) => {
      let best = Infinity
      to.forEach(([ax, ay], i) => {
        const [bx, by] = to[(i + 1) % to.length]!
        const dx = bx - ax
        const dy = by - ay
        const u = Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy || 1)))
        best = Math.min(best, Math.hypot(px - ax - u * dx, py - ay - u * dy))
      })
      return best
    }))
    // The preview's points lie on the curve, which the whole plate's 0.1 mm chords follow: within 0.1 mm of them.
    expect(far(preview.outline, whole.outline)).toBeLessThan(0.1 + 1e-6)
    // The whole plate's points lie on the curve, which the preview's chords follow within its tolerance.
    expect(far(whole.outline, preview.outline)).toBeLessThan(tolerance + 1e-6)
    // Away from root 2 the points are those of the drag start's outline at the same tolerance; the root itself was sampled afresh.
    const kept = new Set(sampleOutline(plateOutlineShape(busy), { tolerance }).points.map(([x, y]) => `${x},${y}`))
    const reused = preview.outline.filter(([x, y]) => kept.has(`${x},${y}`)).length
    expect(reused).toBeGreaterThan(preview.outline.length / 2)
    expect(reused).toBeLessThan(preview.outline.length)
  })

  it('reads the curve\'s own extent however coarse its chords, and rebuilds the holes when the casters move', () => {
    const base = buildPlate(even())
    const next = even()
    // Off the sampling grid (a whole turn split in a power of two), so no sample need land on the tip.
    setRoot(next, 1, { reach: 200, fromAxis: 101.7 })
    // 5 mm chords: the polygon alone can fall short of a tip by up to that much.
    const coarse = previewPlate(next, base, { tolerance: 5 })
    const whole = buildPlate(next)
    // The top of the plate is at least the tip's own height: 433.2 mm out (as above) at 101.7 degrees.
    expect(coarse.metrics.bounds.maxY).toBeGreaterThanOrEqual(433.2 * Math.sin(101.7 * DEG) - 1e-6)
    // The whole plate's bounds come from its 0.1 mm polygon; here the polygon alone reads about 0.24 mm short at the top.
    for (const k of ['minX', 'minY', 'maxX', 'maxY'] as const) expect(Math.abs(coarse.metrics.bounds[k] - whole.metrics.bounds[k])).toBeLessThan(0.05)
    expect(coarse.outline.length).toBeLessThan(previewPlate(next, base).outline.length)
    // A caster offset of 250 mm puts pocket 1 (rotation 0) at (250, 0): the holes are built again.
    const moved = even()
    moved.casterOffset = 250
    const preview = previewPlate(moved, base)
    expect(preview.holes).not.toBe(base.holes)
    const pocket = preview.holes.find(h => h.kind === 'pocket')!
    expect(Math.hypot(pocket.x, pocket.y)).toBeCloseTo(250, 6)
  })
})

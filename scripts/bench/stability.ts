// How long unitStability takes, against the goal of following a drag: the
// editor recomputes the figures on every pointer move, beside buildPlate.
// Goal on a 2-core machine: median under 0.2 ms (it now includes the worst
// caster over every three-wheel stance and the overturn about the outline's
// hull). unitPlateFindings (the unit's errors buildPlate adds on every
// rebuild, no search for blocks) has the same goal; analyseUnit (the figures,
// the blocks needed and the findings) is timed too, for information.
// Run alone: npx tsx scripts/bench/stability.ts

import { buildPlate } from '../../geometry/plate'
import { plateParamsSchema } from '../../geometry/params'
import { analyseUnit, layoutBlocks, unitPlateFindings, unitStability } from '../../geometry/stability'

const GOAL_MS = 0.2
const WARMUP = 300
const RUNS = 2000

const cases = [
  { name: 'default plate', params: plateParamsSchema.parse({}) },
  { name: 'busy plate (8 casters, 12 lobes)', params: plateParamsSchema.parse({ tubeDiameter: 609.6, casterCount: 8, casterOffset: 330, access: { offset: 200 }, lobes: { count: 12, reach: 160, width: 120, irregularity: 0.7 }, unit: { counterweight: { count: 6 } } }) },
]

function median(times: number[]): number {
  const s = [...times].sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]!
}

for (const c of cases) {
  const plate = buildPlate(c.params)
  // A drag changes the load a little each frame; vary it so nothing is reused.
  const unit = (i: number) => ({ loadWeight: 20 + (i % 50) * 0.1, loadHeight: 900, counterweight: 8, counterweightHeight: 60, pushHeight: 1500, hardwareWeight: 6 })
  for (let i = 0; i < WARMUP; i++) unitStability(plate, unit(i))
  const times: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const u = unit(i)
    const t0 = performance.now()
    unitStability(plate, u)
    times.push(performance.now() - t0)
  }
  const m = median(times)
  const join: number[] = []
  for (let i = 0; i < 500; i++) {
    const t0 = performance.now()
    unitPlateFindings(plate, c.params.unit)
    join.push(performance.now() - t0)
  }
  const full: number[] = []
  for (let i = 0; i < 200; i++) {
    const t0 = performance.now()
    analyseUnit(plate)
    full.push(performance.now() - t0)
  }
  console.log(`${c.name}: ${plate.outline.length} outline points`)
  console.log(`  unitStability median ${m.toFixed(4)} ms (goal ${GOAL_MS} ms, ratio ${(m / GOAL_MS).toFixed(2)})`)
  const s = unitStability(plate, unit(0))
  console.log(`  worst caster ${s.loadPerCaster.toFixed(1)} kg over any three of ${s.kingpins.length} wheels (even share ${s.evenShare.toFixed(1)} kg)`)
  console.log(`  unitPlateFindings median ${median(join).toFixed(4)} ms (goal ${GOAL_MS} ms, ratio ${(median(join) / GOAL_MS).toFixed(2)}; inside every buildPlate)`)
  console.log(`  analyseUnit median ${median(full).toFixed(3)} ms (figures, blocks needed, findings)`)
}

// The counterweight layout (layoutBlocks) is worked out once per tube, pans, openings and block, then
// reused (analyseUnit asks twice); timed here on fresh blocks so nothing is reused. For information:
// it runs when the statics panel settles, not during a drag.
{
  const IN = 25.4
  const layouts = [
    { name: '24.5 in tube, 3 casters, 5 in openings, 2 x 4 x 4 in blocks', params: { tubeDiameter: 24.5 * IN, casterCount: 3, casterOffset: 8.5 * IN, access: { diameter: 5 * IN, offset: 5 * IN } }, block: [4, 4, 2] },
    { name: '49 in tube, 8 casters, 2 x 2 x 1 in blocks', params: { tubeDiameter: 49 * IN, casterCount: 8, casterOffset: 20 * IN, access: { offset: 14 * IN, diameter: 5 * IN } }, block: [2, 2, 1] },
  ]
  for (const c of layouts) {
    const plate = buildPlate(plateParamsSchema.parse(c.params))
    const times: number[] = []
    for (let i = 0; i < 12; i++) {
      const block = { length: c.block[0]! * IN + i * 1e-3, width: c.block[1]! * IN, thickness: c.block[2]! * IN }
      const t0 = performance.now()
      layoutBlocks(plate, block, 500, 3)
      times.push(performance.now() - t0)
    }
    console.log(`${c.name}: layoutBlocks median ${median(times).toFixed(1)} ms`)
  }
}

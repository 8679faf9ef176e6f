// How long buildPlate takes, against the editor's budget: it runs on every
// pointer move, so it should leave most of a 60 Hz frame (16.67 ms) for drawing.
// Goals on a 2-core machine: median at most 1 ms for the default plate, 4 ms
// for a busy one. Run alone: npx tsx scripts/bench/geometry.ts

import { buildPlate } from '../../geometry/plate'
import { plateParamsSchema, type PlateParams } from '../../geometry/params'

const FRAME_MS = 1000 / 60
const WARMUP = 300
const RUNS = 1000

interface Case {
  name: string
  params: PlateParams
  goalMs: number
}

const cases: Case[] = [
  { name: 'default plate', params: plateParamsSchema.parse({}), goalMs: 1 },
  {
    name: 'busy plate (8 casters, 12 lobes, 3 overrides)',
    params: plateParamsSchema.parse({
      tubeDiameter: 609.6,
      casterCount: 8,
      casterOffset: 330,
      access: { offset: 200 },
      lobes: {
        count: 12,
        reach: 160,
        width: 120,
        irregularity: 0.7,
        overrides: [
          { index: 0, reach: 260 },
          { index: 3, angle: 8, width: 160 },
          { index: 7, reach: 60 },
        ],
      },
    }),
    goalMs: 4,
  },
]

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))]!
}

for (const c of cases) {
  // A pointer drag changes one value a little each frame; vary the rotation so no result is reused.
  const variant = (i: number): PlateParams => ({ ...c.params, rotation: c.params.rotation + (i % 360) * 0.01 })
  for (let i = 0; i < WARMUP; i++) buildPlate(variant(i))
  const times: number[] = []
  let points = 0
  for (let i = 0; i < RUNS; i++) {
    const p = variant(i)
    const t0 = performance.now()
    const plate = buildPlate(p)
    times.push(performance.now() - t0)
    points = plate.outline.length
  }
  times.sort((a, b) => a - b)
  const median = percentile(times, 0.5)
  const p95 = percentile(times, 0.95)
  const share = (ms: number) => `${((100 * ms) / FRAME_MS).toFixed(1)} % of a 60 Hz frame`
  console.log(`buildPlate, ${c.name}: ${points} outline points, ${RUNS} runs`)
  console.log(`  median ${median.toFixed(3)} ms (${share(median)}), goal ${c.goalMs} ms: ${median <= c.goalMs ? 'met' : 'missed'}`)
  console.log(`  p95    ${p95.toFixed(3)} ms (${share(p95)})`)
}

// The sheet plan's nesting against its goals: 12 plates of three sizes (four
// each), two layers each, on 48 x 96 in sheets (PS 1-19), 1/2 in margin, 1/4 in
// kerf. Figures: time (goal under 2 s), sheets against the area lower bound
// (REFERENCES.md; goal at most one more) and against the peer, bounding
// rectangles packed by maxrects-packer (goal fewer), and the yield.
// Run alone: npx tsx scripts/bench/nest.ts

import { MaxRectsPacker } from 'maxrects-packer/dist/maxrects-packer.mjs'
import { buildPlate, deriveForTube, inchesToMm, presetParams } from '../../geometry'
import { nestParts } from '../../geometry/nest'
import { signedArea, bounds } from '../../geometry/math/polygon'

const SHEET = { width: inchesToMm(48), height: inchesToMm(96), margin: inchesToMm(0.5), kerf: inchesToMm(0.25) }
const GOAL_MS = 2000

function line(name: string, figure: string, goal: string, met: boolean): void {
  console.log(`  ${name.padEnd(30)} ${figure.padEnd(28)} goal ${goal.padEnd(22)} ${met ? 'met' : 'NOT met'}`)
}

for (const shape of ['river-stone', 'gnarled-oak']) {
  const base = presetParams(shape)!
  const tubes = [10.5, 12.5, 14.5]
  const plates = tubes.map((d) => buildPlate(deriveForTube(base, inchesToMm(d))))
  // Two layers each: every layer is a part (cut from single sheets, glued after).
  const parts = plates.map((p) => ({ outline: p.outline, count: 4 * 2 }))
  const t0 = performance.now()
  const { sheets } = nestParts(parts, SHEET)
  const ms = performance.now() - t0
  // The same plan again, as when a count changes on the page: the no-fit polygons are kept.
  const t1 = performance.now()
  nestParts(parts, SHEET)
  const warm = performance.now() - t1

  const partArea = parts.reduce((s, p) => s + Math.abs(signedArea(p.outline)) * p.count, 0)
  const usable = (SHEET.width - 2 * SHEET.margin) * (SHEET.height - 2 * SHEET.margin)
  const lower = Math.ceil(partArea / usable)
  const packer = new MaxRectsPacker(SHEET.width - 2 * SHEET.margin + SHEET.kerf, SHEET.height - 2 * SHEET.margin + SHEET.kerf, 0, { smart: true, pot: false, square: false, allowRotation: true })
  for (const p of parts) {
    const b = bounds(p.outline)
    for (let k = 0; k < p.count; k++) packer.add(b.maxX - b.minX + SHEET.kerf, b.maxY - b.minY + SHEET.kerf, {})
  }
  const peer = packer.bins.length
  const yieldShare = partArea / (sheets.length * SHEET.width * SHEET.height)

  const sizes = plates.map((p) => `${(p.metrics.width / 25.4).toFixed(1)}x${(p.metrics.height / 25.4).toFixed(1)} in`).join(', ')
  console.log(`${shape}: 12 plates (${sizes}), 2 layers each = 24 parts on 48 x 96 in`)
  line('time (first plan)', `${ms.toFixed(0)} ms (ratio ${(ms / GOAL_MS).toFixed(2)})`, `< ${GOAL_MS} ms`, ms < GOAL_MS)
  line('time (asked again)', `${warm.toFixed(0)} ms (ratio ${(warm / GOAL_MS).toFixed(2)})`, `< ${GOAL_MS} ms`, warm < GOAL_MS)
  line('sheets vs area lower bound', `${sheets.length} vs ${lower}`, 'at most one more', sheets.length <= lower + 1)
  line('sheets vs peer (maxrects)', `${sheets.length} vs ${peer}`, 'fewer', sheets.length < peer)
  line('yield', `${(yieldShare * 100).toFixed(1)} %`, 'for information', true)
}

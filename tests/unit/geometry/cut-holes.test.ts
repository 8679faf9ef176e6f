// Where each hole of a real plate lands in the cut file, read back with
// dxf-parser (an independent reader); expected values from the default
// params by hand. What a CNC shop expects: one layer per operation, nothing
// but geometry on cut layers (REFERENCES, DXF: common practice).

import { describe, expect, it } from 'vitest'
import DxfParser, { type ICircleEntity } from 'dxf-parser'
import { buildPlate } from '../../../geometry/plate'
import { plateParamsSchema } from '../../../geometry/params'
import { renderCutDxf } from '../../../geometry/export/dxf'
import { tubeWrapLayout } from '../../../geometry/export/tube-wrap-pdf'
import { LAYER_DRILL, LAYER_INSIDE, LAYER_REFERENCE } from '../../../geometry/export/cut-layers'

const IN = 25.4
const plate = buildPlate(plateParamsSchema.parse({}))
const dxf = new DxfParser().parseSync(renderCutDxf(plate, { units: 'in' }))!
const circles = (layer: string) => dxf.entities.filter((e) => e.layer === layer && e.type === 'CIRCLE') as ICircleEntity[]
const at = (list: ICircleEntity[], x: number, y: number, d: number) =>
  list.filter((c) => Math.abs(c.center.x * IN - x) < 1e-4 && Math.abs(c.center.y * IN - y) < 1e-4 && Math.abs(c.radius * 2 * IN - d) < 1e-4)

describe('holes in the default plate\'s cut file', () => {
  it('drills the centre, both index holes, the 12 rim fasteners and a 1/4 in pilot for each hole-sawn opening', () => {
    const drill = circles(LAYER_DRILL)
    // Centre 1/4 in at the origin; index holes 1/8 in on the 90 deg axis.
    expect(at(drill, 0, 0, 6.35)).toHaveLength(1)
    for (const h of plate.holes.filter((x) => x.kind === 'index')) expect(at(drill, h.x, h.y, 3.175)).toHaveLength(1)
    // Four 1/4 in fasteners per pan on a (4-1/4 + 1/2) in = 4.75 in circle, half a step (45 deg) off the radial line.
    const pocket0 = { x: 0, y: 90.5 }
    for (const deg of [135, 225, 315, 45]) {
      const a = (deg * Math.PI) / 180
      expect(at(drill, pocket0.x + 2.375 * IN * Math.cos(a), pocket0.y + 2.375 * IN * Math.sin(a), 6.35)).toHaveLength(1)
    }
    // Pilots: three pockets (4-1/4 in saw) and three access openings (2 in saw), at their centres.
    expect(at(drill, pocket0.x, pocket0.y, 6.35)).toHaveLength(1)
    // 1 centre + 2 index + 12 fasteners + 6 pilots.
    expect(drill).toHaveLength(21)
  })

  it('leaves the caster bolts off the cut layers: they go through the pan\'s steel', () => {
    const bolts = plate.casterMounts.flatMap((m) => m.bolts)
    expect(bolts).toHaveLength(12)
    for (const b of bolts) {
      expect(at(circles(LAYER_DRILL), b.x, b.y, b.diameter)).toHaveLength(0)
      expect(at(circles(LAYER_REFERENCE), b.x, b.y, b.diameter)).toHaveLength(1)
    }
  })

  it('marks hole-sawn openings on non-cut layers named with the saw, and routes none here', () => {
    expect(circles(LAYER_INSIDE)).toHaveLength(0)
    const pockets = circles('RP-HOLESAW-4.25IN')
    expect(pockets).toHaveLength(3)
    for (const c of pockets) expect(c.radius * 2).toBeCloseTo(4.25, 9)
    expect(circles('RP-HOLESAW-2IN')).toHaveLength(3)
    // Text only on the notes layer (RP-NOTES), never on a layer that is cut.
    expect(dxf.entities.some((e) => e.layer !== 'RP-NOTES' && ['TEXT', 'MTEXT'].includes(e.type))).toBe(false)
  })

  it('routes an opening too big for a hole saw as an inside profile', () => {
    const big = buildPlate(plateParamsSchema.parse({ tubeDiameter: 900, casterOffset: 300, access: { diameter: 8 * IN, offset: 200 } }))
    const read = new DxfParser().parseSync(renderCutDxf(big, { units: 'mm' }))!
    const inside = read.entities.filter((e) => e.layer === LAYER_INSIDE) as ICircleEntity[]
    expect(inside).toHaveLength(3)
    for (const c of inside) expect(c.radius * 2).toBeCloseTo(203.2, 6)
  })
})

describe('tube-wrap notch height', () => {
  it('comes from the pan stack: (31.75 - 9.525) + 12.7 = 34.925 mm for the default plate, not a 1 in placeholder', () => {
    const plate150 = buildPlate(plateParamsSchema.parse({ casterOffset: 150 }))
    expect(plate150.notches.length).toBe(3)
    expect(tubeWrapLayout(plate150).notchHeight).toBeCloseTo(34.925, 9)
    expect(tubeWrapLayout(plate150, { notchHeight: 50 }).notchHeight).toBe(50)
  })
})

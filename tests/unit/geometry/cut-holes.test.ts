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
const parser = new DxfParser()
/** The default cut file (routed openings) and the hand-shop one (hole-saw marks with pilots). */
const dxf = parser.parseSync(renderCutDxf(plate, { units: 'in' }))!
const sawDxf = parser.parseSync(renderCutDxf(plate, { units: 'in', openings: 'hole-saw' }))!
const circlesOf = (d: typeof dxf) => (layer: string) => d.entities.filter((e) => e.layer === layer && e.type === 'CIRCLE') as ICircleEntity[]
const circles = circlesOf(dxf)
const sawCircles = circlesOf(sawDxf)
const at = (list: ICircleEntity[], x: number, y: number, d: number) =>
  list.filter((c) => Math.abs(c.center.x * IN - x) < 1e-4 && Math.abs(c.center.y * IN - y) < 1e-4 && Math.abs(c.radius * 2 * IN - d) < 1e-4)
/** Four 1/4 in fasteners per pan on a (4-1/4 + 1/2) in = 4.75 in circle, half a step (45 deg) off the radial line; pocket 0 at (0, 90.5). */
const pocket0 = { x: 0, y: 90.5 }
const rimSpots = [135, 225, 315, 45].map((deg) => [pocket0.x + 2.375 * IN * Math.cos((deg * Math.PI) / 180), pocket0.y + 2.375 * IN * Math.sin((deg * Math.PI) / 180)] as const)

describe('holes in the default plate\'s cut file', () => {
  it('drills the centre and both index holes, and no rim holes for screws into the rabbet floor (the default)', () => {
    const drill = circles(LAYER_DRILL)
    // Centre 1/4 in at the origin; index holes 1/8 in on the 90 deg axis.
    expect(at(drill, 0, 0, 6.35)).toHaveLength(1)
    for (const h of plate.holes.filter((x) => x.kind === 'index')) expect(at(drill, h.x, h.y, 3.175)).toHaveLength(1)
    for (const [x, y] of rimSpots) expect(at(drill, x, y, 6.35)).toHaveLength(0)
    // 1 centre + 2 index; no pilots either: the openings are routed.
    expect(drill).toHaveLength(3)
  })

  it('drills the 12 rim bolt holes through every layer when the pans are bolted', () => {
    const bolted = buildPlate(plateParamsSchema.parse({ fasteners: { kind: 'bolt-tnut', length: 1.25 * IN } }))
    for (const layer of ['top', 'bottom'] as const) {
      const drill = (parser.parseSync(renderCutDxf(bolted, { units: 'in', layer }))!.entities.filter((e) => e.layer === LAYER_DRILL && e.type === 'CIRCLE')) as ICircleEntity[]
      for (const [x, y] of rimSpots) expect(at(drill, x, y, 6.35)).toHaveLength(1)
      expect(drill).toHaveLength(3 + 12)
    }
  })

  it('leaves the caster bolts off the cut layers: they go through the pan\'s steel', () => {
    const bolts = plate.casterMounts.flatMap((m) => m.bolts)
    expect(bolts).toHaveLength(12)
    for (const b of bolts) {
      expect(at(circles(LAYER_DRILL), b.x, b.y, b.diameter)).toHaveLength(0)
      expect(at(circles(LAYER_REFERENCE), b.x, b.y, b.diameter)).toHaveLength(1)
    }
  })

  it('routes every pocket and access opening as an inside profile by default (a CNC router)', () => {
    const inside = circles(LAYER_INSIDE)
    // Three 4-1/4 in pockets and three 2 in access openings, at the plate's own centres.
    expect(inside).toHaveLength(6)
    for (const h of plate.holes.filter((x) => x.kind === 'pocket' || x.kind === 'access')) expect(at(inside, h.x, h.y, h.diameter)).toHaveLength(1)
    expect(inside.filter((c) => Math.abs(c.radius * 2 - 4.25) < 1e-9)).toHaveLength(3)
    expect(inside.filter((c) => Math.abs(c.radius * 2 - 2) < 1e-9)).toHaveLength(3)
    expect(dxf.entities.some((e) => e.layer.startsWith('RP-HOLESAW-'))).toBe(false)
  })

  it('for a hand shop marks hole-sawn openings on non-cut layers named with the saw, with a 1/4 in pilot each', () => {
    expect(sawCircles(LAYER_INSIDE)).toHaveLength(0)
    const pockets = sawCircles('RP-HOLESAW-4.25IN')
    expect(pockets).toHaveLength(3)
    for (const c of pockets) expect(c.radius * 2).toBeCloseTo(4.25, 9)
    expect(sawCircles('RP-HOLESAW-2IN')).toHaveLength(3)
    // Pilots at every pocket's and opening's centre: 3 + 2 + 6.
    expect(at(sawCircles(LAYER_DRILL), pocket0.x, pocket0.y, 6.35)).toHaveLength(1)
    expect(sawCircles(LAYER_DRILL)).toHaveLength(3 + 6)
    // Text only on the notes layer (RP-NOTES), never on a layer that is cut.
    for (const d of [dxf, sawDxf]) expect(d.entities.some((e) => e.layer !== 'RP-NOTES' && ['TEXT', 'MTEXT'].includes(e.type))).toBe(false)
  })

  it('names every saw size and every hole in the notes, whichever way the openings are cut', () => {
    for (const d of [dxf, sawDxf]) {
      const text = d.entities.filter((e) => e.layer === 'RP-NOTES' && e.type === 'TEXT').map((e) => (e as unknown as { text: string }).text).join('\n')
      // Hand counts from the default plate: 3 pockets 4-1/4 in, 3 access openings 2 in, a 1/4 in centre hole,
      // 2 index holes 1/8 in, 4 screws per pan, 3 rabbets (4-1/4 + 2 x 1/2) = 5-1/4 in across, 3/8 in deep.
      expect(text).toMatch(/3 pockets 4-1\/4 in/)
      expect(text).toMatch(/3 access openings 2 in/)
      expect(text).toMatch(/1 centre hole 1\/4 in: drilled/)
      expect(text).toMatch(/2 index holes 1\/8 in: drilled/)
      expect(text).toMatch(/4 screws per pan/)
      expect(text).toMatch(/3 rabbets 5-1\/4 in across, 3\/8 in deep/)
      expect(text).toMatch(/Hole saws: 4-1\/4 in \(3 pockets\); 2 in \(3 access openings\)/)
    }
  })

  it('routes an opening too big for a hole saw as an inside profile, in both modes', () => {
    const big = buildPlate(plateParamsSchema.parse({ tubeDiameter: 900, casterOffset: 300, access: { diameter: 8 * IN, offset: 200 } }))
    const read = new DxfParser().parseSync(renderCutDxf(big, { units: 'mm', openings: 'hole-saw' }))!
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

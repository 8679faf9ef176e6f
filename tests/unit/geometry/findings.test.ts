import { describe, expect, it } from 'vitest'
import { buildPlate, plateOutlineShape } from '../../../geometry/plate'
import { plateParamsSchema, type PlateParamsInput } from '../../../geometry/params'
import { plateFindings, SHEET_MM } from '../../../geometry/checks/findings'
import { roundFeatures } from '../../../geometry/features/holes'
import { casterMounts, tubeBearing, tubeNotches } from '../../../geometry/features/casters'
import { floorStack } from '../../../geometry/checks/floor'
import { PLYWOOD_DENSITY } from '../../../geometry/metrics/metrics'
import { presetParams, PRESETS } from '../../../geometry/presets'
import { threeInch } from './helpers'

// The hand-worked cases below are on the 3 in caster plate (helpers.ts, THREE_INCH).
const findings = (input: PlateParamsInput) => buildPlate(plateParamsSchema.parse(threeInch(input as Record<string, unknown>))).findings
const codes = (input: PlateParamsInput) => findings(input).map((f) => f.code)

describe('a sound plate', () => {
  // Every starting shape hides its pans but the slim birch, whose 8-1/2 in tube cannot: the least
  // offset for its 4-1/4 in pockets to clear the centre hole and each other is 88.9 mm, and a
  // 66.675 mm pan radius then reaches 155.6 mm against a 107.95 mm tube radius.
  it.each(['default', ...PRESETS.map((p) => p.id).filter((id) => id !== 'slim-birch')])('%s has no findings', (id) => {
    const params = id === 'default' ? plateParamsSchema.parse({}) : presetParams(id)!
    expect(buildPlate(params).findings).toEqual([])
  })
  it('slim-birch has no error, and says why its pans show', () => {
    const plate = buildPlate(presetParams('slim-birch')!)
    expect(plate.findings.filter((f) => f.severity === 'error')).toEqual([])
    const pan = plate.findings.find((f) => f.code === 'pan-visible')!
    expect(pan.message).toMatch(/too slim/)
    expect(pan.values!.least).toBeCloseTo(88.9, 6)
    expect(plate.holes.filter((h) => h.kind === 'index').length).toBeGreaterThanOrEqual(1)
  })
})

describe('holes and the wood between them', () => {
  it('reports openings running into pockets, with the shared area from the lens formula', () => {
    // Opening 6 in across, 120 mm out at 30 deg from pocket 0's line: centres sqrt(120^2 + 170^2 - 2*120*170*cos 60) = 151.3 mm
    // apart, less than the rabbet radius 98.4 plus the opening's 76.2.
    const all = findings({ access: { diameter: 152.4, offset: 120 } }).filter((f) => f.code === 'holes-overlap')
    const found = all.filter((f) => f.holeIds![0]!.startsWith('pocket'))
    expect(found.length).toBe(6)
    // The opening at 270 deg covers the index hole's place at (0, -158.75): 120 + 76.2 > 158.75 - 1.6.
    // The index hole moves out along the axis instead, to clear the opening by 1/4 in:
    // 196.2 + 6.35 + 1.5875 = 204.1375 mm, on the search's 0.5 mm steps.
    expect(all.filter((f) => f.holeIds!.includes('index-1'))).toEqual([])
    const index1 = buildPlate(plateParamsSchema.parse(threeInch({ access: { diameter: 152.4, offset: 120 } }))).holes.find((h) => h.id === 'index-1')!
    expect(index1.x).toBeCloseTo(0, 9)
    expect(-index1.y).toBeGreaterThanOrEqual(204.1375)
    expect(-index1.y).toBeLessThan(204.1375 + 0.5)
    expect(found[0]!.severity).toBe('error')
    expect(found[0]!.holeIds).toEqual(['pocket-0', 'access-0'])
    expect(found[0]!.field).toBe('access.offset')
    expect(found[0]!.message).toMatch(/\d+ mm2 shared/)
  })

  it('warns where two holes keep less than the minimum wood between them', () => {
    // With 1 in minimum wood: opening 2-1/4 in at 85 mm, nearest the pockets, leaves
    // sqrt(85^2 + 170^2 - 2*85*170*cos 60) - 98.425 - 28.575 = 20.2 mm of wood.
    const found = findings({ minWood: 25.4, access: { offset: 85 } }).filter((f) => f.code === 'holes-too-close')
    expect(found.length).toBe(6)
    expect(found[0]!.severity).toBe('warning')
    expect(found[0]!.message).toMatch(/20\.2 mm of wood/)
  })

  it('reports an opening that reaches under the tube wall', () => {
    // 140 + 28.575 = 168.6 mm > inside of the wall at 152.4 mm.
    const found = findings({ access: { offset: 140 } }).filter((f) => f.code === 'hole-crosses-trunk-wall')
    expect(found.map((f) => f.holeIds)).toEqual([['access-0'], ['access-1'], ['access-2']])
  })

  it('warns about an opening outside the trunk, and grows the outline round it', () => {
    const list = findings({ access: { offset: 400 } })
    expect(list.filter((f) => f.code === 'access-outside-trunk')).toHaveLength(3)
    expect(list.map((f) => f.code)).not.toContain('edge-too-close')
    expect(list.map((f) => f.code)).not.toContain('hole-cuts-edge')
  })
})

describe('the edge check itself, on a hand-made outline', () => {
  // buildPlate always grows the outline round its holes, so the edge check is exercised directly.
  const params = plateParamsSchema.parse(threeInch())
  const f = roundFeatures(params)
  const notches = tubeNotches(params, f.rabbets)
  const base = {
    params,
    pockets: f.pockets,
    rabbets: f.rabbets,
    access: f.access,
    centre: f.centre,
    index: f.index,
    fasteners: f.fasteners,
    casterMounts: casterMounts(params, f.pockets),
    notches,
    tubeBearing: tubeBearing(notches),
    stack: floorStack(params),
    shape: plateOutlineShape(params),
    thetas: new Float64Array(4),
    enclosingRadius: 300,
  }
  const square = (half: number): [number, number][] => [[-half, -half], [half, -half], [half, half], [-half, half]]

  it('reports pockets cutting a too-small outline as errors', () => {
    const found = plateFindings({ ...base, outline: square(200) }).filter((x) => x.code === 'hole-cuts-edge' && x.holeIds![0]!.startsWith('pocket'))
    expect(found.map((x) => x.holeIds![0])).toEqual(['pocket-0', 'pocket-1', 'pocket-2'])
  })

  it('warns where a pocket keeps less than the minimum wood to the edge', () => {
    // Pocket 0 at (0, 170), rabbet radius 98.425: its top edge is at 268.425. A square of half-side
    // 280 leaves 11.575 mm there; the others, at +-147.2 x, reach 245.6 and 245.6 - 280 < 19.05 too.
    const found = plateFindings({ ...base, outline: square(280) }).filter((x) => x.code === 'edge-too-close')
    const top = found.find((x) => x.holeIds![0] === 'pocket-0')!
    expect(top.message).toMatch(/11\.6 mm of wood/)
    expect(plateFindings({ ...base, outline: square(400) }).filter((x) => x.code.startsWith('edge') || x.code === 'hole-cuts-edge')).toEqual([])
  })
})

describe('casters that do not fit their pockets', () => {
  it('reports a wheel that swings into the pocket wall', () => {
    // Reach 69.85 mm (see the floor-gap example) against a 130 mm pocket's 65 mm radius.
    const found = findings({ pocketDiameter: 130 }).filter((f) => f.code === 'wheel-swing')
    expect(found).toHaveLength(1)
    expect(found[0]!.field).toBe('pocketDiameter')
  })
  it('reports a top plate that cannot pass through the pocket', () => {
    // Top plate 63.5 x 92.075 mm: 111.85 mm corner to corner.
    expect(codes({ pocketDiameter: 110 })).toContain('caster-too-big-for-pocket')
    expect(codes({ pocketDiameter: 112, caster: { swivelLead: 15 } })).not.toContain('caster-too-big-for-pocket')
  })
})

describe('sheet size (48 x 96 in, US Product Standard PS 1-19)', () => {
  it('is 1219.2 x 2438.4 mm', () => {
    expect(SHEET_MM.width).toBeCloseTo(48 * 25.4, 9)
    expect(SHEET_MM.length).toBeCloseTo(96 * 25.4, 9)
  })
  it('flags a plate that fits no orientation of the sheet', () => {
    // Three 900 mm roots: tips about 1085 mm out at 120 deg spacing; that triangle is 1.5 x 1085 = 1627 mm
    // high however it is turned, more than the sheet's 1219 mm width.
    expect(codes({ lobes: { count: 3, reach: 900, irregularity: 0 } })).toContain('larger-than-sheet')
  })
  it('accepts a long, narrow plate that fits the sheet lengthwise', () => {
    // Two opposite 600 mm roots: about 1570 mm long, narrow: fits lengthwise.
    const list = codes({ lobes: { count: 2, reach: 600, width: 150, irregularity: 0 } })
    expect(list).not.toContain('larger-than-sheet')
  })
})

describe('weight', () => {
  it('uses Douglas-fir at G 0.48, 12 % MC: 537.6 kg/m3 (USDA FPL Wood Handbook, FPL-GTR-190)', () => {
    expect(PLYWOOD_DENSITY.value).toBeCloseTo(537.6, 9)
    expect(PLYWOOD_DENSITY.source).toMatch(/FPL-GTR-190/)
    // REFERENCES: a 4x8 sheet at 0.703 in weighs about 28.5 kg (63 lb).
    const sheet = SHEET_MM.width * SHEET_MM.length * 0.703 * 25.4 * 1e-9 * PLYWOOD_DENSITY.value
    expect(sheet).toBeCloseTo(28.5, 1)
  })
  it('is net area x thickness less the rabbet rings, times the density', () => {
    const params = plateParamsSchema.parse(threeInch())
    const m = buildPlate(params).metrics
    const rings = 3 * Math.PI * ((196.85 / 2) ** 2 - (165.1 / 2) ** 2) * 9.525
    expect(m.volume).toBeCloseTo(m.area * 35.7124 - rings, 3)
    expect(m.weight).toBeCloseTo(m.volume * 1e-9 * 537.6, 9)
    expect(m.density.source).toBe(PLYWOOD_DENSITY.source)
  })
})

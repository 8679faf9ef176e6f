import { describe, expect, it } from 'vitest'
import { minCasterOffset, paramIssues, plateParamsSchema } from '../../../geometry/params'

describe('plateParamsSchema', () => {
  it('fills a whole plate from an empty object, nested groups included', () => {
    const p = plateParamsSchema.parse({})
    expect(p.caster.wheelDiameter).toBe(50.8)
    expect(p.lobes.count).toBe(6)
    expect(p.access.enabled).toBe(true)
    // Cutting defaults: a 1/4 in bit, 1/2 in sheet margin, a 48 x 96 in sheet (PS 1-19).
    expect(p.cutting.bitDiameter).toBe(6.35)
    expect(p.cutting.edgeMargin).toBe(12.7)
    expect([p.cutting.sheetWidth, p.cutting.sheetLength]).toEqual([1219.2, 2438.4])
    expect(p.fasteners.count).toBe(4)
    expect(p.fasteners.boltCircleDiameter).toBeUndefined()
    expect(p.caster.treadWidth).toBe(19.05)
    expect(paramIssues({})).toEqual([])
  })

  it('still reads params stored before the cutting, fastener and tread fields existed', () => {
    // A revision saved by the first round: every field it had, none of the new ones.
    const stored = {
      tubeDiameter: 317.5, tubeWall: 6.35, casterCount: 3, casterOffset: 170, pocketDiameter: 165.1, rabbetWidth: 15.875, rabbetDepth: 9.525, panDepth: 63.5,
      caster: { wheelDiameter: 76.2, swivelLead: 31.75, overallHeight: 101.6, topPlateWidth: 63.5, topPlateLength: 92.075, boltSpacingX: 73.025, boltSpacingY: 44.45, boltDiameter: 7.9375, racewayDiameter: 50.8 },
      rotation: 90, lobes: { count: 6, reach: 110, width: 110, roundness: 0.5, irregularity: 0.35, seed: 7, valley: 25, phase: 0, overrides: [] },
      access: { enabled: true, diameter: 57.15, offset: 100, snapToHoleSaw: true },
      centreHoleDiameter: 6.35, indexHoleDiameter: 3.175, minWood: 19.05, layers: 2, sheetThickness: 17.8562, minFloorGap: 6.35,
    }
    const p = plateParamsSchema.parse(stored)
    expect(p.casterOffset).toBe(170)
    expect(p.caster.wheelDiameter).toBe(76.2)
    expect(p.caster.treadWidth).toBe(19.05)
    expect(p.cutting.bitDiameter).toBe(6.35)
    expect(p.fasteners.count).toBe(4)
  })

  it('fills inner defaults of a group given in part (zod 4 prefault, not default)', () => {
    const p = plateParamsSchema.parse({ caster: { wheelDiameter: 60 }, lobes: { count: 4 } })
    expect(p.caster.wheelDiameter).toBe(60)
    expect(p.caster.overallHeight).toBe(66.675)
    expect(p.caster.boltDiameter).toBe(6.35)
    expect(p.lobes.reach).toBe(110)
    expect(p.lobes.overrides).toEqual([])
  })

  it('re-parses its own output unchanged, so stored revisions rebuild the same plate', () => {
    const p = plateParamsSchema.parse({ lobes: { overrides: [{ index: 2, reach: 200 }] } })
    expect(plateParamsSchema.parse(JSON.parse(JSON.stringify(p)))).toEqual(p)
  })

  it('takes the "3/4 in" panel default as the shop buys it: 23/32 in (PS 1-19, performance category 23/32, 0.688-0.750 in)', () => {
    expect(plateParamsSchema.parse({}).sheetThickness).toBeCloseTo((23 / 32) * 25.4, 9)
  })

  it.each([
    [{ casterCount: 2 }, 'casterCount'],
    [{ casterCount: 9 }, 'casterCount'],
    [{ casterCount: 3.5 }, 'casterCount'],
    [{ tubeDiameter: 50 }, 'tubeDiameter'],
    [{ tubeDiameter: Number.NaN }, 'tubeDiameter'],
    [{ lobes: { roundness: 1.5 } }, 'lobes.roundness'],
    [{ caster: { wheelDiameter: 500 } }, 'caster.wheelDiameter'],
    [{ minWood: 'lots' }, 'minWood'],
  ])('rejects %j at %s', (input, path) => {
    expect(paramIssues(input).map((i) => i.path)).toContain(path)
  })
})

describe('cross-field rules', () => {
  it('asks for a caster offset that lets the pocket clear the centre hole, naming the least value', () => {
    const p = plateParamsSchema.parse({})
    const least = minCasterOffset(p)
    // pocket radius + rabbet + minimum wood + centre-hole radius, by hand for the defaults:
    expect(least).toBeCloseTo(107.95 / 2 + 12.7 + 19.05 + 6.35 / 2, 9)
    const issues = paramIssues({ casterOffset: least - 1 })
    expect(issues).toHaveLength(1)
    expect(issues[0]!.path).toBe('casterOffset')
    expect(issues[0]!.message).toMatch(/88\.9 mm/)
    expect(paramIssues({ casterOffset: least + 0.001 })).toEqual([])
  })

  it('keeps the rabbet shallower than the plate', () => {
    expect(paramIssues({ layers: 1, sheetThickness: 9, rabbetDepth: 9.5 }).map((i) => i.path)).toEqual(['rabbetDepth'])
  })

  it('keeps the bolt pattern on the top plate', () => {
    const paths = paramIssues({ caster: { boltSpacingX: 90, boltSpacingY: 60 } }).map((i) => i.path)
    expect(paths).toEqual(['caster.boltSpacingX', 'caster.boltSpacingY'])
  })

  it('names the override that points at a lobe that does not exist, or repeats one', () => {
    const issues = paramIssues({ lobes: { count: 4, overrides: [{ index: 1 }, { index: 4 }, { index: 1, reach: 5 }] } })
    expect(issues.map((i) => i.path)).toEqual(['lobes.overrides.1.index', 'lobes.overrides.2.index'])
    expect(issues[0]!.message).toMatch(/no lobe 5/)
  })

  it('wants a caster taller than its wheel and a lead shorter than it', () => {
    const paths = paramIssues({ caster: { wheelDiameter: 101.6, overallHeight: 100, swivelLead: 120 } }).map((i) => i.path)
    expect(paths).toEqual(['caster.overallHeight', 'caster.swivelLead'])
  })
})

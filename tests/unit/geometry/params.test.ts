import { describe, expect, it } from 'vitest'
import { minCasterOffset, paramIssues, plateParamsSchema } from '../../../geometry/params'

describe('plateParamsSchema', () => {
  it('fills a whole plate from an empty object, nested groups included', () => {
    const p = plateParamsSchema.parse({})
    expect(p.caster.wheelDiameter).toBe(76.2)
    expect(p.lobes.count).toBe(6)
    expect(p.access.enabled).toBe(true)
    expect(paramIssues({})).toEqual([])
  })

  it('fills inner defaults of a group given in part (zod 4 prefault, not default)', () => {
    const p = plateParamsSchema.parse({ caster: { wheelDiameter: 88.9 }, lobes: { count: 4 } })
    expect(p.caster.wheelDiameter).toBe(88.9)
    expect(p.caster.overallHeight).toBe(101.6)
    expect(p.caster.boltDiameter).toBe(7.9375)
    expect(p.lobes.reach).toBe(110)
    expect(p.lobes.overrides).toEqual([])
  })

  it('re-parses its own output unchanged, so stored revisions rebuild the same plate', () => {
    const p = plateParamsSchema.parse({ lobes: { overrides: [{ index: 2, reach: 200 }] } })
    expect(plateParamsSchema.parse(JSON.parse(JSON.stringify(p)))).toEqual(p)
  })

  it('takes the 3/4 in panel default from its labelled thickness, 0.703 in (PS 1-19, category 23/32)', () => {
    expect(plateParamsSchema.parse({}).sheetThickness).toBeCloseTo(0.703 * 25.4, 9)
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
    expect(least).toBeCloseTo(165.1 / 2 + 15.875 + 19.05 + 6.35 / 2, 9)
    const issues = paramIssues({ casterOffset: least - 1 })
    expect(issues).toHaveLength(1)
    expect(issues[0]!.path).toBe('casterOffset')
    expect(issues[0]!.message).toMatch(/120\.7 mm/)
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

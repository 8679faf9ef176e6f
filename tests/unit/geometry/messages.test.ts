// The checks' words in the reader's units, against hand values: 1 in = 25.4 mm exactly
// (international yard and pound agreement, 1959; NIST SP 811). Expected values are
// worked by hand from the plate's parameters, never read from the code under test.
import { describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema, paramIssues } from '../../../geometry/core'
import { fixText, lengthText, numberList, paramIssueText, problemCounts, problemRows } from '../../../geometry/checks/messages'

const IN = 25.4
const plateOf = (input: unknown) => buildPlate(plateParamsSchema.parse(input))

describe('lengths in the reader units', () => {
  it('19.05 mm is 3/4 in and 403.225 mm is 15-7/8 in (25.4 mm per inch, NIST SP 811)', () => {
    expect(lengthText(19.05, { units: 'in' })).toBe('3/4"')
    expect(lengthText(403.225, { units: 'in' })).toBe('15-7/8"')
    // 1/32 asked for: 0.40625 in = 10.31875 mm
    expect(lengthText(10.31875, { units: 'in', denominator: 32 })).toBe('13/32"')
    expect(lengthText(19.05, { units: 'mm' })).toBe('19 mm')
  })

  it('joins runs of hole numbers', () => {
    expect(numberList([1, 2, 3, 5])).toBe('1-3, 5')
    expect(numberList([4, 2])).toBe('2, 4')
  })
})

describe('six casters at a 4 in offset (the pockets overlap)', () => {
  // Pockets 4-1/4 in with a 1/2 in rabbet ring: 5-1/4 in across the rabbet. Six on a 4 in
  // radius stand 2 x 4 x sin(30 deg) = 4 in apart, centre to centre: they overlap by 1-1/4 in.
  const plate = plateOf({ casterCount: 6, casterOffset: 4 * IN })
  const rows = problemRows(plate, { units: 'in' })

  it('is one row for the pockets, not one per pair', () => {
    const pocketRows = rows.filter((r) => r.code === 'holes-overlap' && r.key.endsWith(':pocket'))
    expect(pocketRows).toHaveLength(1)
    expect(pocketRows[0]!.indices).toHaveLength(6)
    expect(rows.length).toBeLessThan(plate.findings.length)
    // Every finding is in exactly one row.
    expect(rows.flatMap((r) => r.indices).sort((a, b) => a - b)).toEqual(plate.findings.map((_, i) => i))
  })

  it('says by how much in inches, never in mm2 or "0 mm"', () => {
    const row = rows.find((r) => r.key === 'holes-overlap:pocket')!
    // 5-1/4 in across the rabbets - 4 in apart = 1-1/4 in overlap (hand value).
    expect(row.text).toContain('1-1/4"')
    for (const r of rows) {
      expect(r.text).not.toMatch(/mm/)
      expect(r.text).not.toMatch(/\b0 mm|\(0 /)
    }
  })

  it('names the field and a value that works: caster offset at least 6 in', () => {
    // Neighbours 2 R sin(30 deg) = R apart must clear 5-1/4 in of rabbet plus 3/4 in of minimum wood: R >= 6 in.
    const row = rows.find((r) => r.key === 'holes-overlap:pocket')!
    expect(row.fix?.field).toBe('casterOffset')
    expect(row.fix?.value).toBeCloseTo(6 * IN, 6)
    expect(fixText(row.fix!, { units: 'in' })).toBe('Caster offset: use at least 6"')
    // And it does work: at 6 in no two pockets are closer than the minimum wood (measured on the rebuilt holes).
    const fixed = plateOf({ casterCount: 6, casterOffset: 6 * IN })
    const pockets = fixed.holes.filter((h) => h.kind === 'pocket')
    const gap = Math.hypot(pockets[0]!.x - pockets[1]!.x, pockets[0]!.y - pockets[1]!.y) - 5.25 * IN
    expect(gap).toBeGreaterThanOrEqual(0.75 * IN - 1e-6)
  })

  it('counts the same rows a list shows, errors and checks apart', () => {
    const counts = problemCounts(rows)
    expect(counts.errors + counts.warnings).toBe(rows.length)
    expect(counts.errors).toBe(rows.filter((r) => r.severity === 'error').length)
    expect(rows.findIndex((r) => r.severity === 'warning')).toBeGreaterThanOrEqual(counts.errors)
  })

  it('in millimetres says mm and no inch marks', () => {
    const mmRows = problemRows(plate, { units: 'mm' })
    const row = mmRows.find((r) => r.key === 'holes-overlap:pocket')!
    // 1-1/4 in = 31.75 mm, shown to the half millimetre.
    expect(row.text).toContain('32 mm')
    for (const r of mmRows) expect(r.text + (r.fix ? fixText(r.fix, { units: 'mm' }) : '')).not.toContain('"')
  })
})

describe('other bad plates: no millimetres with inches chosen', () => {
  const cases: Record<string, unknown> = {
    'pan too deep': { panDepth: 60 },
    'big router bit': { cutting: { bitDiameter: 25 } },
    'pans outside the trunk': { casterOffset: 5 * IN },
    'tiny sheet': { cutting: { sheetWidth: 304.8, sheetLength: 304.8 } },
  }
  it.each(Object.entries(cases))('%s', (_, input) => {
    const rows = problemRows(plateOf(input), { units: 'in' })
    expect(rows.length).toBeGreaterThan(0)
    for (const r of rows) expect(`${r.text} ${r.fix ? fixText(r.fix, { units: 'in' }) : ''}`).not.toMatch(/\bmm\b|mm2/)
  })

  it('a pan 60 mm deep: the floor gap fix is a pan depth that leaves the 1/4 in asked for', () => {
    // Floor gap = caster height - (T - rabbet depth + pan depth) (geometry/checks/floor.ts model):
    // 66.675 - (35.7124 - 9.525 + 60) = -19.5124 mm. Pan depth for a 6.35 mm gap: 60 - 19.5124 - 6.35 = 34.1376 mm,
    // rounded down to 1/16 in: 1-5/16 in (33.3375 mm).
    const rows = problemRows(plateOf({ panDepth: 60 }), { units: 'in' })
    const row = rows.find((r) => r.code === 'floor-gap-negative')!
    expect(row.fix?.value).toBeCloseTo(33.3375, 6)
    expect(fixText(row.fix!, { units: 'in' })).toBe('Pan depth: use at most 1-5/16"')
  })
})

describe('field messages', () => {
  it('caster offset too small says the least offset in inches: 2-1/8 + 1/2 + 3/4 + 1/8 = 3-1/2 in', () => {
    const issue = paramIssues({ casterOffset: 30 }).find((i) => i.path === 'casterOffset')!
    expect(issue.code).toBe('caster-offset-small')
    const text = paramIssueText(issue, { units: 'in' })
    expect(text).toContain('3-1/2"')
    expect(text).not.toMatch(/mm/)
    // 3-1/2 in = 88.9 mm, shown to the half millimetre.
    expect(paramIssueText(issue, { units: 'mm' })).toContain('89 mm')
  })

  it('a bound on a length is a length; on a count it is a number', () => {
    const tube = paramIssues({ tubeDiameter: 10 }).find((i) => i.path === 'tubeDiameter')!
    // The schema's least tube is 4 in.
    expect(paramIssueText(tube, { units: 'in' })).toBe('Must be at least 4".')
    const count = paramIssues({ casterCount: 12 }).find((i) => i.path === 'casterCount')!
    expect(paramIssueText(count, { units: 'in' }, false)).toBe('Must be at most 8.')
  })
})

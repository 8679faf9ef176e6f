import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { MM_PER_INCH, formatInches, formatMillimetres, inchesToMm, parseLength } from '../../../geometry/units'

const mm = (text: string, defaultUnit?: 'mm' | 'in') => {
  const r = parseLength(text, defaultUnit ? { defaultUnit } : {})
  if (!r.ok) throw new Error(`expected "${text}" to parse: ${r.message}`)
  return r.mm
}

describe('the inch (international yard and pound agreement, 1959; NIST SP 811)', () => {
  it('is exactly 25.4 mm', () => {
    expect(MM_PER_INCH).toBe(25.4)
    expect(mm('1"')).toBe(25.4)
    expect(mm('1 in')).toBe(25.4)
  })
  it('makes the foot exactly 304.8 mm and the yard exactly 914.4 mm', () => {
    expect(mm("1'")).toBe(304.8)
    expect(mm('3 ft')).toBeCloseTo(914.4, 10)
  })
  it('converts trade fractions without drift: 15-7/8 in is 403.225 mm', () => {
    expect(inchesToMm(15.875)).toBe(403.225)
  })
})

describe('parseLength reads shop notation', () => {
  it.each([
    ['15-7/8"', 403.225],
    ['15 7/8', 403.225],
    ['15 7/8 in', 403.225],
    ["1' 3-1/2\"", 393.7],
    ["1'3\"", 381],
    ["1'-6\"", 457.2],
    ['2 ft', 609.6],
    ['400 mm', 400],
    ['40cm', 400],
    ['0.5 m', 500],
    ['17-1/2"', 444.5],
    ['7/8"', 22.225],
    ['.5"', 12.7],
    ['12,5 mm', 12.5],
    ['15\u2033', 381],
  ])('%s is %f mm', (text, expected) => {
    expect(mm(text, 'in')).toBeCloseTo(expected, 9)
  })

  it('reads a bare number in the default unit', () => {
    expect(mm('12', 'in')).toBeCloseTo(304.8, 9)
    expect(mm('12', 'mm')).toBe(12)
    expect(mm('15 7/8', 'in')).toBeCloseTo(403.225, 9)
  })

  it.each(['', 'abc', '3/0"', '-5', '1 2 3', '15--7/8', '1e5', 'mm', "'"])('gives a message for %j', (text) => {
    const r = parseLength(text)
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.message.length).toBeGreaterThan(10)
  })

  it('never returns NaN or an infinite length for any text', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 16 }), (text) => {
        const r = parseLength(text)
        return r.ok ? Number.isFinite(r.mm) && r.mm >= 0 : r.message.length > 0
      }),
      { numRuns: 3000 },
    )
  })
})

describe('formatting', () => {
  it('writes inches with reduced sixteenths', () => {
    expect(formatInches(403.225)).toBe('15-7/8"')
    expect(formatInches(12.7)).toBe('1/2"')
    expect(formatInches(304.8)).toBe('12"')
    expect(formatInches(0.1)).toBe('0"')
    expect(formatInches(-3.175)).toBe('-1/8"')
  })
  it('rounds to the nearest sixteenth or thirty-second', () => {
    // 10.03 in lies nearer 10 than 10-1/16; 10.02 in is nearer 10-1/32 than 10.
    expect(formatInches(inchesToMm(10.03))).toBe('10"')
    expect(formatInches(inchesToMm(10.02), { denominator: 32 })).toBe('10-1/32"')
    expect(formatInches(inchesToMm(15.84375), { denominator: 32 })).toBe('15-27/32"')
  })
  it('writes feet and inches on request', () => {
    expect(formatInches(393.7, { feet: true })).toBe(`1' 3-1/2"`)
    expect(formatInches(304.8, { feet: true })).toBe(`1' 0"`)
    expect(formatInches(203.2, { feet: true })).toBe('8"')
  })
  it('writes millimetres to the nearest half millimetre', () => {
    expect(formatMillimetres(403.225)).toBe('403 mm')
    expect(formatMillimetres(12.26)).toBe('12.5 mm')
    expect(formatMillimetres(12.24)).toBe('12 mm')
    expect(formatMillimetres(7.3, { step: 0.1, suffix: false })).toBe('7.3')
  })
  it('round-trips every sixteenth up to 8 ft exactly through text', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 96 * 16 }), fc.boolean(), (sixteenths, feet) => {
        const value = inchesToMm(sixteenths / 16)
        const text = formatInches(value, { feet })
        const back = parseLength(text)
        return back.ok && Math.abs(back.mm - value) < 1e-9
      }),
      { numRuns: 2000 },
    )
  })
})

describe('thousands separators and feet-and-inches slips', () => {
  // 1 in = 25.4 mm exactly (NIST SP 811). A comma before three digits groups thousands (common
  // English practice); it is never read as a decimal mark there.
  it.each([
    ['1,219 mm', 1219],
    ['1,219', 1219],
    ['1,219.5 mm', 1219.5],
    ['12,000 mm', 12000],
    ['1,000 in', 25400],
  ])('reads %s as %d mm', (text, mm) => {
    const r = parseLength(text)
    expect(r.ok).toBe(true)
    if (r.ok) expect(r.mm).toBeCloseTo(mm, 9)
  })
  it('still reads a decimal comma that cannot be a thousands group', () => {
    const r = parseLength('0,125 in')
    expect(r.ok && r.mm).toBeCloseTo(3.175, 9)
  })
  it.each(['1,2,3 mm', '1,22.5 mm'])('refuses %s with a message about commas', (text) => {
    const r = parseLength(text)
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.message).toMatch(/comma/)
  })
  it(`refuses 1' 15" instead of taking it as 27 in, and says how to write it`, () => {
    const r = parseLength(`1' 15"`)
    expect(r.ok).toBe(false)
    if (!r.ok) {
      expect(r.message).toMatch(/less than 12/)
      expect(r.message).toContain(`2' 3"`)
    }
    const fine = parseLength(`1' 11-7/8"`)
    expect(fine.ok && fine.mm).toBeCloseTo(23.875 * 25.4, 9)
  })
})

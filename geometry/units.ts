// Lengths as shops write them. Everything inside the library is millimetres;
// these helpers turn trade notation (15-7/8", 1' 3-1/2", 400 mm) into
// millimetres and back, exactly: the inch is 25.4 mm by definition, so no
// round trip drifts.

export const MM_PER_INCH = 25.4
export const MM_PER_FOOT = 12 * MM_PER_INCH

export type LengthUnit = 'mm' | 'cm' | 'm' | 'in' | 'ft'

export type ParseResult = { ok: true; mm: number } | { ok: false; message: string }

export interface ParseOptions {
  /** Unit of a bare number such as `400` or `15 7/8`. Default `mm`. */
  defaultUnit?: LengthUnit
}

// Multiplying by 254 and dividing by 10 keeps 15.875 in at 403.225 mm instead
// of 403.22499999999997: both steps are exact or correctly rounded once.
export function inchesToMm(inches: number): number {
  return (inches * 254) / 10
}

function toMm(value: number, unit: LengthUnit): number {
  switch (unit) {
    case 'mm': return value
    case 'cm': return value * 10
    case 'm': return value * 1000
    case 'in': return inchesToMm(value)
    case 'ft': return inchesToMm(value * 12)
  }
}

export function mmToInches(mm: number): number {
  return mm / MM_PER_INCH
}

const NUM = String.raw`(?:\d+(?:\.\d*)?|\.\d+)`
// A whole number and a fraction joined by a dash or a space ("15-7/8", "15 7/8"),
// a bare fraction, or a decimal.
const AMOUNT = String.raw`(?:${NUM}\s*(?:-|\s)\s*\d+\s*/\s*\d+|\d+\s*/\s*\d+|${NUM})`
const INCH_MARK = String.raw`(?:"|in\.?|inch|inches)`
const FOOT_MARK = String.raw`(?:'|ft\.?|foot|feet)`

const METRIC_RE = new RegExp(String.raw`^(${NUM})\s*(mm|millimet(?:er|re)s?|cm|centimet(?:er|re)s?|m|met(?:er|re)s?)$`)
const FEET_RE = new RegExp(String.raw`^(${AMOUNT})\s*${FOOT_MARK}(?:\s*-?\s*(${AMOUNT})\s*${INCH_MARK}?)?$`)
const INCH_RE = new RegExp(String.raw`^(${AMOUNT})\s*${INCH_MARK}$`)
const PLAIN_RE = new RegExp(String.raw`^(${AMOUNT})$`)
const MIXED_RE = new RegExp(String.raw`^(${NUM})\s*(?:-|\s)\s*(\d+)\s*/\s*(\d+)$`)
const FRACTION_RE = /^(\d+)\s*\/\s*(\d+)$/

const EXAMPLES = `e.g. 15-7/8", 1' 3-1/2", 2 ft, 400 mm`

/** Reads an amount ("15-7/8", "7/8", "15.875"); null when a fraction has 0 below the line. */
function readAmount(text: string): number | null {
  const t = text.trim()
  const mixed = MIXED_RE.exec(t)
  if (mixed) {
    const den = Number(mixed[3])
    if (den === 0) return null
    return Number(mixed[1]) + Number(mixed[2]) / den
  }
  const fraction = FRACTION_RE.exec(t)
  if (fraction) {
    const den = Number(fraction[2])
    if (den === 0) return null
    return Number(fraction[1]) / den
  }
  return Number(t)
}

/** Digits grouped in threes by commas, as in 1,219 or 12,000.5: a thousands separator, never a decimal comma. */
const THOUSANDS_RE = /^[1-9]\d{0,2}(?:,\d{3})+(?:\.\d*)?(?![\d,])/

function normalise(input: string): string | { error: string } {
  let t = input.trim().toLowerCase()
  t = t.replace(/[\u2033\u201c\u201d]/g, '"').replace(/[\u2032\u2018\u2019]/g, "'").replace(/''/g, '"')
  const grouped = THOUSANDS_RE.exec(t)
  if (grouped) {
    t = grouped[0].replace(/,/g, '') + t.slice(grouped[0].length)
  } else if (/^\d+,\d+,/.test(t) || (t.includes('.') && /^\d+,/.test(t))) {
    return { error: `Cannot read "${input.trim()}": use commas only between groups of three digits (1,219 mm) or as the one decimal mark (12,5 mm).` }
  } else if (!t.includes('.')) {
    // A decimal comma ("12,5 mm", "0,125 in") is read as a point; three digits after
    // a leading 1-9 were taken as thousands above.
    t = t.replace(/^(\d+),(\d+)/, '$1.$2')
  }
  return t.replace(/\s+/g, ' ')
}

/** Parses a length in trade notation into millimetres. Never returns NaN: unreadable text gives a message. */
export function parseLength(input: string, options: ParseOptions = {}): ParseResult {
  const unit = options.defaultUnit ?? 'mm'
  const t = normalise(input)
  if (typeof t !== 'string') return { ok: false, message: t.error }
  if (t === '') return { ok: false, message: `Enter a length, ${EXAMPLES}.` }
  if (t.startsWith('-')) return { ok: false, message: 'A length cannot be negative.' }

  let mm: number | null = null
  let m: RegExpExecArray | null
  if ((m = METRIC_RE.exec(t))) {
    const u = m[2] ?? ''
    mm = toMm(Number(m[1]), u.startsWith('mm') || u.startsWith('milli') ? 'mm' : u.startsWith('c') ? 'cm' : 'm')
  } else if ((m = FEET_RE.exec(t))) {
    const feet = readAmount(m[1] ?? '')
    const inches = m[2] === undefined ? 0 : readAmount(m[2])
    mm = feet === null || inches === null ? null : inchesToMm(feet * 12 + inches)
    if (mm === null) return { ok: false, message: 'A fraction cannot have 0 below the line.' }
    // 1' 15" is a slip (a 1 for a 2, or inches typed as a total), not 27 in: say so rather than guess.
    if (inches !== null && inches >= 12) {
      return { ok: false, message: `After feet the inches must be less than 12: "${input.trim()}" has ${inches}". Write ${formatInches(mm, { feet: true, denominator: 64 })} or ${formatInches(mm, { denominator: 64 })} if that is what you mean.` }
    }
  } else if ((m = INCH_RE.exec(t))) {
    const inches = readAmount(m[1] ?? '')
    if (inches === null) return { ok: false, message: 'A fraction cannot have 0 below the line.' }
    mm = inchesToMm(inches)
  } else if ((m = PLAIN_RE.exec(t))) {
    const amount = readAmount(m[1] ?? '')
    if (amount === null) return { ok: false, message: 'A fraction cannot have 0 below the line.' }
    mm = toMm(amount, unit)
  }
  if (mm === null || !Number.isFinite(mm)) {
    return { ok: false, message: `Cannot read "${input.trim()}" as a length; ${EXAMPLES}.` }
  }
  return { ok: true, mm }
}

export interface InchFormatOptions {
  /** Round to this fraction of an inch: 2, 4, 8, 16, 32 or 64. Default 16. */
  denominator?: 2 | 4 | 8 | 16 | 32 | 64
  /** Write 12 in and over as feet and inches: `1' 3-1/2"`. Default false. */
  feet?: boolean
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b)
}

/** Formats millimetres as inches with a reduced fraction, e.g. 403.225 -> `15-7/8"`. */
export function formatInches(mm: number, options: InchFormatOptions = {}): string {
  const den = options.denominator ?? 16
  if (!Number.isFinite(mm)) return '?'
  const sign = mm < 0 ? '-' : ''
  const steps = Math.round((Math.abs(mm) / MM_PER_INCH) * den)
  if (steps === 0) return '0"'
  let whole = Math.floor(steps / den)
  const rest = steps % den
  const g = gcd(rest, den)
  const fraction = rest === 0 ? '' : `${rest / g}/${den / g}`
  let feet = ''
  if (options.feet && whole >= 12) {
    feet = `${Math.floor(whole / 12)}' `
    whole %= 12
  }
  const inches = whole === 0 && fraction ? fraction : fraction ? `${whole}-${fraction}` : `${whole}`
  return `${sign}${feet}${inches}"`
}

export interface MmFormatOptions {
  /** Round to this many millimetres. Default 0.5. */
  step?: number
  /** Append " mm". Default true. */
  suffix?: boolean
}

/** Formats millimetres rounded to a step, e.g. 403.225 -> `403 mm`, 12.26 -> `12.5 mm`. */
export function formatMillimetres(mm: number, options: MmFormatOptions = {}): string {
  const step = options.step ?? 0.5
  if (!Number.isFinite(mm)) return '?'
  const rounded = Math.round(mm / step) * step
  // Trim float noise from the rounding (0.1 * 3 = 0.30000000000000004) without fixing the decimals.
  const text = String(Number(rounded.toFixed(6)))
  return options.suffix === false ? text : `${text} mm`
}

/** Formats a length in the user's chosen system. */
export function formatLength(mm: number, system: 'in' | 'mm', options: InchFormatOptions & MmFormatOptions = {}): string {
  return system === 'in' ? formatInches(mm, options) : formatMillimetres(mm, options)
}

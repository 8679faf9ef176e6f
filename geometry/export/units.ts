// Length conversions and the way lengths are written on templates and in cut
// files. Everything inside the geometry library is millimetres.

import { MM_PER_INCH } from '../units'

/** PDF user space: 72 units per inch (ISO 32000-1, 8.3.2.3). */
export const PT_PER_INCH = 72
export const PT_PER_MM = PT_PER_INCH / MM_PER_INCH

/** The units a template or cut file is written in. */
export type ExportUnits = 'in' | 'mm'

export const EXPORT_UNITS: readonly ExportUnits[] = ['in', 'mm']

export function assertExportUnits(units: unknown): asserts units is ExportUnits {
  if (units !== 'in' && units !== 'mm') {
    throw new RangeError(`Unknown units ${JSON.stringify(units)}: use 'in' or 'mm'.`)
  }
}

/** Millimetres to the given unit. */
export function fromMm(mm: number, units: ExportUnits): number {
  return units === 'in' ? mm / MM_PER_INCH : mm
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b)
}

/**
 * A length as written on a template or cut file: inches as whole and fraction
 * to 1/32 when the value is within 0.002 in of one (shop tapes read in
 * fractions), otherwise three decimals; millimetres to 0.1. Unlike the
 * editor's formatter it never rounds to a fraction silently, because a
 * template is measured from.
 */
export function formatShopLength(mm: number, units: ExportUnits, withUnit = true): string {
  if (units === 'mm') {
    const text = (Math.round(mm * 10) / 10).toFixed(1).replace(/\.0$/, '')
    return withUnit ? `${text} mm` : text
  }
  const inches = mm / MM_PER_INCH
  const negative = inches < 0
  const abs = Math.abs(inches)
  const thirtySeconds = Math.round(abs * 32)
  let text: string
  if (Math.abs(abs - thirtySeconds / 32) <= 0.002) {
    const whole = Math.floor(thirtySeconds / 32)
    const rest = thirtySeconds % 32
    if (rest === 0) text = `${whole}`
    else {
      const g = gcd(rest, 32)
      const fraction = `${rest / g}/${32 / g}`
      text = whole === 0 ? fraction : `${whole}-${fraction}`
    }
  } else {
    text = abs.toFixed(3)
  }
  if (negative) text = `-${text}`
  return withUnit ? `${text} in` : text
}

/**
 * A length to mark with a tape: inches to the nearest 1/32 as whole and
 * fraction (`7-3/16 in`, never `7.180 in`), millimetres to the nearest 0.5.
 * For marks measured off a tape, where a drawing is also full size to check
 * against; 1/32 in is under 1 mm, finer than a pencil line.
 */
export function formatTapeLength(mm: number, units: ExportUnits, withUnit = true): string {
  if (!Number.isFinite(mm)) return '?'
  if (units === 'mm') {
    const text = String(Math.round(mm * 2) / 2)
    return withUnit ? `${text} mm` : text
  }
  const negative = mm < 0
  const steps = Math.round((Math.abs(mm) / MM_PER_INCH) * 32)
  const whole = Math.floor(steps / 32)
  const rest = steps % 32
  let text: string
  if (rest === 0) text = `${whole}`
  else {
    const g = gcd(rest, 32)
    const fraction = `${rest / g}/${32 / g}`
    text = whole === 0 ? fraction : `${whole}-${fraction}`
  }
  if (negative && steps > 0) text = `-${text}`
  return withUnit ? `${text} in` : text
}

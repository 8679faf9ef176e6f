// Masses and forces in the reader's units: pounds and pound-force beside
// inches, kilograms and newtons beside millimetres.

import { KG_PER_LB } from './unit-params'
import { STANDARD_GRAVITY } from './stability'

export type UnitSystem = 'in' | 'mm'

/** Newtons in a pound-force: 0.45359237 kg x 9.80665 m/s2, exact by definition. */
export const N_PER_LBF = KG_PER_LB * STANDARD_GRAVITY

function trim(n: number, digits: number): string {
  return String(Number(n.toFixed(digits)))
}

export function formatMass(kg: number, system: UnitSystem): string {
  if (!Number.isFinite(kg)) return '?'
  return system === 'in' ? `${trim(kg / KG_PER_LB, 1)} lb` : `${trim(kg, 1)} kg`
}

export function formatForce(newtons: number, system: UnitSystem): string {
  if (!Number.isFinite(newtons)) return 'no push'
  return system === 'in' ? `${trim(newtons / N_PER_LBF, 1)} lbf` : `${trim(newtons, 0)} N`
}

export function formatAngle(degrees: number): string {
  return Number.isFinite(degrees) ? `${degrees.toFixed(1)}°` : '?'
}

/**
 * The number part of a typed mass: `2,500` and `1,234.5` (commas between
 * groups of three digits) are thousands; a single comma followed by one, two
 * or four and more digits (`2,5`) is a decimal comma. Anything else is not a
 * number: never guessed.
 */
function readNumber(text: string): number | null {
  if (/^\d{1,3}(,\d{3})+(\.\d*)?$/.test(text)) return Number(text.replace(/,/g, ''))
  if (/^\d+,(\d{1,2}|\d{4,})$/.test(text)) return Number(text.replace(',', '.'))
  if (/^(\d+(\.\d*)?|\.\d+)$/.test(text)) return Number(text)
  return null
}

/**
 * Reads a mass typed in the user's units ("12", "12 lb", "5.4 kg", "2,500 lb");
 * kilograms out. A bare number is in the system's unit: pounds with inches,
 * kilograms with millimetres (kilograms when no system is given).
 */
export function parseMass(text: string, system: UnitSystem = 'mm'): { ok: true; kg: number } | { ok: false; message: string } {
  const m = /^\s*([\d.,]+)\s*(kg|kgs|kilograms?|lb|lbs|pounds?|#)?\s*$/i.exec(text)
  const value = m ? readNumber(m[1]!) : null
  if (!m || value === null || !Number.isFinite(value)) return { ok: false, message: system === 'in' ? 'Enter a weight, e.g. 25 lb or 11 kg.' : 'Enter a weight, e.g. 11 kg or 25 lb.' }
  const unit = (m[2] ?? (system === 'in' ? 'lb' : 'kg')).toLowerCase()
  return { ok: true, kg: unit.startsWith('k') ? value : value * KG_PER_LB }
}

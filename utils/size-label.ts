// What a design's size reads as: its label and the tube of its latest
// revision. The label is the crew's word for the size ("Medium"); the tube
// comes from the saved shape, so it cannot go stale. A label that already
// names the tube's size is not repeated; one that names another length is
// shown with the real tube, marked as not matching.
import { parseLength } from '~~/geometry/core'

/** Half an inch: closer than this, a length in the label is taken to name the tube. */
const SAME_TUBE_MM = 12.7

/** The first length written in a label (`16 in`, `16"`, `15-7/8 in`, `400 mm`), in mm, or null. */
export function labelLength(label: string): { text: string; mm: number } | null {
  const m = label.match(/(\d+(?:[.,]\d+)?(?:[- ]\d+\/\d+)?)\s*(in\b|inch|"|mm\b)/i)
  if (!m) return null
  const read = parseLength(`${m[1]!.replace(',', '.')} ${/mm/i.test(m[2]!) ? 'mm' : 'in'}`)
  return read.ok ? { text: m[0], mm: read.mm } : null
}

export interface SizeText { label: string | null; tube: string | null; mismatch: boolean }

export function sizeText(label: string | null | undefined, tubeMm: number | null | undefined, format: (mm: number) => string): SizeText {
  const tube = typeof tubeMm === 'number' && Number.isFinite(tubeMm) ? tubeMm : null
  const said = label ? labelLength(label) : null
  if (label && said && tube !== null && Math.abs(said.mm - tube) <= SAME_TUBE_MM) return { label, tube: null, mismatch: false }
  return { label: label || null, tube: tube === null ? null : `${format(tube)} tube`, mismatch: !!(said && tube !== null) }
}

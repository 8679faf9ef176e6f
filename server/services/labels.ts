import fontkit from '@pdf-lib/fontkit'
import { PDFDocument, rgb } from 'pdf-lib'
import QRCode from 'qrcode'
import { unpackWoff } from '../../geometry/export/fonts'
import { unitKindLabels, unitStatusLabels, type UnitKind, type UnitStatus } from '../../shared/utils/units'
import { invalid } from '../utils/validation'

export interface LabelItem { id: string; label: string; kind: UnitKind; status: UnitStatus; designName: string | null; revisionNumber: number | null; sizeLabel: string | null }

const PT = 72 // points per inch (ISO 32000-1, 8.3.2.3)
// US Letter, two columns of five 3.75 x 2 in labels inside half-inch margins.
const PAGE = { width: 8.5 * PT, height: 11 * PT }
const CELL = { width: 3.75 * PT, height: 2 * PT, cols: 2, rows: 5 }
const MARGIN = { x: (PAGE.width - 2 * 3.75 * PT) / 2, y: (PAGE.height - 5 * 2 * PT) / 2 }
const QR_SIZE = 1.6 * PT

/**
 * The most labels one sheet request prints: 20 Letter pages of ten. Our own
 * choice, the same as the most units one may tick at once; a register larger
 * than that prints in parts (a filter, or chosen units). The sheet is drawn on
 * an export worker, never on the server's own thread.
 */
export const MAX_LABELS_PER_SHEET = 200

/** A 422 when a request would print more labels than one sheet takes. */
export function refuseTooManyLabels(count: number): void {
  if (count <= MAX_LABELS_PER_SHEET) return
  invalid(
    { ids: `These would be ${count} labels; one sheet prints at most ${MAX_LABELS_PER_SHEET}. Narrow the list (by stage, kind, design or search) or tick the units to print.` },
    `Too many labels: ${count}, at most ${MAX_LABELS_PER_SHEET}`,
  )
}

/** The address a label's code opens: the unit's own page. */
export const unitPageUrl = (origin: string, id: string) => `${origin.replace(/\/$/, '')}/units/${id}`

/**
 * A sheet of labels to stick on plates and patterns: each with a QR code
 * (drawn as vector squares, so it prints sharp at any size) that opens the
 * unit's page, its label in large type, and what it was built from.
 */
export async function renderLabelSheet(items: LabelItem[], options: { origin: string; font: Uint8Array }): Promise<Uint8Array> {
  const doc = await PDFDocument.create()
  doc.registerFontkit(fontkit)
  doc.setTitle('Rootplate unit labels')
  const font = await doc.embedFont(await unpackWoff(options.font), { subset: true })
  const perPage = CELL.cols * CELL.rows
  for (let start = 0; start < Math.max(items.length, 1); start += perPage) {
    const page = doc.addPage([PAGE.width, PAGE.height])
    items.slice(start, start + perPage).forEach((item, i) => {
      const col = i % CELL.cols
      const row = Math.floor(i / CELL.cols)
      const x0 = MARGIN.x + col * CELL.width
      const y0 = PAGE.height - MARGIN.y - (row + 1) * CELL.height
      // Cut guide around each label.
      page.drawRectangle({ x: x0, y: y0, width: CELL.width, height: CELL.height, borderColor: rgb(0.75, 0.75, 0.75), borderWidth: 0.5 })
      const qr = QRCode.create(unitPageUrl(options.origin, item.id), { errorCorrectionLevel: 'M' })
      const n = qr.modules.size
      const quiet = 4 // the quiet zone the QR standard (ISO/IEC 18004) asks for, in modules
      const module = QR_SIZE / (n + 2 * quiet)
      const qx = x0 + 0.1 * PT
      const qy = y0 + (CELL.height - QR_SIZE) / 2
      for (let r = 0; r < n; r++) {
        for (let c = 0; c < n; c++) {
          if (!qr.modules.get(r, c)) continue
          page.drawRectangle({ x: qx + (quiet + c) * module, y: qy + QR_SIZE - (quiet + r + 1) * module, width: module, height: module, color: rgb(0, 0, 0) })
        }
      }
      const tx = qx + QR_SIZE + 0.08 * PT
      const maxWidth = x0 + CELL.width - tx - 0.1 * PT
      const fit = (text: string, size: number) => {
        let t = text
        while (t.length > 1 && font.widthOfTextAtSize(t, size) > maxWidth) t = `${t.slice(0, -2)}…`
        return t
      }
      // The label is what people read across the shop: as large as fits, down to 11 pt.
      let size = 22
      while (size > 11 && font.widthOfTextAtSize(item.label, size) > maxWidth) size -= 1
      page.drawText(fit(item.label, size), { x: tx, y: y0 + CELL.height - 0.45 * PT, size, font })
      const lines = [
        unitKindLabels[item.kind],
        item.designName ?? '',
        [item.revisionNumber ? `built from r${item.revisionNumber}` : '', item.sizeLabel ?? ''].filter(Boolean).join(' · '),
        `Stage when printed: ${unitStatusLabels[item.status]}`,
      ].filter(Boolean)
      lines.forEach((line, k) => page.drawText(fit(line, 9), { x: tx, y: y0 + CELL.height - 0.75 * PT - k * 13, size: 9, font, color: rgb(0.25, 0.25, 0.25) }))
    })
    if (!items.length) page.drawText('No units or patterns matched.', { x: MARGIN.x, y: PAGE.height - MARGIN.y - 20, size: 12, font })
  }
  return doc.save()
}

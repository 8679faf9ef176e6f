// Skirt strips on the server: the station marks added to the plate and tube
// wrap templates, and the full-size rib profile template.
import { z } from 'zod'
import { skirtStrips, type Plate } from '../../geometry'
import { plateStationMarks, wrapStripMarks, renderSkirtProfilesPdf, exportFileName, PAPER_NAMES, type ExtraMarks, type FontBytes, type PaperName } from '../../geometry/export'

/** The revision fields the exports read (the same shape as the exports service's). */
interface RevisionForExport { number: number; designName: string; sizeLabel: string | null; createdAt: Date }

const mm = (max: number) => z.coerce.number({ error: 'Must be a number of millimetres' }).min(0, 'Must not be negative').max(max, `Must be at most ${max} mm`)

export const skirtProfilesQuerySchema = z.object({
  paper: z.enum(PAPER_NAMES as [PaperName, ...PaperName[]], { error: `Paper must be one of: ${PAPER_NAMES.join(', ')}` }).default('letter'),
  orientation: z.enum(['auto', 'portrait', 'landscape'], { error: 'Orientation must be auto, portrait or landscape' }).default('auto'),
  overlap: mm(50).optional(),
  margin: mm(30).optional(),
  units: z.enum(['in', 'mm'], { error: 'Units must be in or mm' }).default('in'),
})

/** Station marks for the two templates; none when the strips cannot be worked out (the templates still print). */
export function skirtMarks(plate: Plate, wrapHeight = 152.4, units: 'in' | 'mm' = 'in'): { plate: ExtraMarks[]; wrap: ExtraMarks[] } {
  try {
    const { strips } = skirtStrips(plate)
    return { plate: [plateStationMarks(strips)], wrap: [wrapStripMarks(plate, strips, wrapHeight, units)] }
  }
  catch {
    return { plate: [], wrap: [] }
  }
}

export function skirtProfilesPdf(plate: Plate, revision: RevisionForExport, q: z.output<typeof skirtProfilesQuerySchema>, font: FontBytes) {
  return renderSkirtProfilesPdf(plate, {
    paper: q.paper,
    orientation: q.orientation,
    overlap: q.overlap,
    margin: q.margin,
    units: q.units,
    meta: { designName: revision.designName, sizeLabel: revision.sizeLabel ?? undefined, revision: revision.number, date: revision.createdAt.toISOString().slice(0, 10) },
    font,
  })
}

export function skirtProfilesFileName(revision: RevisionForExport): string {
  return exportFileName({ designName: revision.designName, sizeLabel: revision.sizeLabel ?? undefined, revision: revision.number }, 'pdf').replace(/\.pdf$/, '-skirt-profiles.pdf')
}

import { z } from 'zod'
import { renderBuildSheetPdf, exportFileName, type FontBytes } from '../../geometry/export'
import type { Plate } from '../../geometry'
import type { RevisionForExport } from './exports'

export const buildSheetQuerySchema = z.object({
  units: z.enum(['in', 'mm'], { error: 'Units must be in or mm' }).default('in'),
  paper: z.enum(['letter', 'a4'], { error: 'Paper must be letter or a4' }).optional(),
})

/** The revision fields the build sheet reads: the export fields and who saved it. */
export interface BuildSheetRevision extends RevisionForExport { author: string | null }

function sheetMeta(revision: BuildSheetRevision) {
  return {
    designName: revision.designName,
    sizeLabel: revision.sizeLabel ?? undefined,
    revision: revision.number,
    date: revision.createdAt.toISOString().slice(0, 10),
    author: revision.author,
  }
}

/** The build sheet of a revision's rebuilt plate (run by the export pool: no database here). */
export function buildSheetPdf(plate: Plate, revision: BuildSheetRevision, q: z.output<typeof buildSheetQuerySchema>, font: FontBytes): Promise<Uint8Array> {
  return renderBuildSheetPdf(plate, { units: q.units, paper: q.paper, meta: sheetMeta(revision), font })
}

export function buildSheetFileName(revision: BuildSheetRevision): string {
  return exportFileName(sheetMeta(revision), 'pdf').replace(/\.pdf$/, '-build-sheet.pdf')
}

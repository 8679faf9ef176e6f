import { z } from 'zod'
import { renderBuildSheetPdf, exportFileName, type FontBytes } from '../../geometry/export'
import type { Database } from '../utils/db'
import { invalid, notFound } from '../utils/validation'
import { getRevision } from './designs'
import { plateFromRevision } from './exports'

export const buildSheetQuerySchema = z.object({
  units: z.enum(['in', 'mm'], { error: 'Units must be in or mm' }).default('in'),
  paper: z.enum(['letter', 'a4'], { error: 'Paper must be letter or a4' }).optional(),
})

export interface BuildSheetFile { pdf: Uint8Array; fileName: string }

/** The build sheet of one revision of the member's shop, rebuilt from its stored params. */
export async function buildSheet(db: Database, shopId: string, revisionId: string, q: z.output<typeof buildSheetQuerySchema>, font: FontBytes): Promise<BuildSheetFile> {
  const revision = await getRevision(db, shopId, revisionId)
  if (!revision) throw notFound('That revision')
  const built = plateFromRevision({ ...revision, params: revision.params })
  if (!built.ok) invalid(built.fields, 'This revision was saved with params that no longer pass the checks; open it in the editor and save it again')
  const meta = {
    designName: revision.designName,
    sizeLabel: revision.sizeLabel ?? undefined,
    revision: revision.number,
    date: revision.createdAt.toISOString().slice(0, 10),
    author: revision.author.name,
  }
  const pdf = await renderBuildSheetPdf(built.plate, { units: q.units, paper: q.paper, meta, font })
  return { pdf, fileName: exportFileName(meta, 'pdf').replace(/\.pdf$/, '-build-sheet.pdf') }
}

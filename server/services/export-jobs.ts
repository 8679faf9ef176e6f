// One export (or other costly job: a sheet plan and its files, a label sheet,
// the figures of a show's plates), described as plain data so that it can be
// posted to a worker thread and run there (server/workers/export-worker.ts) or,
// without a worker, in the server's own thread. Nothing here may use Nitro's
// auto-imports or the database: the worker bundle holds only this module, the
// services it names and the geometry. Errors are thrown as h3 errors (422 with field messages) and
// carried back across the thread as data.
import type { z } from 'zod'
import { PAPERS, tilePlate, planTubeWrap, type FontBytes } from '../../geometry/export'
import { invalid } from '../utils/validation'
import {
  plateFromRevision, templatePdf, tubeWrapPdf, cutDxf, cutSvg,
  type RevisionForExport, type templateQuerySchema, type tubeWrapQuerySchema, type cutQuerySchema,
} from './exports'
import { buildSheetPdf, type BuildSheetRevision, type buildSheetQuerySchema } from './build-sheet'
import { skirtProfilesPdf, type skirtProfilesQuerySchema } from './skirt'
import { nestPlanJob, planDxfJob, planPdfJob, type PlanJobEntry, type PlanSettingsInput } from './sheet-plan-jobs'
import { renderLabelSheet, type LabelItem } from './labels'
import { plateFigures } from './plate-figures'

/**
 * The most sheets one tiled PDF may have. Our own choice: 200 Letter sheets
 * cover about 7 m2 of plate with their overlaps, far past a plate that fits a
 * 4x8 ft panel, and taping more than that by hand is not a template any shop
 * would use; the largest plate the params allow needs over 900 on Letter.
 */
export const MAX_TEMPLATE_SHEETS = 200

export type ExportJob =
  | { kind: 'template'; revision: RevisionForExport; query: z.output<typeof templateQuerySchema>; font: FontBytes }
  | { kind: 'tube-wrap'; revision: RevisionForExport; query: z.output<typeof tubeWrapQuerySchema>; font: FontBytes }
  | { kind: 'cut-dxf'; revision: RevisionForExport; query: z.output<typeof cutQuerySchema> }
  | { kind: 'cut-svg'; revision: RevisionForExport; query: z.output<typeof cutQuerySchema> }
  | { kind: 'build-sheet'; revision: BuildSheetRevision; query: z.output<typeof buildSheetQuerySchema>; font: FontBytes }
  | { kind: 'skirt-profiles'; revision: RevisionForExport; query: z.output<typeof skirtProfilesQuerySchema>; font: FontBytes }

  | { kind: 'sheet-plan'; entries: PlanJobEntry[]; settings: PlanSettingsInput; timeLimit: number }
  // `plan` is the nested plan's JSON text; `planKey` names it for the cache in its place.
  | { kind: 'sheet-plan-pdf'; entries: PlanJobEntry[]; plan: string; planKey: string; units: 'in' | 'mm'; font: FontBytes }
  | { kind: 'sheet-plan-dxf'; entries: PlanJobEntry[]; plan: string; planKey: string; index: number; units: 'in' | 'mm'; openings: 'routed' | 'hole-saw' }
  | { kind: 'labels'; items: LabelItem[]; origin: string; font: FontBytes }
  | { kind: 'plate-figures'; revisions: { id: string; params: unknown }[] }

export type ExportKind = ExportJob['kind']

/** A 422 on `paper` when a tiled file would need more sheets than anyone would tape together. */
export function refuseTooManySheets(sheets: number, paper: keyof typeof PAPERS, what: string): void {
  if (sheets <= MAX_TEMPLATE_SHEETS) return
  const label = PAPERS[paper].label
  invalid(
    { paper: `This ${what} would print on ${sheets} ${label} sheets; the most one file holds is ${MAX_TEMPLATE_SHEETS}. Choose a larger paper (Tabloid, A3) or a plotter roll (24 in or 36 in), or send the cut file to a CNC router.` },
    `Too many sheets: ${sheets} ${label} sheets, at most ${MAX_TEMPLATE_SHEETS}`,
  )
}

/** Builds the plate from the stored params and writes the file (or runs the other costly work). */
export async function runExportJob(job: ExportJob): Promise<Uint8Array | string> {
  switch (job.kind) {
    case 'sheet-plan': return nestPlanJob(job.entries, job.settings, job.timeLimit)
    case 'sheet-plan-pdf': return planPdfJob(job.entries, job.plan, job.units, job.font)
    case 'sheet-plan-dxf': return planDxfJob(job.entries, job.plan, job.index, job.units, job.openings)
    case 'labels': return renderLabelSheet(job.items, { origin: job.origin, font: job.font })
    case 'plate-figures': return JSON.stringify(Object.fromEntries(job.revisions.map(r => [r.id, plateFigures(r.params)])))
  }
  const built = plateFromRevision(job.revision)
  if (!built.ok) invalid(built.fields, 'This revision was saved with params that no longer pass the checks; open it in the editor and save it again')
  const plate = built.plate
  switch (job.kind) {
    case 'template': {
      const q = job.query
      // The router pattern lies inside the outline, so the plate alone decides the tiling.
      const tiling = tilePlate(plate, {
        paper: q.paper,
        orientation: q.orientation,
        ...(q.margin !== undefined ? { margin: q.margin } : {}),
        ...(q.overlap !== undefined ? { overlap: q.overlap } : {}),
      })
      refuseTooManySheets(tiling.printed, q.paper, 'template')
      return templatePdf(plate, job.revision, q, job.font)
    }
    case 'tube-wrap': {
      const q = job.query
      const { tiling } = planTubeWrap(plate, {
        paper: q.paper,
        orientation: q.orientation,
        ...(q.margin !== undefined ? { margin: q.margin } : {}),
        ...(q.overlap !== undefined ? { overlap: q.overlap } : {}),
        ...(q.height !== undefined ? { height: q.height } : {}),
        units: q.units,
      })
      refuseTooManySheets(tiling.printed, q.paper, 'tube wrap')
      return tubeWrapPdf(plate, job.revision, q, job.font)
    }
    case 'cut-dxf': return cutDxf(plate, job.query, job.revision)
    case 'cut-svg': return cutSvg(plate, job.query)
    case 'build-sheet': return buildSheetPdf(plate, job.revision, job.query, job.font)
    case 'skirt-profiles': return skirtProfilesPdf(plate, job.revision, job.query, job.font)
  }
}

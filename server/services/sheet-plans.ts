// Sheet plans: the designs' latest revisions are loaded here, on the server's
// thread (a few rows); the nesting and the plan's files are costly and run as
// jobs on the export worker pool (sheet-plan-jobs.ts), within the member's
// limit of costly work and cached with the other jobs.
import { and, eq, inArray } from 'drizzle-orm'
import { plateParamsSchema } from '../../geometry'
import type { FontBytes } from '../../geometry/export'
import type { Database } from '../utils/db'
import { latestRevisionOf } from './designs'
import { designs, revisions } from '../database/schema'
import { invalid, notFound } from '../utils/validation'
import type { SheetPlanRequest } from '../../shared/utils/sheet-plans'
import type { ExportJob } from './export-jobs'
import type { ExportResult } from './export-runner'
import { splitPlanTexts, type PlanJobEntry } from './sheet-plan-jobs'

/** The longest one plan may nest, ms. */
const TIME_LIMIT = Number(process.env.SHEET_PLAN_TIME_LIMIT_MS ?? 20_000)

/** Runs a costly job for the member asking (server/utils/exports.ts runCostly). */
export type RunJob = (job: ExportJob) => Promise<ExportResult>

async function loadEntries(db: Database, shopId: string, input: SheetPlanRequest): Promise<PlanJobEntry[]> {
  const ids = input.items.map(i => i.designId)
  const rows = await db
    .select({ id: designs.id, name: designs.name, sizeLabel: designs.sizeLabel, revision: revisions.number, params: revisions.params })
    .from(designs)
    .innerJoin(revisions, latestRevisionOf)
    .where(and(eq(designs.shopId, shopId), inArray(designs.id, ids)))
  const byId = new Map(rows.map(r => [r.id, r]))
  return input.items.map((item, i) => {
    const row = byId.get(item.designId)
    if (!row) throw notFound(`Design ${i + 1} of the plan`)
    const parsed = plateParamsSchema.safeParse(row.params)
    if (!parsed.success) invalid({ [`items.${i}.designId`]: `${row.name} was saved with params that no longer pass the checks; open it and save it again` })
    return { designId: row.id, revision: row.revision, name: row.name, size: row.sizeLabel, params: parsed.data, count: item.count }
  })
}

/**
 * Nests the plan on a worker. Plans are pure functions of the request and the
 * designs' latest revisions, so the page's plan, then its PDF and DXF, find the
 * nesting in the runner's cache rather than nesting again.
 */
async function nested(db: Database, shopId: string, input: SheetPlanRequest, run: RunJob) {
  const entries = await loadEntries(db, shopId, input)
  const settings = { sheet: input.sheet, workflow: input.workflow, grain: input.grain }
  const { body } = await run({ kind: 'sheet-plan', entries, settings, timeLimit: TIME_LIMIT })
  // Revisions never change: the designs' revisions, names, counts and the settings name the plan.
  const planKey = JSON.stringify([entries.map(e => [e.designId, e.revision, e.name, e.size, e.count]), settings])
  return { entries, planKey, ...splitPlanTexts(body as string) }
}

/** The plan as the page shows it (figures, parts drawn thin), as JSON text ready to send. */
export async function sheetPlan(db: Database, shopId: string, input: SheetPlanRequest, run: RunJob): Promise<string> {
  return (await nested(db, shopId, input, run)).view
}

function fileStem(input: SheetPlanRequest): string {
  return `sheet-plan-${input.workflow}`
}

export async function sheetPlanPdf(db: Database, shopId: string, input: SheetPlanRequest & { units: 'in' | 'mm' }, font: FontBytes, run: RunJob) {
  const { entries, plan, planKey } = await nested(db, shopId, input, run)
  const { body } = await run({ kind: 'sheet-plan-pdf', entries, plan, planKey, units: input.units, font })
  return { pdf: body as Uint8Array, fileName: `${fileStem(input)}.pdf` }
}

export async function sheetPlanDxf(db: Database, shopId: string, input: SheetPlanRequest & { units: 'in' | 'mm'; index: number; openings?: 'routed' | 'hole-saw' }, run: RunJob) {
  const { entries, plan, planKey } = await nested(db, shopId, input, run)
  const { body } = await run({ kind: 'sheet-plan-dxf', entries, plan, planKey, index: input.index, units: input.units, openings: input.openings ?? 'routed' })
  return { dxf: body as string, fileName: `${fileStem(input)}-${input.index + 1}.dxf` }
}

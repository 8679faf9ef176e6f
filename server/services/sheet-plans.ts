import { and, eq, inArray } from 'drizzle-orm'
import { buildPlate, plateParamsSchema, type Plate, type Point } from '../../geometry'
import {
  planSheetsAsync,
  renderLayoutDxf,
  renderLayoutPdf,
  PlatePlanTooLargeError,
  NestTimeoutError,
  type PlanEntry,
  type SheetPlan,
} from '../../geometry/nest'
import { thinRing } from '../../geometry/math/offset'
import type { FontBytes } from '../../geometry/export'
import type { Database } from '../utils/db'
import { latestRevisionOf } from './designs'
import { designs, revisions } from '../database/schema'
import { invalid, notFound } from '../utils/validation'
import type { SheetPlanRequest } from '../../shared/utils/sheet-plans'

/** The longest one plan may nest, ms. */
const TIME_LIMIT = Number(process.env.SHEET_PLAN_TIME_LIMIT_MS ?? 20_000)
/** 1 US gallon = 231 in3 = 3.785411784 L (NIST Handbook 44). */
const MM3_PER_US_GALLON = 231 * 25.4 ** 3

interface Loaded {
  plan: SheetPlan
  entries: (PlanEntry & { designId: string; revision: number })[]
}

async function loadEntries(db: Database, shopId: string, input: SheetPlanRequest) {
  const ids = input.items.map((i) => i.designId)
  const rows = await db
    .select({ id: designs.id, name: designs.name, sizeLabel: designs.sizeLabel, revision: revisions.number, params: revisions.params })
    .from(designs)
    .innerJoin(revisions, latestRevisionOf)
    .where(and(eq(designs.shopId, shopId), inArray(designs.id, ids)))
  const byId = new Map(rows.map((r) => [r.id, r]))
  return input.items.map((item, i) => {
    const row = byId.get(item.designId)
    if (!row) throw notFound(`Design ${i + 1} of the plan`)
    const parsed = plateParamsSchema.safeParse(row.params)
    if (!parsed.success) invalid({ [`items.${i}.designId`]: `${row.name} was saved with params that no longer pass the checks; open it and save it again` })
    return { designId: row.id, revision: row.revision, name: row.name, size: row.sizeLabel, params: parsed.data, count: item.count }
  })
}

// Plans are pure functions of the request and the designs' latest revisions: the page asks
// for the plan, then its PDF and DXF, so the last few are kept rather than nested again.
const cache = new Map<string, Promise<Loaded>>()
const CACHE_SIZE = 12

async function plan(entries: Loaded['entries'], input: SheetPlanRequest): Promise<SheetPlan> {
  try {
    // In steps, handing the thread back between them: other requests are answered meanwhile.
    return await planSheetsAsync(entries, { sheet: input.sheet, workflow: input.workflow, grain: input.grain, timeLimit: TIME_LIMIT })
  } catch (e) {
    if (e instanceof PlatePlanTooLargeError) {
      const entry = entries[e.entry]!
      const fmt = (mm: number) => `${Math.round(mm)} mm (${(mm / 25.4).toFixed(1)} in)`
      invalid({
        [`items.${e.entry}.designId`]: `${entry.name}${entry.size ? ` (${entry.size})` : ''} is ${fmt(e.cause.size.width)} x ${fmt(e.cause.size.height)} at its best turn: larger than the ${fmt(e.cause.room.width)} x ${fmt(e.cause.room.height)} inside the sheet's edge margin. Choose a larger sheet or a smaller margin.`,
      }, 'A plate is larger than the sheet')
    }
    if (e instanceof NestTimeoutError) {
      invalid({ items: `Nesting stopped after ${TIME_LIMIT / 1000} s with ${e.placed} of ${e.total} parts placed; plan fewer plates at once.` }, 'The plan took too long')
    }
    throw e
  }
}

async function loadPlan(db: Database, shopId: string, input: SheetPlanRequest): Promise<Loaded> {
  const loaded = await loadEntries(db, shopId, input)
  const key = JSON.stringify([shopId, input.sheet, input.workflow, input.grain, loaded.map((e) => [e.designId, e.revision, e.count])])
  let result = cache.get(key)
  if (!result) {
    result = Promise.resolve().then(async () => {
      const entries = loaded.map((e) => ({ ...e, plate: buildPlate(e.params) as Plate }))
      return { plan: await plan(entries, input), entries }
    })
    cache.set(key, result)
    result.catch(() => cache.delete(key))
    while (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!)
  }
  return result
}

const round = (p: Point): Point => [Math.round(p[0] * 10) / 10, Math.round(p[1] * 10) / 10]

/** The plan as the page shows it: figures, and every part's outline thinned to 0.25 mm for drawing. */
export async function sheetPlan(db: Database, shopId: string, input: SheetPlanRequest) {
  const { plan, entries } = await loadPlan(db, shopId, input)
  const outlines = new Map<number, Point[]>()
  return {
    workflow: plan.workflow,
    grain: input.grain,
    sheet: plan.sheet,
    entries: entries.map((e, i) => ({
      designId: e.designId,
      revision: e.revision,
      name: e.name,
      size: e.size,
      count: e.count,
      layers: e.plate.params.layers,
      width: e.plate.metrics.width,
      height: e.plate.metrics.height,
      area: e.plate.metrics.area,
      sheetThickness: e.plate.params.sheetThickness,
      thicknessDiffers: plan.thicknessMismatch.includes(i),
      spare: plan.spare[i]!,
    })),
    layouts: plan.layouts.map((l) => ({
      sheets: l.sheets,
      partArea: l.partArea,
      offcut: l.offcut,
      parts: l.parts.map((p) => {
        let local = outlines.get(p.entry)
        if (!local) outlines.set(p.entry, (local = thinRing(entries[p.entry]!.plate.outline, 0.25)))
        const t = (p.turn * Math.PI) / 180
        const c = Math.cos(t)
        const s = Math.sin(t)
        return {
          entry: p.entry,
          layer: p.layer,
          layerNumber: p.layerNumber,
          turn: p.turn,
          at: round(p.at),
          outline: local.map(([x, y]) => round([x * c - y * s + p.at[0], x * s + y * c + p.at[1]])),
          holes: entries[p.entry]!.plate.holes.map((h) => {
            const [x, y] = round([h.x * c - h.y * s + p.at[0], h.x * s + h.y * c + p.at[1]])
            return { x, y, diameter: h.diameter }
          }),
        }
      }),
    })),
    figures: {
      sheetsToBuy: plan.sheetsToBuy,
      panels: plan.panels,
      plates: plan.plates,
      parts: plan.parts,
      areaLowerBound: plan.areaLowerBound,
      yield: plan.yield,
      glue: { ...plan.glue, litres: plan.glue.volume / 1e6, usGallons: plan.glue.volume / MM3_PER_US_GALLON },
    },
  }
}

function fileStem(input: SheetPlanRequest): string {
  return `sheet-plan-${input.workflow}`
}

export async function sheetPlanPdf(db: Database, shopId: string, input: SheetPlanRequest & { units: 'in' | 'mm' }, font: FontBytes) {
  const { plan, entries } = await loadPlan(db, shopId, input)
  const pdf = await renderLayoutPdf(plan, entries, { units: input.units, font })
  return { pdf, fileName: `${fileStem(input)}.pdf` }
}

export async function sheetPlanDxf(db: Database, shopId: string, input: SheetPlanRequest & { units: 'in' | 'mm'; index: number; openings?: 'routed' | 'hole-saw' }) {
  const { plan, entries } = await loadPlan(db, shopId, input)
  if (input.index >= plan.layouts.length) invalid({ index: `The plan has ${plan.layouts.length} sheet${plan.layouts.length === 1 ? '' : 's'}` })
  return { dxf: renderLayoutDxf(plan, entries, input.index, { units: input.units, openings: input.openings }), fileName: `${fileStem(input)}-${input.index + 1}.dxf` }
}

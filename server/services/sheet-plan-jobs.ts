// The costly half of a sheet plan, as plain data in and out, so that it runs
// on an export worker thread (server/workers/export-worker.ts) and never on
// the server's event loop: nesting the plates, and writing the plan's PDF and
// DXF. Nothing here may use Nitro's auto-imports or the database; the plates
// are rebuilt here from the stored params (the server never trusts a
// computed plate), and a plan once nested is handed back as JSON text, so the
// files are drawn from the very plan the page showed.
import { buildPlate, type Plate, type Point } from '../../geometry'
import {
  planSheetsAsync,
  renderLayoutDxf,
  renderLayoutPdf,
  PlatePlanTooLargeError,
  NestTimeoutError,
  type SheetPlan,
} from '../../geometry/nest'
import { thinRing } from '../../geometry/math/offset'
import type { FontBytes } from '../../geometry/export'
import type { PlateParams } from '../../geometry'
import { invalid } from '../utils/validation'
import type { SheetPlanRequest } from '../../shared/utils/sheet-plans'

/** 1 US gallon = 231 in3 = 3.785411784 L (NIST Handbook 44). */
const MM3_PER_US_GALLON = 231 * 25.4 ** 3

/** One design of a plan, as loaded from its latest revision. */
export interface PlanJobEntry {
  designId: string
  revision: number
  name: string
  size: string | null
  params: PlateParams
  count: number
}

export type PlanSettingsInput = Pick<SheetPlanRequest, 'sheet' | 'workflow' | 'grain'>

/**
 * The two JSON texts a nesting job hands back, joined by a line break:
 * JSON.stringify never writes a bare line break, so the first one splits them
 * without parsing either (the page's answer goes out as it is).
 */
export function joinPlanTexts(view: string, plan: string): string {
  return `${view}\n${plan}`
}
export function splitPlanTexts(text: string): { view: string; plan: string } {
  const at = text.indexOf('\n')
  return { view: text.slice(0, at), plan: text.slice(at + 1) }
}

function withPlates(entries: PlanJobEntry[]) {
  return entries.map(e => ({ ...e, plate: buildPlate(e.params) as Plate }))
}

const round = (p: Point): Point => [Math.round(p[0] * 10) / 10, Math.round(p[1] * 10) / 10]

/** Nests the plates; answers the page's view of the plan and the plan itself, as JSON texts. */
export async function nestPlanJob(entries: PlanJobEntry[], settings: PlanSettingsInput, timeLimit: number): Promise<string> {
  const built = withPlates(entries)
  let plan: SheetPlan
  try {
    // In steps, handing the thread back between them (no matter here, on a worker; kept for the page's progress later).
    plan = await planSheetsAsync(built, { sheet: settings.sheet, workflow: settings.workflow, grain: settings.grain, timeLimit })
  }
  catch (e) {
    if (e instanceof PlatePlanTooLargeError) {
      const entry = built[e.entry]!
      const fmt = (mm: number) => `${Math.round(mm)} mm (${(mm / 25.4).toFixed(1)} in)`
      invalid({
        [`items.${e.entry}.designId`]: `${entry.name}${entry.size ? ` (${entry.size})` : ''} is ${fmt(e.cause.size.width)} x ${fmt(e.cause.size.height)} at its best turn: larger than the ${fmt(e.cause.room.width)} x ${fmt(e.cause.room.height)} inside the sheet's edge margin. Choose a larger sheet or a smaller margin.`,
      }, 'A plate is larger than the sheet')
    }
    if (e instanceof NestTimeoutError) {
      invalid({ items: `Nesting stopped after ${timeLimit / 1000} s with ${e.placed} of ${e.total} parts placed; plan fewer plates at once.` }, 'The plan took too long')
    }
    throw e
  }
  return joinPlanTexts(JSON.stringify(planView(plan, built, settings.grain)), JSON.stringify(plan))
}

/** What POST /api/sheet-plans answers (sent as the JSON text the worker wrote). */
export type SheetPlanView = ReturnType<typeof planView>

/** The plan as the page shows it: figures, and every part's outline thinned to 0.25 mm for drawing. */
function planView(plan: SheetPlan, entries: (PlanJobEntry & { plate: Plate })[], grain: boolean) {
  const outlines = new Map<number, Point[]>()
  return {
    workflow: plan.workflow,
    grain,
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
    layouts: plan.layouts.map(l => ({
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

/** The plan's sheets as one PDF, drawn from the nested plan (JSON text). */
export function planPdfJob(entries: PlanJobEntry[], planText: string, units: 'in' | 'mm', font: FontBytes): Promise<Uint8Array> {
  return renderLayoutPdf(JSON.parse(planText) as SheetPlan, withPlates(entries), { units, font })
}

/** One sheet of the plan as a DXF cut file. */
export function planDxfJob(entries: PlanJobEntry[], planText: string, index: number, units: 'in' | 'mm', openings: 'routed' | 'hole-saw' = 'routed'): string {
  const plan = JSON.parse(planText) as SheetPlan
  if (index >= plan.layouts.length) invalid({ index: `The plan has ${plan.layouts.length} sheet${plan.layouts.length === 1 ? '' : 's'}` })
  return renderLayoutDxf(plan, withPlates(entries), index, { units, openings })
}

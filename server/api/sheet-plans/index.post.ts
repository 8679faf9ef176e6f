import { sheetPlan } from '../../services/sheet-plans'
import type { SheetPlanView } from '../../services/sheet-plan-jobs'
import { sheetPlanRequestSchema } from '../../../shared/utils/sheet-plans'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const input = await readBodyWith(event, sheetPlanRequestSchema)
  // Nested on the worker pool; its answer comes back as JSON text, sent as it is.
  const plan = await sheetPlan(useDb(), member.shopId, input, job => runCostly(event, job, memberOwner(member)))
  setResponseHeader(event, 'content-type', 'application/json')
  // Typed as what the text holds, for the page's typed fetch.
  return plan as unknown as SheetPlanView
})

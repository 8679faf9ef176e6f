import { sheetPlan } from '../../services/sheet-plans'
import { sheetPlanRequestSchema } from '../../../shared/utils/sheet-plans'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const input = await readBodyWith(event, sheetPlanRequestSchema)
  return sheetPlan(useDb(), member.shopId, input)
})

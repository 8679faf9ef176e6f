import { sheetPlanDxf } from '../../services/sheet-plans'
import { layoutDxfSchema } from '../../../shared/utils/sheet-plans'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const input = await readBodyWith(event, layoutDxfSchema)
  const { dxf, fileName } = await sheetPlanDxf(useDb(), member.shopId, input, job => runCostly(event, job, memberOwner(member)))
  return sendFile(event, dxf, 'application/dxf', fileName)
})

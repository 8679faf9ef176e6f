import { sheetPlanPdf } from '../../services/sheet-plans'
import { layoutFileSchema } from '../../../shared/utils/sheet-plans'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const input = await readBodyWith(event, layoutFileSchema)
  const { pdf, fileName } = await sheetPlanPdf(useDb(), member.shopId, input, await templateFont(), job => runCostly(event, job, memberOwner(member)))
  return sendFile(event, pdf, 'application/pdf', fileName)
})

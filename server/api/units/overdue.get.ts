import { overdueLoans } from '../../services/units'

/** Units out on loan past their due date (the home page's reminder). */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:view')
  return overdueLoans(useDb(), member.shopId)
})

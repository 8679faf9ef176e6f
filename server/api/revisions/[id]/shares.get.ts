import { listShares } from '../../../services/shares'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:share')
  const list = await listShares(useDb(), member.shopId, routeId(event))
  if (!list) throw notFound('That revision')
  return list
})

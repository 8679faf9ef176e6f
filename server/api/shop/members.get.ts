import { listMembers } from '../../services/shop'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  return listMembers(useDb(), member.shopId)
})

import { listShopsOf } from '../../services/shop'

// The shops this account belongs to, to move between them.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  return listShopsOf(useDb(), member.userId, member.shopId)
})

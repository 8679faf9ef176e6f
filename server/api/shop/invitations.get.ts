import { listPendingInvitations } from '../../services/invitations'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  return listPendingInvitations(useDb(), member.shopId)
})

import { withdrawInvitation } from '../../../services/invitations'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  if (!(await withdrawInvitation(useDb(), member, routeId(event)))) throw notFound('That invitation')
  setResponseStatus(event, 204)
  return null
})

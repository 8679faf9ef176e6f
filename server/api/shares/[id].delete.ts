import { withdrawShare } from '../../services/shares'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:share')
  if (!(await withdrawShare(useDb(), member, routeId(event)))) throw notFound('That share link')
  setResponseStatus(event, 204)
  return null
})

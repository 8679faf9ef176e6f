import { removeMember } from '../../../services/shop'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  const result = await removeMember(useDb(), member, routeId(event))
  if (!result.ok) throw memberChangeError(result.reason)
  setResponseStatus(event, 204)
  return null
})

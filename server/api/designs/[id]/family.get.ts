import { getFamily } from '../../../services/families'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const family = await getFamily(useDb(), member.shopId, id)
  if (!family) throw notFound('That design')
  return family
})

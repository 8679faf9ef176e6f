import { getShow } from '../../services/shows'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const show = await getShow(useDb(), member.shopId, id)
  if (!show) throw notFound('That show')
  return show
})

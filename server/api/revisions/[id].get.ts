import { getRevision } from '../../services/designs'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const revision = await getRevision(useDb(), member.shopId, routeId(event))
  if (!revision) throw notFound('That revision')
  return revision
})

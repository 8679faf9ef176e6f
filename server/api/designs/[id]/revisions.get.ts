import { listRevisions } from '../../../services/designs'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const revisions = await listRevisions(useDb(), member.shopId, id)
  if (!revisions) throw notFound('That design')
  return revisions
})

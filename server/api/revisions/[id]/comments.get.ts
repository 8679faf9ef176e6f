import { listComments } from '../../../services/revision-comments'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const comments = await listComments(useDb(), member.shopId, routeId(event))
  if (!comments) throw notFound('That revision')
  return comments
})

import { commentPageSchema, listComments } from '../../../services/revision-comments'

// A page of comments (`after` = the last id you have, `limit` up to 200), oldest first;
// X-Rootplate-More: 1 when another page follows.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const revisionId = routeId(event)
  const page = queryWith(event, commentPageSchema)
  const found = await listComments(useDb(), member.shopId, revisionId, page)
  if (!found) throw notFound('That revision')
  setResponseHeader(event, 'X-Rootplate-More', found.more ? '1' : '0')
  return found.comments
})

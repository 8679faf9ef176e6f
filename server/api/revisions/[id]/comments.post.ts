import { addComment, commentInputSchema } from '../../../services/revision-comments'
import { limit, RATE_LIMITS, takeLimits } from '../../../services/rate-limits'

// Every role may comment: a builder's note on what they found is what the designer needs.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'revision:comment')
  const revisionId = routeId(event)
  const input = await readBodyWith(event, commentInputSchema)
  refuseOverLimit(event, await takeLimits(useDb(), [limit(`comment-by:${member.userId}`, RATE_LIMITS.commentsPerMember)]), 'Many comments in a short time; the comment was not saved')
  const comment = await addComment(useDb(), member, revisionId, input.body)
  if (!comment) throw notFound('That revision')
  setResponseStatus(event, 201)
  return comment
})

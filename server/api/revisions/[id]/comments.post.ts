import { addComment, commentInputSchema } from '../../../services/revision-comments'

// Every role may comment: a builder's note on what they found is what the designer needs.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'revision:comment')
  const revisionId = routeId(event)
  const input = await readBodyWith(event, commentInputSchema)
  const comment = await addComment(useDb(), member, revisionId, input.body)
  if (!comment) throw notFound('That revision')
  setResponseStatus(event, 201)
  return comment
})

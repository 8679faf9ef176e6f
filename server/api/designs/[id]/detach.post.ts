import { detachSize } from '../../../services/families'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:edit')
  const id = routeId(event)
  const result = await detachSize(useDb(), member, id)
  if (result === 'not-found') throw notFound('That design')
  if (result === 'not-a-size') throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This design is not a size of another design' })
  return { ok: true }
})

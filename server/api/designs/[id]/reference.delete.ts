import { clearReference } from '../../../services/uploads'

/** Takes the reference image off the canvas; the file itself stays attached. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:edit')
  const id = routeId(event)
  if (!await clearReference(useDb(), member.shopId, id)) throw notFound('That design')
  setResponseStatus(event, 204)
  return null
})

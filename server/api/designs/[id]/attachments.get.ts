import { listAttachments } from '../../../services/uploads'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  const list = await listAttachments(useDb(), member.shopId, { designId: id })
  if (!list) throw notFound('That design')
  return list
})

import { findAttachment, removeAttachment } from '../../services/uploads'

/** A design's file: lead and designers; a unit's photo: whoever may edit units. */
export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const id = routeId(event)
  const db = useDb()
  const row = await findAttachment(db, member.shopId, id)
  if (!row) throw notFound('That file')
  if (!can(member.role, row.designId ? 'attachment:add' : 'unit:edit')) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `A ${member.role} may not remove this file` })
  }
  if (!await removeAttachment(db, useStorage('uploads'), member, id)) throw notFound('That file')
  setResponseStatus(event, 204)
  return null
})

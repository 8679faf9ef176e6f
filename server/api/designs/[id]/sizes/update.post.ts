import { z } from 'zod'
import { bringSizesUpToDate } from '../../../../services/families'

const revisionNumber = z.number({ error: 'Give the revision number you looked at' }).int().positive().max(PG_INT_MAX, 'Give the revision number you looked at')
const bodySchema = z.object({
  parentRevision: revisionNumber,
  sizes: z.array(z.object({ id: z.uuid('Pick sizes of this design'), basedOn: revisionNumber }).strict(), { error: 'Give the sizes to bring up to date' })
    .min(1, 'Accept at least one size').max(50, 'At most 50 sizes at once')
    .refine(list => new Set(list.map(s => s.id)).size === list.length, 'Each size once'),
}).strict()

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, bodySchema)
  const result = await bringSizesUpToDate(useDb(), member, id, body)
  if (result.ok) {
    setResponseStatus(event, 201)
    return result.saved
  }
  switch (result.reason) {
    case 'not-found': throw notFound('That design')
    case 'unreadable': return invalid({ _: 'A revision in this family cannot be read; save it again in the editor first' })
    case 'not-a-size': return invalid({ sizes: 'One of these designs is not a size of this design' })
    case 'parent-moved':
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `The design is at revision ${result.latest} now; look at the preview again`, data: { latest: result.latest } })
    case 'conflict':
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${result.name} was saved again (revision ${result.latest}) since the preview; look at it again`, data: { id: result.id, latest: result.latest } })
  }
})

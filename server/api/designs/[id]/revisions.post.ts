import { z } from 'zod'
import { saveRevision } from '../../../services/designs'

const bodySchema = z.object({
  params: z.unknown().refine(v => v !== undefined, 'Params are required'),
  note: textField(500, 'Keep the note under 500 characters').default(''),
  basedOn: z.number({ error: 'basedOn must be the revision number you started from' }).int().positive().max(PG_INT_MAX, 'basedOn must be the revision number you started from'),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:edit')
  const id = routeId(event)
  const body = await readBodyWith(event, bodySchema)
  const params = parseParams(body.params)
  const result = await saveRevision(useDb(), member, id, { params, note: body.note, basedOn: body.basedOn })
  if (!result.ok) {
    if (result.reason === 'not-found') throw notFound('That design')
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: `Revision ${result.latest.number} was saved by ${result.latest.author.name ?? 'someone'} since you started from revision ${body.basedOn}`,
      data: { latest: result.latest },
    })
  }
  setResponseStatus(event, 201)
  return result.revision
})

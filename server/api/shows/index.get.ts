import { z } from 'zod'
import { listShows } from '../../services/shows'

const querySchema = z.object({
  archived: z.enum(['hide', 'only', 'all'], { error: 'archived is one of hide, only, all' }).default('hide'),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const query = queryWith(event, querySchema)
  return listShows(useDb(), member.shopId, query.archived)
})

import { z } from 'zod'
import { listDesigns } from '../../services/designs'

const querySchema = z.object({
  q: z.string().trim().max(120, 'Keep the search under 120 characters').refine(storableText, TEXT_MESSAGE).optional(),
  show: z.union([z.literal('none'), z.uuid('Pick a show from the list')]).optional(),
  archived: z.enum(['hide', 'only', 'all'], { error: 'archived is one of hide, only, all' }).default('hide'),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const filter = queryWith(event, querySchema)
  return listDesigns(useDb(), member.shopId, filter)
})

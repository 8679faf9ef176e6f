import { z } from 'zod'
import { listActivity } from '../../services/activity'
import { calendarMoment } from '../../../shared/utils/date-schemas'

const schema = z.object({
  design: z.uuid('Pick a design from the list').optional(),
  person: z.uuid('Pick a person from the list').optional(),
  before: calendarMoment('Must be a date and time').optional(),
  limit: z.coerce.number().int().min(1).max(200, 'At most 200 at a time').default(50),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:activity')
  const q = queryWith(event, schema)
  return listActivity(useDb(), member.shopId, { designId: q.design, userId: q.person, before: q.before, limit: q.limit })
})

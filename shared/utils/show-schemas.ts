// Request bodies of the show and design-details routes, shared so a form can
// check what the server will check.
import { z } from 'zod'
import { calendarDay } from './date-schemas'

const NUL_OR_LONE_SURROGATE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/
const text = (max: number, tooLong: string) => z.string({ error: 'Expected text' }).trim().max(max, tooLong)
  .refine(s => !NUL_OR_LONE_SURROGATE.test(s), 'Remove the invisible control character or broken symbol from this text')

export const showName = text(120, 'Keep the show name under 120 characters').pipe(z.string().min(1, 'Give the show a name'))
const venue = text(120, 'Keep the venue under 120 characters').nullish().transform(v => v || null)
const opensOn = calendarDay('Give the opening date as YYYY-MM-DD').nullish()

export const newShowSchema = z.object({ name: showName, venue, opensOn }).strict()

export const showChangeSchema = z.object({
  name: showName.optional(),
  venue: venue.optional(),
  opensOn,
  archived: z.boolean({ error: 'archived is true or false' }).optional(),
}).strict().refine(v => Object.values(v).some(x => x !== undefined), 'Say what to change')

export const sizeLabel = text(40, 'Keep the size label under 40 characters')

export const designDetailsSchema = z.object({
  name: text(120, 'Keep the name under 120 characters').pipe(z.string().min(1, 'Give the design a name')).optional(),
  sizeLabel: sizeLabel.nullable().optional(),
  showId: z.uuid('Pick a show from the list').nullable().optional(),
  quantity: z.number({ error: 'Give how many the show needs, 0 to 999' }).int('A whole number of plates').min(0, 'At least 0').max(999, 'At most 999').optional(),
  archived: z.boolean({ error: 'archived is true or false' }).optional(),
}).strict().refine(v => Object.values(v).some(x => x !== undefined), 'Say what to change')

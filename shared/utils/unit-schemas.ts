import { z } from 'zod'
import { settableStatuses, unitKinds, unitStatuses } from './units'
import { calendarDay } from './date-schemas'

const isoDate = (what: string) => calendarDay(`${what}: use a date such as 2026-03-14`)
const NUL_OR_LONE_SURROGATE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/
const text = (max: number, what: string) => z.string().trim().max(max, `Keep ${what} under ${max} characters`)

export const unitCreateSchema = z.object({
  kind: z.enum(unitKinds, { error: 'Choose a plate unit or a pattern' }),
  label: text(80, 'the label').min(1, 'Give it a label to write on it'),
  designId: z.uuid({ error: 'Choose a design' }).nullish(),
  revisionId: z.uuid({ error: 'Choose a revision' }).nullish(),
  sizeLabel: text(60, 'the size').nullish(),
  status: z.enum(settableStatuses as [string, ...string[]], { error: 'Choose a stage' }).optional(),
  location: text(120, 'the location').optional(),
  notes: text(4000, 'the notes').optional(),
}).strict()

export const unitPatchSchema = z.object({
  label: text(80, 'the label').min(1, 'Give it a label to write on it').optional(),
  revisionId: z.uuid({ error: 'Choose a revision' }).nullable().optional(),
  sizeLabel: text(60, 'the size').nullable().optional(),
  status: z.enum(settableStatuses as [string, ...string[]], { error: 'Choose a stage; lend it with the loan form' }).optional(),
  location: text(120, 'the location').optional(),
  notes: text(4000, 'the notes').optional(),
}).strict()

export const unitFilterSchema = z.object({
  status: z.enum(unitStatuses, { error: 'Unknown stage' }).optional(),
  kind: z.enum(unitKinds, { error: 'Unknown kind' }).optional(),
  designId: z.uuid({ error: 'Unknown design' }).optional(),
  // PostgreSQL refuses NUL in text and a lone UTF-16 half is no character: a search holding either finds nothing and says so.
  q: text(100, 'the search').refine(s => !NUL_OR_LONE_SURROGATE.test(s), 'Remove the invisible control character or broken symbol from the search').optional(),
})

export const loanSchema = z.object({
  borrower: text(120, 'the borrower').min(1, 'Who borrows it?'),
  outOn: isoDate('Out'),
  dueOn: isoDate('Due'),
}).strict().refine(l => l.dueOn >= l.outOn, { path: ['dueOn'], message: 'The due date is before the day it goes out' })

export const returnSchema = z.object({ returnedOn: isoDate('Returned') }).strict()

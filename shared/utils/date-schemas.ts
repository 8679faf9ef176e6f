// Calendar dates and moments in requests: the ISO shapes, and a year
// PostgreSQL and people both mean (1000 to 9999). Year 0 has no day in
// PostgreSQL's calendar; refused here (422), it never reaches the database.
import { z } from 'zod'

export const FIRST_YEAR = 1000

const yearOf = (v: string) => Number(v.slice(0, 4))

/** A day as YYYY-MM-DD, year 1000 to 9999. */
export const calendarDay = (message: string) => z.iso.date({ error: message })
  .refine(v => yearOf(v) >= FIRST_YEAR, `${message} (years from ${FIRST_YEAR})`)

/** A moment as an ISO date and time with its offset, year 1000 to 9999, as a Date. */
export const calendarMoment = (message: string) => z.iso.datetime({ offset: true, error: message })
  .refine(v => yearOf(v) >= FIRST_YEAR && Number.isFinite(Date.parse(v)), `${message} (years from ${FIRST_YEAR})`)
  .transform(v => new Date(v))

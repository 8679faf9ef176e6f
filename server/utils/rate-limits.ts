import type { Taken } from '../services/rate-limits'

/** A refused limit as a 429 with Retry-After and a message saying what to wait for. */
export function refuseOverLimit(event: Parameters<typeof setResponseHeader>[0], taken: Taken, what: string): void {
  if (taken.ok) return
  setResponseHeader(event, 'Retry-After', taken.retryAfterSeconds)
  const minutes = Math.ceil(taken.retryAfterSeconds / 60)
  const wait = taken.retryAfterSeconds < 90 ? `${taken.retryAfterSeconds} seconds` : `${minutes} minutes`
  throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `${what}. Try again in ${wait}.`, data: { retryAfterSeconds: taken.retryAfterSeconds } })
}

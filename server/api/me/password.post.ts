import { z } from 'zod'
import { changePassword } from '../../services/auth'

const schema = z.object({ current: z.string({ error: 'Enter your current password' }).min(1, 'Enter your current password').max(200), password: newPasswordField })

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const { current, password } = await readBodyWith(event, schema)
  const result = await changePassword(useDb(), passwordHasher, { userId: member.userId, current, password, keepSessionToken: (await currentSessionToken(event))!, address: clientAddress(event) })
  if (!result.ok) {
    if (result.reason === 'limited') {
      setResponseHeader(event, 'Retry-After', result.retryAfterSeconds)
      throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `Too many wrong passwords. Wait ${result.retryAfterSeconds === 1 ? 'a second' : `${result.retryAfterSeconds} seconds`}, then try again.`, data: { retryAfterSeconds: result.retryAfterSeconds } })
    }
    invalid({ current: 'That is not your current password' })
  }
  return { ok: true, endedSessions: result.endedSessions }
})

import { z } from 'zod'
import { changePassword } from '../../services/auth'

const schema = z.object({ current: z.string({ error: 'Enter your current password' }).min(1, 'Enter your current password').max(200), password: newPasswordField })

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const { current, password } = await readBodyWith(event, schema)
  const result = await changePassword(useDb(), passwordHasher, { userId: member.userId, current, password, keepSessionToken: (await currentSessionToken(event))! })
  if (!result.ok) invalid({ current: 'That is not your current password' })
  return { ok: true, endedSessions: result.endedSessions }
})

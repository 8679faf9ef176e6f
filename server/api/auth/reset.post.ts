import { z } from 'zod'
import { resetPassword } from '../../services/auth'

const schema = z.object({ token: linkToken, password: newPasswordField })

export default defineEventHandler(async (event) => {
  const { token, password } = await readBodyWith(event, schema)
  const result = await resetPassword(useDb(), passwordHasher, token, password)
  if (!result.ok) {
    if (result.reason === 'missing') throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This reset link is not known. Ask for a new one.' })
    throw createError({ statusCode: 410, statusMessage: 'Gone', message: result.reason === 'used' ? 'This reset link has already been used. Ask for a new one if you need it.' : 'This reset link has expired (they last one hour). Ask for a new one.' })
  }
  return { ok: true, endedSessions: result.endedSessions }
})

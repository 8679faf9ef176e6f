import { z } from 'zod'
import { signIn } from '../../services/auth'

const loginSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email('Enter a valid e-mail address')),
  password: z.string().min(1, 'Enter your password').max(200, 'That password is too long'),
})

const hasher = { make: hashPassword, verify: verifyPassword }

export default defineEventHandler(async (event) => {
  const { email, password } = await readBodyWith(event, loginSchema)
  // X-Forwarded-For is believed only as far as the proxies the operator names (NUXT_TRUST_PROXY).
  const address = clientAddress(event)
  const result = await signIn(useDb(), hasher, { email, password, address })
  if (!result.ok) {
    if (result.reason === 'limited') {
      setResponseHeader(event, 'Retry-After', result.retryAfterSeconds)
      const wait = result.retryAfterSeconds === 1 ? 'a second' : `${result.retryAfterSeconds} seconds`
      throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `Too many failed sign-ins. Wait ${wait}, then try again.`, data: { retryAfterSeconds: result.retryAfterSeconds } })
    }
    if (result.reason === 'no-shop') {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This account is not a member of any shop yet' })
    }
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'That e-mail and password do not match an account' })
  }
  await startSession(event, result.user.id, result.shopId)
  return { user: result.user, shopId: result.shopId, shopName: result.shopName, role: result.role }
})

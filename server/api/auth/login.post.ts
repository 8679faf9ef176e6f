import { z } from 'zod'
import { signIn } from '../../services/auth'

const loginSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email('Enter a valid e-mail address')),
  password: z.string().min(1, 'Enter your password').max(200, 'That password is too long'),
})

const hasher = { make: hashPassword, verify: verifyPassword }

export default defineEventHandler(async (event) => {
  const { email, password } = await readBodyWith(event, loginSchema)
  // X-Forwarded-For is believed only behind a proxy the operator names (NUXT_TRUST_PROXY=1).
  const trustProxy = ['1', 'true'].includes(String(useRuntimeConfig(event).trustProxy))
  const address = getRequestIP(event, { xForwardedFor: trustProxy }) ?? 'unknown'
  const result = await signIn(useDb(), hasher, { email, password, address })
  if (!result.ok) {
    if (result.reason === 'limited') {
      setResponseHeader(event, 'Retry-After', result.retryAfterMinutes * 60)
      throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `Too many failed sign-ins. Wait ${result.retryAfterMinutes} minutes, then try again.` })
    }
    if (result.reason === 'no-shop') {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This account is not a member of any shop yet' })
    }
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'That e-mail and password do not match an account' })
  }
  await startSession(event, result.user.id, result.shopId)
  return { user: result.user, shopId: result.shopId, shopName: result.shopName, role: result.role }
})

import { z } from 'zod'
import { mailPasswordReset } from '../../services/auth'

const schema = z.object({ email: emailField })

// The same answer, after the same work, whether or not the address has an
// account: everything that depends on it (caps, lookup, link, message) runs
// after the reply has gone out, so the reply's timing reveals nothing.
export default defineEventHandler(async (event) => {
  const { email } = await readBodyWith(event, schema)
  const work = { email, clientAddress: clientAddress(event), origin: appOrigin() }
  event.waitUntil(new Promise<void>(resolve => setImmediate(resolve))
    .then(() => mailPasswordReset(useDb(), work))
    .catch((err: unknown) => console.error('mail: password reset not sent:', err instanceof Error ? err.message : err)))
  setResponseStatus(event, 202)
  return { message: 'If that address belongs to an account, a link to set a new password is on its way. It works once, for one hour.' }
})

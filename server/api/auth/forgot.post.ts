import { z } from 'zod'
import { requestPasswordReset } from '../../services/auth'
import { sendMail } from '../../services/mail'
import { passwordResetMail } from '../../services/mail-messages'

const schema = z.object({ email: emailField })

// The same answer, as fast, whether or not the address has an account: the
// message goes out after the reply, so its sending time reveals nothing.
export default defineEventHandler(async (event) => {
  const { email } = await readBodyWith(event, schema)
  const reset = await requestPasswordReset(useDb(), email)
  if (reset) {
    const content = passwordResetMail({ shopName: reset.shopName, name: reset.name, link: `${appOrigin(event)}/reset/${reset.token}` })
    event.waitUntil(sendMail({ to: reset.email, ...content, shopId: reset.shopId ?? undefined })
      .catch((err: unknown) => console.error('mail: password reset not sent:', err instanceof Error ? err.message : err)))
  }
  setResponseStatus(event, 202)
  return { message: 'If that address belongs to an account, a link to set a new password is on its way. It works once, for one hour.' }
})

import { mailDir, mailFakeEnabled } from '../../services/mail'
import { listFakeMail } from '../../services/mail-box'

// Development only: the messages the local mail fake caught for this shop,
// so a newcomer can follow an invitation without a mail client. Absent (404)
// in production unless the fake is the configured mail server.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  if (!mailFakeEnabled()) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The mail page exists only while the local mail fake is in use' })
  return listFakeMail(mailDir(), member.shopId)
})

import { z } from 'zod'
import { mailDir, mailFakeEnabled } from '../../services/mail'
import { listFakeMail } from '../../services/mail-box'

const querySchema = z.object({
  page: z.string().regex(/^[1-9]\d{0,3}$/, 'Give a page number from 1 to 9999').default('1').transform(Number),
})

// Development only: the messages the local mail fake caught that this lead
// sent for this shop (never anyone's password reset), a page at a time, so a
// newcomer can follow an invitation without a mail client. Absent (404) in
// production unless the fake is the configured mail server.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  if (!mailFakeEnabled()) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'The mail page exists only while the local mail fake is in use' })
  const { page } = queryWith(event, querySchema)
  const { messages, more } = await listFakeMail(mailDir(), { shopId: member.shopId, userId: member.userId }, page)
  setResponseHeader(event, 'X-Rootplate-More', more ? '1' : '0')
  return messages
})

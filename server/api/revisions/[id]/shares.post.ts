import { z } from 'zod'
import { createShare, MAX_SHARE_DAYS } from '../../../services/shares'
import { shareMail } from '../../../services/mail-messages'
import { recordActivity } from '../../../services/activity'
import { memberMailLimits, takeLimits } from '../../../services/rate-limits'

const schema = z.object({
  // A JSON number only: true, [5] or "0x10" are not a number of days, and are refused rather than read as 1, 5 or 16.
  days: z.number({ error: 'Give the number of days the link works' }).int('Use a whole number of days').min(1, 'At least 1 day').max(MAX_SHARE_DAYS, `At most ${MAX_SHARE_DAYS} days`),
  note: z.string().trim().max(1000, 'Keep the note under 1000 characters').default(''),
  // "Send to a shop": the link goes out by e-mail as well.
  email: emailField.optional(),
})

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:share')
  const revisionId = routeId(event)
  const input = await readBodyWith(event, schema)
  if (input.email) refuseOverLimit(event, await takeLimits(useDb(), memberMailLimits(member.userId, input.email)), 'Too many e-mails to that address or from you this hour; no link was made')
  const share = await createShare(useDb(), member, revisionId, { days: input.days, note: input.note })
  if (!share) throw notFound('That revision')
  const url = `${appOrigin()}/s/${share.token}`
  if (input.email) {
    const content = shareMail({ shopName: share.shopName, senderName: member.name, designName: share.designName, revision: share.revision, note: input.note, link: url, expiresOn: share.expiresAt.toISOString().slice(0, 10) })
    await deliverMail({ to: input.email, ...content, shopId: member.shopId, senderId: member.userId }, 'The share link is made')
    await recordActivity(useDb(), { shopId: member.shopId, userId: member.userId, designId: share.designId, action: 'share.sent', detail: { shareId: share.id, email: input.email, revision: share.revision } })
  }
  setResponseStatus(event, 201)
  return { id: share.id, url, expiresAt: share.expiresAt, sentTo: input.email ?? null }
})

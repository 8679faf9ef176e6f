import { INVITATION_DAYS, pendingInvitationEmail, renewInvitation } from '../../../../services/invitations'
import { memberMailLimits, takeLimits } from '../../../../services/rate-limits'
import { invitationMail } from '../../../../services/mail-messages'

// A new link (the old one stops working) and another seven days.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  const id = routeId(event)
  const email = await pendingInvitationEmail(useDb(), member.shopId, id)
  if (!email) throw notFound('That invitation')
  refuseOverLimit(event, await takeLimits(useDb(), memberMailLimits(member.userId, email)), 'Too many messages to that address or from you this hour; the invitation was not sent again')
  const renewed = await renewInvitation(useDb(), member, id)
  if (!renewed) throw notFound('That invitation')
  const content = invitationMail({ shopName: renewed.shopName, inviterName: member.name, role: renewed.role, link: `${appOrigin()}/join/${renewed.token}`, days: INVITATION_DAYS })
  await deliverMail({ to: renewed.email, ...content, shopId: member.shopId, senderId: member.userId }, 'The invitation is renewed')
  return { ok: true }
})

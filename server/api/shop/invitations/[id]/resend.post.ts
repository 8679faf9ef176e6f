import { INVITATION_DAYS, renewInvitation } from '../../../../services/invitations'
import { invitationMail } from '../../../../services/mail-messages'

// A new link (the old one stops working) and another seven days.
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  const renewed = await renewInvitation(useDb(), member, routeId(event))
  if (!renewed) throw notFound('That invitation')
  const content = invitationMail({ shopName: renewed.shopName, inviterName: member.name, role: renewed.role, link: `${appOrigin(event)}/join/${renewed.token}`, days: INVITATION_DAYS })
  await deliverMail({ to: renewed.email, ...content, shopId: member.shopId }, 'The invitation is renewed')
  return { ok: true }
})

import { z } from 'zod'
import { createInvitation, INVITATION_DAYS } from '../../services/invitations'
import { invitationMail } from '../../services/mail-messages'
import { memberMailLimits, takeLimits } from '../../services/rate-limits'

const schema = z.object({ email: emailField, role: roleField })

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'shop:members')
  const input = await readBodyWith(event, schema)
  refuseOverLimit(event, await takeLimits(useDb(), memberMailLimits(member.userId, input.email)), 'Too many invitations to that address or from you this hour; nothing was sent')
  const result = await createInvitation(useDb(), member, input)
  if (!result.ok) {
    const message = result.reason === 'member' ? 'That address is already in your crew' : 'That address already has an invitation waiting; send it again from the list instead'
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message, data: { fields: { email: message } } })
  }
  const content = invitationMail({ shopName: result.shopName, inviterName: member.name, role: input.role, link: `${appOrigin()}/join/${result.token}`, days: INVITATION_DAYS })
  await deliverMail({ to: input.email, ...content, shopId: member.shopId, senderId: member.userId }, 'The invitation is saved')
  setResponseStatus(event, 201)
  return { id: result.id, email: input.email, role: input.role }
})

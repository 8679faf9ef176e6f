import { z } from 'zod'
import { acceptInvitation } from '../../../services/invitations'

const schema = z.object({
  name: personName.optional(),
  password: z.string({ error: 'Choose a password' }).max(200, 'Use at most 200 characters').optional(),
})

// Signed out: makes the invited address's account (name and password) and
// signs it in. Signed in as the invited account: adds the shop to it. An
// existing account must sign in first (the limited sign-in); signed in as
// someone else, the answer asks (409) and the session stays as it is.
export default defineEventHandler(async (event) => {
  const token = invitationToken(event)
  const input = await readBodyWith(event, schema)
  const member = await currentMember(event)
  const result = await acceptInvitation(useDb(), passwordHasher, token, input, newPasswordField, member ? { userId: member.userId, email: member.email } : null)
  if (!result.ok) {
    if (result.reason === 'name-required') invalid({ name: 'Enter your name' })
    if (result.reason === 'weak-password') invalid({ password: result.message })
    if (result.reason === 'sign-in-required') {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Sign in with the invited address first, then open this link again to join.', data: { code: 'sign-in-required' } })
    }
    if (result.reason === 'other-account') {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `You are signed in as ${result.signedInAs}, and this invitation is for another address. Sign out first to accept it.`, data: { code: 'other-account', signedInAs: result.signedInAs } })
    }
    throw invitationGone(result.reason)
  }
  await startSession(event, result.userId, result.shopId)
  return { ok: true, joined: result.joined }
})

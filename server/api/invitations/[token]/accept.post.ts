import { z } from 'zod'
import { acceptInvitation } from '../../../services/invitations'

const schema = z.object({ name: personName.optional(), password: z.string({ error: 'Choose a password' }).max(200, 'Use at most 200 characters') })

export default defineEventHandler(async (event) => {
  const token = invitationToken(event)
  const input = await readBodyWith(event, schema)
  const result = await acceptInvitation(useDb(), passwordHasher, token, { name: input.name, password: input.password }, newPasswordField)
  if (!result.ok) {
    if (result.reason === 'wrong-password') invalid({ password: 'This address already has a Rootplate account: enter its password to join with it' })
    if (result.reason === 'name-required') invalid({ name: 'Enter your name' })
    if (result.reason === 'weak-password') invalid({ password: result.message })
    throw invitationGone(result.reason)
  }
  await startSession(event, result.userId, result.shopId)
  return { ok: true, joined: result.joined }
})

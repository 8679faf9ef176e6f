import { describeInvitation } from '../../services/invitations'

// Public: what the invitation page needs, and nothing of the shop beyond its name.
export default defineEventHandler(async (event) => {
  const token = invitationToken(event)
  const found = await describeInvitation(useDb(), token)
  if (found.state !== 'open') throw invitationGone(found.state)
  return found
})

import { endUserSessions } from '../../services/sessions'

// "Sign out everywhere": every session of the account, this one included.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const ended = await endUserSessions(useDb(), member.userId)
  await endCurrentSession(event)
  return { ended }
})

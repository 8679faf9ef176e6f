import { endSession } from '../services/sessions'

// The client's view of its session (`useUserSession()`) comes from the
// database, not from the cookie: the cookie carries only the session token.
export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    const member = await currentMember(event)
    delete session.sid
    if (!member) {
      delete session.user
      return
    }
    session.user = { id: member.userId, email: member.email, name: member.name }
    session.shopId = member.shopId
    session.shopName = member.shopName
    session.role = member.role
  })
  // The client's own "clear" (DELETE /api/_auth/session) ends the server-side session too.
  sessionHooks.hook('clear', async (session) => {
    if (typeof session.sid === 'string') await endSession(useDb(), session.sid)
  })
})

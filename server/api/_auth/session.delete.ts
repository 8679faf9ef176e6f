// The app's own "clear" (useUserSession().clear()) ends the server-side session too.
export default defineEventHandler(async (event) => {
  await endCurrentSession(event)
  return { loggedOut: true }
})

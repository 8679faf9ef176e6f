export default defineEventHandler(async (event) => {
  await endCurrentSession(event)
  return { ok: true }
})

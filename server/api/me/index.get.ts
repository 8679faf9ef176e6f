import { eq } from 'drizzle-orm'
import { users } from '../../database/schema'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const row = await useDb().query.users.findFirst({ columns: { preferences: true }, where: eq(users.id, member.userId) })
  return { ...member, preferences: readPreferences(row?.preferences) }
})

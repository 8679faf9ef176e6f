import { asc, eq } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { memberships, users } from '../database/schema'

export async function listMembers(db: Database, shopId: string) {
  return db.select({ id: users.id, name: users.name, email: users.email, role: memberships.role, since: memberships.createdAt })
    .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.shopId, shopId))
    .orderBy(asc(memberships.role), asc(users.name))
}

import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { memberships } from '../database/schema'
import { can, type ShopAction, type ShopRole } from '../../shared/utils/permissions'

export interface Member {
  userId: string
  email: string
  name: string
  shopId: string
  role: ShopRole
}

/**
 * The signed-in member of a shop. The role is read again from the database on
 * every request, so a changed or removed membership takes effect at once.
 */
export async function requireMember(event: H3Event): Promise<Member> {
  const session = await requireUserSession(event, { statusCode: 401, message: 'Please sign in' })
  const row = await useDb().query.memberships.findFirst({
    where: and(eq(memberships.userId, session.user.id), eq(memberships.shopId, session.shopId)),
  })
  if (!row) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Your shop membership has ended; please sign in again' })
  }
  return { userId: session.user.id, email: session.user.email, name: session.user.name, shopId: row.shopId, role: row.role }
}

/** The member, if their role may perform the action; otherwise 403. */
export async function requireAction(event: H3Event, action: ShopAction): Promise<Member> {
  const member = await requireMember(event)
  if (!can(member.role, action)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `A ${member.role} may not do this` })
  }
  return member
}

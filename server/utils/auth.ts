import type { H3Event } from 'h3'
import { can, type ShopAction, type ShopRole } from '../../shared/utils/permissions'
import { createSession, endSession, findSessionMember, policyFromEnv, pruneSessions, type SessionMember } from '../services/sessions'

export interface Member {
  userId: string
  email: string
  name: string
  shopId: string
  shopName: string
  role: ShopRole
}

declare module 'h3' {
  interface H3EventContext {
    /** The member of this request, once a guard has looked the session up. */
    member?: Member | null
  }
}

/** The session token from the sealed cookie; the cookie carries nothing else. */
async function cookieToken(event: H3Event): Promise<string | undefined> {
  const session = await getUserSession(event)
  return typeof session.sid === 'string' ? session.sid : undefined
}

function toMember(row: SessionMember): Member {
  return { userId: row.userId, email: row.email, name: row.name, shopId: row.shopId, shopName: row.shopName, role: row.role }
}

/**
 * The member behind the request's session, looked up in the database once per
 * request (so a role change or a removal takes effect on the next request), or
 * null when there is no live session.
 */
export async function currentMember(event: H3Event): Promise<Member | null> {
  if (event.context.member !== undefined) return event.context.member
  const token = await cookieToken(event)
  const row = token ? await findSessionMember(useDb(), token) : null
  event.context.member = row ? toMember(row) : null
  return event.context.member
}

/** The signed-in member of a shop, or 401. */
export async function requireMember(event: H3Event): Promise<Member> {
  const member = await currentMember(event)
  if (!member) {
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Please sign in' })
  }
  return member
}

/** The member, if their role may perform the action; otherwise 403. */
export async function requireAction(event: H3Event, action: ShopAction): Promise<Member> {
  const member = await requireMember(event)
  if (!can(member.role, action)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `A ${member.role} may not do this` })
  }
  return member
}

/** Starts a server-side session for the account in the shop and puts its token (only) in the cookie. */
export async function startSession(event: H3Event, userId: string, shopId: string): Promise<void> {
  const previous = await cookieToken(event)
  if (previous) await endSession(useDb(), previous)
  await pruneSessions(useDb(), userId)
  const token = await createSession(useDb(), { userId, shopId }, policyFromEnv())
  await replaceUserSession(event, { sid: token })
  event.context.member = undefined
}

/** Ends the request's session on the server and clears the cookie. */
export async function endCurrentSession(event: H3Event): Promise<void> {
  const token = await cookieToken(event)
  if (token) await endSession(useDb(), token)
  event.context.member = null
  await clearUserSession(event)
}

/** The token of the request's session, to keep it when ending the account's others. */
export function currentSessionToken(event: H3Event): Promise<string | undefined> {
  return cookieToken(event)
}

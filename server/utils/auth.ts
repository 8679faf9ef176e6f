import type { H3Event } from 'h3'
import { can, type ShopAction, type ShopRole } from '../../shared/utils/permissions'
import { createSession, endSession, findSessionMember, policyFromEnv, pruneSessions, type SessionMember } from '../services/sessions'
import { looksLikeToken } from '../services/tokens'

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

/**
 * The session cookie holds a random 256-bit token and nothing else; the
 * sessions table keeps only its SHA-256. Sealing it (iron, as h3's sessions
 * do) would protect nothing more, since the server holds the session, and
 * cost a PBKDF2 derivation on every request. The name is kept from the sealed
 * cookie it replaces, so a browser's old cookie is overwritten, not doubled.
 */
export const SESSION_COOKIE = 'nuxt-session'

interface CookieSettings { maxAge: number; httpOnly: boolean; sameSite: 'lax' | 'strict' | 'none'; secure: boolean; path: string }
let cookieSettings: CookieSettings | undefined
// Read once: useRuntimeConfig(event) copies the whole config on every call.
function settings(): CookieSettings {
  if (!cookieSettings) {
    const session = (useRuntimeConfig().session ?? {}) as { maxAge?: number; cookie?: Partial<CookieSettings> }
    cookieSettings = {
      maxAge: session.maxAge ?? 60 * 60 * 24 * 14,
      httpOnly: true,
      sameSite: session.cookie?.sameSite ?? 'lax',
      // `Secure` is added per request over HTTPS (server/plugins/https.ts).
      secure: session.cookie?.secure ?? false,
      path: session.cookie?.path ?? '/',
    }
  }
  return cookieSettings
}

/** The session token from the cookie, and only from the cookie (never from a request header). */
function cookieToken(event: H3Event): string | undefined {
  const value = getCookie(event, SESSION_COOKIE)
  return looksLikeToken(value) ? value : undefined
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
  const token = cookieToken(event)
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
  const previous = cookieToken(event)
  if (previous) await endSession(useDb(), previous)
  await pruneSessions(useDb(), userId)
  const token = await createSession(useDb(), { userId, shopId }, policyFromEnv())
  setCookie(event, SESSION_COOKIE, token, settings())
  event.context.member = undefined
}

/** Ends the request's session on the server and clears the cookie. */
export async function endCurrentSession(event: H3Event): Promise<void> {
  const token = cookieToken(event)
  if (token) await endSession(useDb(), token)
  event.context.member = null
  // Only a browser that has a cookie is told to drop it: anonymous requests get no Set-Cookie.
  if (getCookie(event, SESSION_COOKIE) !== undefined) {
    const { maxAge: _m, ...rest } = settings()
    deleteCookie(event, SESSION_COOKIE, rest)
  }
}

/** The token of the request's session, to keep it when ending the account's others. */
export function currentSessionToken(event: H3Event): Promise<string | undefined> {
  return Promise.resolve(cookieToken(event))
}

/** What the app's `useUserSession()` sees: read from the database, never from the cookie. */
export async function sessionView(event: H3Event): Promise<Record<string, unknown>> {
  const member = await currentMember(event)
  if (!member) return {}
  return {
    user: { id: member.userId, email: member.email, name: member.name },
    shopId: member.shopId,
    shopName: member.shopName,
    role: member.role,
  }
}

import { and, eq, ne, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { sessions } from '../database/schema'
import type { ShopRole } from '../../shared/utils/permissions'
import { hashToken, newToken } from './tokens'

export interface SessionPolicy {
  /** Minutes without a request after which the session ends. */
  idleMinutes: number
  /** Days after sign-in after which the session ends however busy it is. */
  maxDays: number
}

export const defaultPolicy: SessionPolicy = { idleMinutes: 12 * 60, maxDays: 30 }

/** The policy from SESSION_IDLE_MINUTES / SESSION_MAX_DAYS, falling back to the defaults on anything unreadable. */
export function policyFromEnv(env: Record<string, string | undefined> = process.env): SessionPolicy {
  const num = (v: string | undefined, fallback: number) => {
    const n = Number(v)
    return v && Number.isFinite(n) && n > 0 ? n : fallback
  }
  return { idleMinutes: Math.round(num(env.SESSION_IDLE_MINUTES, defaultPolicy.idleMinutes)), maxDays: num(env.SESSION_MAX_DAYS, defaultPolicy.maxDays) }
}

export interface SessionMember {
  sessionId: string
  userId: string
  email: string
  name: string
  shopId: string
  shopName: string
  role: ShopRole
}

/** Starts a session; the returned token goes into the sealed cookie and is never stored. */
export async function createSession(db: Database, input: { userId: string; shopId: string }, policy = defaultPolicy): Promise<string> {
  const { token, hash } = newToken()
  await db.insert(sessions).values({
    id: hash,
    userId: input.userId,
    shopId: input.shopId,
    expiresAt: new Date(Date.now() + policy.maxDays * 86_400_000),
    idleTimeoutMinutes: policy.idleMinutes,
  })
  return token
}

// Writing last_seen on every request would turn each read into a write; a
// minute's slack on a timeout counted in hours changes nothing.
const TOUCH_AFTER_MS = 60_000

/**
 * The member behind a session token, in one indexed query joined with the
 * membership, so a changed role or a removal takes effect on the next request.
 * Null for an unknown, ended, idle or expired session.
 */
export async function findSessionMember(db: Database, token: string): Promise<SessionMember | null> {
  const id = hashToken(token)
  // A tagged-template query of postgres.js is a named prepared statement on
  // each pooled connection: parsed and planned once, not on every request, and
  // without the query builder's per-call work (this runs on every API request).
  // The idle touch happens in the same statement, only when a minute has passed.
  const [row] = await db.$client<{ session_id: string; user_id: string; email: string; name: string; shop_id: string; shop_name: string; role: ShopRole }[]>`
    with live as (
      select s.id, s.user_id, s.shop_id, s.last_seen_at from sessions s
      where s.id = ${id}
        and s.expires_at > now()
        and s.last_seen_at + make_interval(mins => s.idle_timeout_minutes) > now()
    ), touched as (
      update sessions set last_seen_at = now()
      where id = (select id from live where last_seen_at < now() - make_interval(secs => ${TOUCH_AFTER_MS / 1000}::int))
    )
    select live.id as session_id, u.id as user_id, u.email, u.name, sh.id as shop_id, sh.name as shop_name, m.role
    from live
    join memberships m on m.user_id = live.user_id and m.shop_id = live.shop_id
    join users u on u.id = live.user_id
    join shops sh on sh.id = live.shop_id`
  if (!row) return null
  return { sessionId: row.session_id, userId: row.user_id, email: row.email, name: row.name, shopId: row.shop_id, shopName: row.shop_name, role: row.role }
}

export async function endSession(db: Database, token: string): Promise<void> {
  await db.delete(sessions).where(eq(sessions.id, hashToken(token)))
}

/** Ends every session of the account, or every one but `keepToken`'s. Returns how many ended. */
export async function endUserSessions(db: Database, userId: string, keepToken?: string): Promise<number> {
  const where = keepToken ? and(eq(sessions.userId, userId), ne(sessions.id, hashToken(keepToken))) : eq(sessions.userId, userId)
  const ended = await db.delete(sessions).where(where).returning({ id: sessions.id })
  return ended.length
}

/** Ends the sessions of one member in one shop (after a removal). */
export async function endShopSessions(db: Database, userId: string, shopId: string): Promise<void> {
  await db.delete(sessions).where(and(eq(sessions.userId, userId), eq(sessions.shopId, shopId)))
}

/** Drops the account's sessions that have ended, so the table does not grow with every sign-in. */
export async function pruneSessions(db: Database, userId: string): Promise<void> {
  await db.delete(sessions).where(and(
    eq(sessions.userId, userId),
    sql`(${sessions.expiresAt} <= now() or ${sessions.lastSeenAt} + make_interval(mins => ${sessions.idleTimeoutMinutes}) <= now())`,
  ))
}

import { and, eq, gt, ne, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { memberships, sessions, shops, users } from '../database/schema'
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
  const [row] = await db.select({
    sessionId: sessions.id,
    lastSeenAt: sessions.lastSeenAt,
    userId: users.id,
    email: users.email,
    name: users.name,
    shopId: shops.id,
    shopName: shops.name,
    role: memberships.role,
  }).from(sessions)
    .innerJoin(memberships, and(eq(memberships.userId, sessions.userId), eq(memberships.shopId, sessions.shopId)))
    .innerJoin(users, eq(users.id, sessions.userId))
    .innerJoin(shops, eq(shops.id, sessions.shopId))
    .where(and(
      eq(sessions.id, id),
      gt(sessions.expiresAt, sql`now()`),
      sql`${sessions.lastSeenAt} + make_interval(mins => ${sessions.idleTimeoutMinutes}) > now()`,
    ))
  if (!row) return null
  if (Date.now() - row.lastSeenAt.getTime() > TOUCH_AFTER_MS) {
    await db.update(sessions).set({ lastSeenAt: sql`now()` }).where(eq(sessions.id, id))
  }
  const { lastSeenAt: _seen, ...member } = row
  return member
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

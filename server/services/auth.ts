import { and, asc, count, eq, gt, isNull, ne, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { loginFailures, memberships, passwordResets, sessions, shops, users } from '../database/schema'
import { hashToken, newToken } from './tokens'
import type { ShopRole } from '../../shared/utils/permissions'

/** Failed sign-ins allowed per account and per address within the window. */
export const LOGIN_LIMIT = 10
export const LOGIN_WINDOW_MINUTES = 15

export type SignInResult =
  | { ok: true; user: { id: string; email: string; name: string }; shopId: string; shopName: string; role: ShopRole }
  | { ok: false; reason: 'invalid' | 'no-shop' }
  | { ok: false; reason: 'limited'; retryAfterMinutes: number }

export interface Hasher {
  make(plain: string): Promise<string>
  verify(hash: string, plain: string): Promise<boolean>
}

// A hash to verify against when the account does not exist, so that an
// unknown e-mail costs as long as a wrong password.
let decoy: Promise<string> | undefined

export async function signIn(
  db: Database,
  hasher: Hasher,
  input: { email: string; password: string; address: string },
): Promise<SignInResult> {
  const email = input.email.trim().toLowerCase()
  const since = new Date(Date.now() - LOGIN_WINDOW_MINUTES * 60_000)
  const [byEmail] = await db.select({ n: count() }).from(loginFailures)
    .where(and(eq(loginFailures.email, email), gt(loginFailures.createdAt, since)))
  const [byAddress] = await db.select({ n: count() }).from(loginFailures)
    .where(and(eq(loginFailures.address, input.address), gt(loginFailures.createdAt, since)))
  if ((byEmail?.n ?? 0) >= LOGIN_LIMIT || (byAddress?.n ?? 0) >= LOGIN_LIMIT) {
    return { ok: false, reason: 'limited', retryAfterMinutes: LOGIN_WINDOW_MINUTES }
  }

  const user = await db.query.users.findFirst({ where: sql`lower(${users.email}) = ${email}` })
  let good = false
  if (user) {
    good = await hasher.verify(user.passwordHash, input.password)
  }
  else {
    decoy ??= hasher.make(crypto.randomUUID())
    await hasher.verify(await decoy, input.password)
  }
  if (!user || !good) {
    await db.insert(loginFailures).values({ email, address: input.address })
    return { ok: false, reason: 'invalid' }
  }

  const [membership] = await db.select({ shopId: memberships.shopId, role: memberships.role, shopName: shops.name })
    .from(memberships).innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, user.id)).orderBy(asc(memberships.createdAt)).limit(1)
  if (!membership) return { ok: false, reason: 'no-shop' }

  await db.delete(loginFailures).where(eq(loginFailures.email, email))
  return {
    ok: true,
    user: { id: user.id, email: user.email, name: user.name },
    shopId: membership.shopId,
    shopName: membership.shopName,
    role: membership.role,
  }
}

export const RESET_MINUTES = 60
/** Reset e-mails one account may get within an hour; the answer to the asker stays the same. */
export const RESETS_PER_HOUR = 3

/**
 * A single-use reset link for the address, or null when no account has it.
 * The caller answers the same either way; only the e-mail differs.
 */
export async function requestPasswordReset(db: Database, email: string): Promise<{ token: string; userId: string; name: string; email: string; shopId: string | null; shopName: string } | null> {
  const address = email.trim().toLowerCase()
  const user = await db.query.users.findFirst({ where: sql`lower(${users.email}) = ${address}` })
  if (!user) return null
  // A few links an hour is plenty for a person; more would let anyone flood a mailbox.
  const [recent] = await db.select({ n: count() }).from(passwordResets)
    .where(and(eq(passwordResets.userId, user.id), gt(passwordResets.createdAt, new Date(Date.now() - RESET_MINUTES * 60_000))))
  if ((recent?.n ?? 0) >= RESETS_PER_HOUR) return null
  const { token, hash } = newToken()
  await db.insert(passwordResets).values({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) })
  const [shop] = await db.select({ id: shops.id, name: shops.name }).from(memberships).innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, user.id)).orderBy(asc(memberships.createdAt)).limit(1)
  return { token, userId: user.id, name: user.name, email: user.email, shopId: shop?.id ?? null, shopName: shop?.name ?? 'Rootplate' }
}

export type ResetResult = { ok: true; userId: string; endedSessions: number } | { ok: false; reason: 'missing' | 'used' | 'expired' }

/** Sets the new password once per link, retires every other open link of the account and ends all its sessions. */
export async function resetPassword(db: Database, hasher: Hasher, token: string, password: string): Promise<ResetResult> {
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(passwordResets).where(eq(passwordResets.tokenHash, hashToken(token))).for('update')
    if (!row) return { ok: false, reason: 'missing' } as const
    if (row.usedAt) return { ok: false, reason: 'used' } as const
    if (row.expiresAt.getTime() <= Date.now()) return { ok: false, reason: 'expired' } as const
    await tx.update(users).set({ passwordHash: await hasher.make(password) }).where(eq(users.id, row.userId))
    await tx.update(passwordResets).set({ usedAt: new Date() }).where(and(eq(passwordResets.userId, row.userId), isNull(passwordResets.usedAt)))
    const ended = await tx.delete(sessions).where(eq(sessions.userId, row.userId)).returning({ id: sessions.id })
    await tx.delete(loginFailures).where(sql`${loginFailures.email} = (select lower(email) from users where id = ${row.userId})`)
    return { ok: true, userId: row.userId, endedSessions: ended.length } as const
  })
}

export type ChangeResult = { ok: true; endedSessions: number } | { ok: false; reason: 'wrong-password' }

/** A signed-in member changes their password; every other session of the account ends. */
export async function changePassword(db: Database, hasher: Hasher, input: { userId: string; current: string; password: string; keepSessionToken: string }): Promise<ChangeResult> {
  const user = await db.query.users.findFirst({ where: eq(users.id, input.userId) })
  if (!user || !(await hasher.verify(user.passwordHash, input.current))) return { ok: false, reason: 'wrong-password' }
  return db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash: await hasher.make(input.password) }).where(eq(users.id, input.userId))
    const ended = await tx.delete(sessions)
      .where(and(eq(sessions.userId, input.userId), ne(sessions.id, hashToken(input.keepSessionToken))))
      .returning({ id: sessions.id })
    return { ok: true, endedSessions: ended.length } as const
  })
}

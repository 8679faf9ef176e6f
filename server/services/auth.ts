import { and, asc, count, eq, gt, isNull, ne, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { memberships, passwordResets, sessions, shops, signInLimits, users } from '../database/schema'
import { bucketKeys, claimSignIn, releaseSignIn } from './sign-in-limits'
import { hashToken, newToken } from './tokens'
import type { ShopRole } from '../../shared/utils/permissions'

export type SignInResult =
  | { ok: true; user: { id: string; email: string; name: string }; shopId: string; shopName: string; role: ShopRole }
  | { ok: false; reason: 'invalid' | 'no-shop' }
  | { ok: false; reason: 'limited'; retryAfterSeconds: number }

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
  wait: (ms: number) => Promise<void> = ms => new Promise(resolve => setTimeout(resolve, ms)),
): Promise<SignInResult> {
  const email = input.email.trim().toLowerCase()
  const claim = await claimSignIn(db, bucketKeys(email, input.address))
  const retryAfterSeconds = (ms: number) => Math.max(1, Math.ceil(ms / 1000))
  if (!claim.ok) return { ok: false, reason: 'limited', retryAfterSeconds: retryAfterSeconds(claim.retryAfterMs) }
  if (claim.waitMs > 0) await wait(claim.waitMs)

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
    // Past the free tries a wrong password says only "wait", so the count of plain refusals stays at the limit.
    if (claim.overLimit) return { ok: false, reason: 'limited', retryAfterSeconds: retryAfterSeconds(claim.retryAfterMs) }
    return { ok: false, reason: 'invalid' }
  }
  await releaseSignIn(db, email, input.address)

  const [membership] = await db.select({ shopId: memberships.shopId, role: memberships.role, shopName: shops.name })
    .from(memberships).innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, user.id)).orderBy(asc(memberships.createdAt)).limit(1)
  if (!membership) return { ok: false, reason: 'no-shop' }

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
    const [owner] = await tx.select({ email: users.email }).from(users).where(eq(users.id, row.userId))
    if (owner) await tx.delete(signInLimits).where(eq(signInLimits.key, bucketKeys(owner.email.toLowerCase(), '')[0]!))
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

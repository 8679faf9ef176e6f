import { and, asc, eq, isNull, ne, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { memberships, passwordResets, sessions, shops, signInLimits, users } from '../database/schema'
import { bucketKeys, claimSignIn, releaseSignIn } from './sign-in-limits'
import { hashToken, newToken } from './tokens'
import { limit, RATE_LIMITS, takeLimits } from './rate-limits'
import { sendMail } from './mail'
import { passwordResetMail } from './mail-messages'
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

const retryAfterSeconds = (ms: number) => Math.max(1, Math.ceil(ms / 1000))
const pause = (ms: number) => new Promise<void>(resolve => setTimeout(resolve, ms))

export async function signIn(
  db: Database,
  hasher: Hasher,
  input: { email: string; password: string; address: string },
  wait: (ms: number) => Promise<void> = pause,
): Promise<SignInResult> {
  const email = input.email.trim().toLowerCase()
  const claim = await claimSignIn(db, email, input.address, wait)
  if (!claim.ok) return { ok: false, reason: 'limited', retryAfterSeconds: retryAfterSeconds(claim.retryAfterMs) }

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
/** Reset e-mails one address may get within an hour; the answer to the asker stays the same. */
export const RESETS_PER_HOUR = RATE_LIMITS.resetsPerRecipient.max

/**
 * A single-use reset link for the address, or null when no account has it
 * (or the caps are reached). The caps are taken on the address as written,
 * whether or not an account has it, so a known and an unknown address cost
 * the same work up to the lookup; the caller answers before calling this.
 */
export async function requestPasswordReset(db: Database, email: string, clientAddress: string): Promise<{ token: string; userId: string; name: string; email: string; shopName: string } | null> {
  const address = email.trim().toLowerCase()
  // Atomic caps: parallel requests queue on the rows, so no more than the cap ever passes.
  const taken = await takeLimits(db, [
    limit(`reset-to:${address}`, RATE_LIMITS.resetsPerRecipient),
    limit(`reset-from:${clientAddress}`, RATE_LIMITS.resetsPerAddress),
  ])
  const user = await db.query.users.findFirst({ where: sql`lower(${users.email}) = ${address}` })
  if (!user || !taken.ok) return null
  const { token, hash } = newToken()
  await db.insert(passwordResets).values({ userId: user.id, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) })
  const [shop] = await db.select({ name: shops.name }).from(memberships).innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, user.id)).orderBy(asc(memberships.createdAt)).limit(1)
  return { token, userId: user.id, name: user.name, email: user.email, shopName: shop?.name ?? 'Rootplate' }
}

/**
 * The work behind "forgot password", run after the answer has gone out:
 * caps, lookup, link and message. The message carries no shop or sender tag,
 * so no mail viewer lists it to anyone but its recipient's own mailbox.
 */
export async function mailPasswordReset(db: Database, input: { email: string; clientAddress: string; origin: string }): Promise<void> {
  const reset = await requestPasswordReset(db, input.email, input.clientAddress)
  if (!reset) return
  const content = passwordResetMail({ shopName: reset.shopName, name: reset.name, link: `${input.origin}/reset/${reset.token}` })
  await sendMail({ to: reset.email, ...content })
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

export type ChangeResult = { ok: true; endedSessions: number } | { ok: false; reason: 'wrong-password' } | { ok: false; reason: 'limited'; retryAfterSeconds: number }

/**
 * A signed-in member changes their password; every other session of the
 * account ends. The current password is checked through the same queues as
 * a sign-in (the account's e-mail and the client's address), so a taken
 * session cannot guess it faster than the sign-in page could.
 */
export async function changePassword(
  db: Database,
  hasher: Hasher,
  input: { userId: string; current: string; password: string; keepSessionToken: string; address: string },
  wait: (ms: number) => Promise<void> = pause,
): Promise<ChangeResult> {
  const user = await db.query.users.findFirst({ where: eq(users.id, input.userId) })
  if (!user) return { ok: false, reason: 'wrong-password' }
  const email = user.email.toLowerCase()
  const claim = await claimSignIn(db, email, input.address, wait)
  if (!claim.ok) return { ok: false, reason: 'limited', retryAfterSeconds: retryAfterSeconds(claim.retryAfterMs) }
  if (!(await hasher.verify(user.passwordHash, input.current))) {
    if (claim.overLimit) return { ok: false, reason: 'limited', retryAfterSeconds: retryAfterSeconds(claim.retryAfterMs) }
    return { ok: false, reason: 'wrong-password' }
  }
  await releaseSignIn(db, email, input.address)
  return db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash: await hasher.make(input.password) }).where(eq(users.id, input.userId))
    const ended = await tx.delete(sessions)
      .where(and(eq(sessions.userId, input.userId), ne(sessions.id, hashToken(input.keepSessionToken))))
      .returning({ id: sessions.id })
    return { ok: true, endedSessions: ended.length } as const
  })
}

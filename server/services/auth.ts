import { and, asc, count, eq, gt, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { loginFailures, memberships, shops, users } from '../database/schema'
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

import { and, desc, eq, isNull, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { invitations, memberships, shops, users } from '../database/schema'
import type { ShopRole } from '../../shared/utils/permissions'
import type { Hasher } from './auth'
import { recordActivity } from './activity'
import { hashToken, newToken } from './tokens'

export const INVITATION_DAYS = 7
const lifetime = () => new Date(Date.now() + INVITATION_DAYS * 86_400_000)

export interface Actor { userId: string; shopId: string }

export type CreateResult =
  | { ok: true; id: string; token: string; shopName: string }
  | { ok: false; reason: 'member' | 'pending' }

/** A pending invitation of the shop by e-mail; its token is returned once and only its hash is stored. */
export async function createInvitation(db: Database, actor: Actor, input: { email: string; role: ShopRole }): Promise<CreateResult> {
  const email = input.email.trim().toLowerCase()
  return db.transaction(async (tx) => {
    const [member] = await tx.select({ id: memberships.id }).from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.shopId, actor.shopId), sql`lower(${users.email}) = ${email}`))
    if (member) return { ok: false, reason: 'member' } as const
    const [pending] = await tx.select({ id: invitations.id }).from(invitations)
      .where(and(eq(invitations.shopId, actor.shopId), eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.withdrawnAt), sql`${invitations.expiresAt} > now()`))
    if (pending) return { ok: false, reason: 'pending' } as const
    const { token, hash } = newToken()
    const [row] = await tx.insert(invitations).values({ shopId: actor.shopId, email, role: input.role, tokenHash: hash, invitedBy: actor.userId, expiresAt: lifetime() }).returning({ id: invitations.id })
    if (!row) throw new Error('insert returned no invitation')
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, action: 'invitation.sent', detail: { email, role: input.role } })
    const shop = await tx.query.shops.findFirst({ columns: { name: true }, where: eq(shops.id, actor.shopId) })
    return { ok: true, id: row.id, token, shopName: shop?.name ?? '' } as const
  })
}

/** Invitations not yet accepted or withdrawn, newest first; expired ones are listed as such so they can be sent again. */
export async function listPendingInvitations(db: Database, shopId: string) {
  const rows = await db.select({
    id: invitations.id,
    email: invitations.email,
    role: invitations.role,
    createdAt: invitations.createdAt,
    updatedAt: invitations.updatedAt,
    expiresAt: invitations.expiresAt,
    invitedBy: users.name,
  }).from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.shopId, shopId), isNull(invitations.acceptedAt), isNull(invitations.withdrawnAt)))
    .orderBy(desc(invitations.updatedAt))
  const now = Date.now()
  return rows.map(r => ({ ...r, expired: r.expiresAt.getTime() <= now }))
}

/** The address of a pending invitation of the shop, or null. */
export async function pendingInvitationEmail(db: Database, shopId: string, id: string): Promise<string | null> {
  const [row] = await db.select({ email: invitations.email }).from(invitations)
    .where(and(eq(invitations.id, id), eq(invitations.shopId, shopId), isNull(invitations.acceptedAt), isNull(invitations.withdrawnAt)))
  return row?.email ?? null
}

/** A fresh link for a pending invitation (the old link stops working) and another seven days. */
export async function renewInvitation(db: Database, actor: Actor, id: string): Promise<{ email: string; role: ShopRole; token: string; shopName: string } | null> {
  const { token, hash } = newToken()
  return db.transaction(async (tx) => {
    const [row] = await tx.update(invitations).set({ tokenHash: hash, expiresAt: lifetime() })
      .where(and(eq(invitations.id, id), eq(invitations.shopId, actor.shopId), isNull(invitations.acceptedAt), isNull(invitations.withdrawnAt)))
      .returning({ email: invitations.email, role: invitations.role })
    if (!row) return null
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, action: 'invitation.resent', detail: { email: row.email, role: row.role } })
    const shop = await tx.query.shops.findFirst({ columns: { name: true }, where: eq(shops.id, actor.shopId) })
    return { ...row, token, shopName: shop?.name ?? '' }
  })
}

export async function withdrawInvitation(db: Database, actor: Actor, id: string): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [row] = await tx.update(invitations).set({ withdrawnAt: new Date() })
      .where(and(eq(invitations.id, id), eq(invitations.shopId, actor.shopId), isNull(invitations.acceptedAt), isNull(invitations.withdrawnAt)))
      .returning({ email: invitations.email })
    if (!row) return false
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, action: 'invitation.withdrawn', detail: { email: row.email } })
    return true
  })
}

export type InvitationState = 'open' | 'used' | 'expired' | 'missing'

type InvitationRow = typeof invitations.$inferSelect

function stateOf(row: InvitationRow | undefined): InvitationState {
  if (!row || row.withdrawnAt) return 'missing'
  if (row.acceptedAt) return 'used'
  if (row.expiresAt.getTime() <= Date.now()) return 'expired'
  return 'open'
}

/** What the invitation page shows before anything is accepted. */
export async function describeInvitation(db: Database, token: string) {
  const row = await db.query.invitations.findFirst({ where: eq(invitations.tokenHash, hashToken(token)) })
  const state = stateOf(row)
  if (!row || state !== 'open') return { state } as const
  const shop = await db.query.shops.findFirst({ columns: { name: true }, where: eq(shops.id, row.shopId) })
  // Whether the address already has an account is not said: the page offers both ways and the server picks.
  return { state, email: row.email, role: row.role, shopName: shop?.name ?? '', expiresAt: row.expiresAt } as const
}

export type AcceptResult =
  | { ok: true; userId: string; shopId: string; joined: 'new-account' | 'existing-account' }
  | { ok: false; reason: InvitationState | 'name-required' | 'sign-in-required' }
  | { ok: false; reason: 'other-account'; signedInAs: string }
  | { ok: false; reason: 'weak-password'; message: string }

/**
 * Accepts an invitation once. The row is locked, so two tabs racing with one
 * link make one account at most.
 *
 * No password of an existing account is ever checked here (that would be a
 * second, unlimited sign-in): an address that already has an account joins
 * only from a session of that account, made through the limited sign-in.
 * Signed in as anyone else, nothing happens and the caller is told so, to
 * ask the person; the session is never swapped behind their back. Without a
 * session, a new account is made for the invited address.
 */
export async function acceptInvitation(
  db: Database,
  hasher: Hasher,
  token: string,
  input: { name?: string; password?: string },
  newPassword: { safeParse(v: unknown): { success: boolean; error?: { issues: { message: string }[] } } },
  signedIn: { userId: string; email: string } | null,
): Promise<AcceptResult> {
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(invitations).where(eq(invitations.tokenHash, hashToken(token))).for('update')
    const state = stateOf(row)
    if (!row || state !== 'open') return { ok: false, reason: state } as const
    let user = await tx.query.users.findFirst({ where: sql`lower(${users.email}) = ${row.email}` })
    let joined: 'new-account' | 'existing-account' = 'existing-account'
    if (signedIn) {
      if (!user || user.id !== signedIn.userId) return { ok: false, reason: 'other-account', signedInAs: signedIn.email } as const
    }
    else if (user) {
      return { ok: false, reason: 'sign-in-required' } as const
    }
    else {
      if (!input.name) return { ok: false, reason: 'name-required' } as const
      const rule = newPassword.safeParse(input.password)
      if (!rule.success) return { ok: false, reason: 'weak-password', message: rule.error?.issues[0]?.message ?? 'Choose a longer password' } as const
      const [created] = await tx.insert(users).values({ email: row.email, name: input.name, passwordHash: await hasher.make(input.password!) }).returning()
      user = created
      joined = 'new-account'
    }
    if (!user) throw new Error('no account after accepting')
    await tx.insert(memberships).values({ userId: user.id, shopId: row.shopId, role: row.role }).onConflictDoNothing()
    await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, row.id))
    await recordActivity(tx, { shopId: row.shopId, userId: user.id, action: 'invitation.accepted', detail: { email: row.email, role: row.role } })
    return { ok: true, userId: user.id, shopId: row.shopId, joined } as const
  })
}

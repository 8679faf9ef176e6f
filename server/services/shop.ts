import { and, asc, count, eq } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { memberships, sessions, shops, users } from '../database/schema'
import type { ShopRole } from '../../shared/utils/permissions'
import { recordActivity } from './activity'

export async function listMembers(db: Database, shopId: string) {
  return db.select({ id: users.id, name: users.name, email: users.email, role: memberships.role, since: memberships.createdAt })
    .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.shopId, shopId))
    .orderBy(asc(memberships.role), asc(users.name))
}

export interface Actor { userId: string; shopId: string }

export type MemberChange =
  | { ok: true; role?: ShopRole }
  | { ok: false; reason: 'not-found' | 'last-lead' }

type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

/**
 * Locks the shop's row, so every change that could remove a lead is
 * serialised: two leads demoting each other at once run one after the other,
 * and the second sees that only one lead is left.
 */
async function lockedTarget(tx: Tx, shopId: string, userId: string) {
  await tx.select({ id: shops.id }).from(shops).where(eq(shops.id, shopId)).for('update')
  const [target] = await tx.select({ id: memberships.id, role: memberships.role, email: users.email, name: users.name })
    .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)))
  if (!target) return null
  const [leads] = await tx.select({ n: count() }).from(memberships).where(and(eq(memberships.shopId, shopId), eq(memberships.role, 'lead')))
  return { ...target, leads: leads?.n ?? 0 }
}

export async function changeRole(db: Database, actor: Actor, userId: string, role: ShopRole): Promise<MemberChange> {
  return db.transaction(async (tx) => {
    const target = await lockedTarget(tx, actor.shopId, userId)
    if (!target) return { ok: false, reason: 'not-found' } as const
    if (target.role === 'lead' && role !== 'lead' && target.leads <= 1) return { ok: false, reason: 'last-lead' } as const
    if (target.role !== role) {
      await tx.update(memberships).set({ role }).where(eq(memberships.id, target.id))
      await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, action: 'member.role', detail: { email: target.email, name: target.name, from: target.role, to: role } })
    }
    return { ok: true, role } as const
  })
}

export async function removeMember(db: Database, actor: Actor, userId: string): Promise<MemberChange> {
  return db.transaction(async (tx) => {
    const target = await lockedTarget(tx, actor.shopId, userId)
    if (!target) return { ok: false, reason: 'not-found' } as const
    if (target.role === 'lead' && target.leads <= 1) return { ok: false, reason: 'last-lead' } as const
    await tx.delete(memberships).where(eq(memberships.id, target.id))
    // The membership join already refuses them; this also drops the rows.
    await tx.delete(sessions).where(and(eq(sessions.userId, userId), eq(sessions.shopId, actor.shopId)))
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, action: 'member.removed', detail: { email: target.email, name: target.name, role: target.role } })
    return { ok: true } as const
  })
}

export async function shopName(db: Database, shopId: string): Promise<string> {
  const [row] = await db.select({ name: shops.name }).from(shops).where(eq(shops.id, shopId))
  return row?.name ?? ''
}

/** The account's shops with its role in each, the current one marked. */
export async function listShopsOf(db: Database, userId: string, currentShopId: string) {
  const rows = await db.select({ id: shops.id, name: shops.name, role: memberships.role })
    .from(memberships).innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, userId)).orderBy(asc(memberships.createdAt))
  return rows.map(r => ({ ...r, current: r.id === currentShopId }))
}

export async function isMemberOf(db: Database, userId: string, shopId: string): Promise<boolean> {
  const [row] = await db.select({ id: memberships.id }).from(memberships).where(and(eq(memberships.userId, userId), eq(memberships.shopId, shopId)))
  return !!row
}

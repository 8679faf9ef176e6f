import { and, desc, eq, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { activity, designs, revisions, shares, shops, users } from '../database/schema'
import type { RevisionForExport } from './exports'
import { recordActivity } from './activity'
import { hashToken, newToken } from './tokens'

export interface Actor { userId: string; shopId: string }

export const MAX_SHARE_DAYS = 90

/** A share link for one revision of the shop; the token is returned once, only its hash is kept. */
export async function createShare(db: Database, actor: Actor, revisionId: string, input: { days: number; note: string }) {
  return db.transaction(async (tx) => {
    const [rev] = await tx.select({ id: revisions.id, number: revisions.number, designId: designs.id, designName: designs.name, shopName: shops.name })
      .from(revisions).innerJoin(designs, eq(designs.id, revisions.designId)).innerJoin(shops, eq(shops.id, designs.shopId))
      .where(and(eq(revisions.id, revisionId), eq(designs.shopId, actor.shopId)))
    if (!rev) return null
    const { token, hash } = newToken()
    const expiresAt = new Date(Date.now() + input.days * 86_400_000)
    const [row] = await tx.insert(shares).values({ shopId: actor.shopId, revisionId, tokenHash: hash, note: input.note, createdBy: actor.userId, expiresAt }).returning({ id: shares.id })
    if (!row) throw new Error('insert returned no share')
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, designId: rev.designId, action: 'share.created', detail: { shareId: row.id, revision: rev.number, days: input.days } })
    return { id: row.id, token, expiresAt, revision: rev.number, designName: rev.designName, shopName: rev.shopName, designId: rev.designId }
  })
}

/** The shares of one revision of the shop with how often each was downloaded; null when the revision is not the shop's. */
export async function listShares(db: Database, shopId: string, revisionId: string) {
  const [rev] = await db.select({ id: revisions.id }).from(revisions).innerJoin(designs, eq(designs.id, revisions.designId))
    .where(and(eq(revisions.id, revisionId), eq(designs.shopId, shopId)))
  if (!rev) return null
  const downloads = db.select({ shareId: sql<string>`${activity.detail}->>'shareId'`.as('share_id'), n: sql<number>`count(*)::int`.as('n') })
    .from(activity).where(and(eq(activity.shopId, shopId), eq(activity.action, 'share.download'))).groupBy(sql`1`).as('downloads')
  const rows = await db.select({
    id: shares.id, note: shares.note, createdAt: shares.createdAt, expiresAt: shares.expiresAt, withdrawnAt: shares.withdrawnAt,
    createdBy: users.name, downloads: sql<number>`coalesce(${downloads.n}, 0)`,
  }).from(shares)
    .leftJoin(users, eq(users.id, shares.createdBy))
    .leftJoin(downloads, eq(downloads.shareId, sql`${shares.id}::text`))
    .where(and(eq(shares.shopId, shopId), eq(shares.revisionId, revisionId)))
    .orderBy(desc(shares.createdAt))
  const now = Date.now()
  return rows.map(r => ({ ...r, state: r.withdrawnAt ? 'withdrawn' : r.expiresAt.getTime() <= now ? 'expired' : 'open' }))
}

/** Withdraws a live share of the shop; false when there is none (already withdrawn, or another shop's). */
export async function withdrawShare(db: Database, actor: Actor, id: string): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [row] = await tx.update(shares).set({ withdrawnAt: new Date() })
      .where(and(eq(shares.id, id), eq(shares.shopId, actor.shopId), sql`${shares.withdrawnAt} is null`))
      .returning({ revisionId: shares.revisionId })
    if (!row) return false
    const [rev] = await tx.select({ designId: revisions.designId, number: revisions.number }).from(revisions).where(eq(revisions.id, row.revisionId))
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, designId: rev?.designId, action: 'share.withdrawn', detail: { shareId: id, revision: rev?.number } })
    return true
  })
}

export interface OpenShare {
  id: string
  shopId: string
  shopName: string
  designId: string
  note: string
  expiresAt: Date
  revision: RevisionForExport
}

export type ShareLookup = { state: 'open'; share: OpenShare } | { state: 'missing' | 'expired' }

/**
 * What a share token opens: exactly one revision, plus the names needed to
 * label it. A withdrawn or unknown token is 'missing' (404), a lapsed one 'expired' (410).
 */
export async function openShare(db: Database, token: string): Promise<ShareLookup> {
  const [row] = await db.select({
    id: shares.id, shopId: shares.shopId, note: shares.note, expiresAt: shares.expiresAt, withdrawnAt: shares.withdrawnAt,
    shopName: shops.name, designId: designs.id, designName: designs.name, sizeLabel: designs.sizeLabel,
    number: revisions.number, params: revisions.params, createdAt: revisions.createdAt,
  }).from(shares)
    .innerJoin(revisions, eq(revisions.id, shares.revisionId))
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .innerJoin(shops, eq(shops.id, shares.shopId))
    .where(eq(shares.tokenHash, hashToken(token)))
  if (!row || row.withdrawnAt) return { state: 'missing' }
  if (row.expiresAt.getTime() <= Date.now()) return { state: 'expired' }
  return {
    state: 'open',
    share: {
      id: row.id, shopId: row.shopId, shopName: row.shopName, designId: row.designId, note: row.note, expiresAt: row.expiresAt,
      revision: { number: row.number, params: row.params, designName: row.designName, sizeLabel: row.sizeLabel, createdAt: row.createdAt },
    },
  }
}

/** Each download through a link is kept in the shop's activity, without a person. */
export async function recordShareDownload(db: Database, share: OpenShare, file: string, options: Record<string, unknown>): Promise<void> {
  await recordActivity(db, { shopId: share.shopId, designId: share.designId, action: 'share.download', detail: { shareId: share.id, revision: share.revision.number, file, ...options } })
}

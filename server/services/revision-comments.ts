// Comments on a revision: any member of the shop may read and leave them.
import { and, asc, eq, sql } from 'drizzle-orm'
import { z } from 'zod'
import type { Database } from '../utils/db'
import { textField } from '../utils/validation'
import { designs, revisionComments, revisions, users } from '../database/schema'
import { recordActivity } from './activity'

export interface Actor { userId: string; shopId: string }

/** The database's own check allows 1 to 2000 characters: the schema says so first, in words. */
export const COMMENT_MAX = 2000

export const commentInputSchema = z.object({
  body: textField(COMMENT_MAX, `Keep the comment under ${COMMENT_MAX} characters`).pipe(z.string().min(1, 'Write the comment first')),
}).strict()

export interface CommentRow { id: string; body: string; createdAt: Date; author: { id: string | null; name: string | null } }

/** The revision, if it is the shop's: its design and number (for the activity entry). */
async function revisionInShop(db: Pick<Database, 'select'>, shopId: string, revisionId: string) {
  const [row] = await db.select({ id: revisions.id, number: revisions.number, designId: designs.id })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .where(and(eq(revisions.id, revisionId), eq(designs.shopId, shopId)))
  return row ?? null
}

export const COMMENT_PAGE_MAX = 200

export const commentPageSchema = z.object({
  /** The last comment of the previous page: the next page starts after it. */
  after: z.uuid('Give the id of the last comment you have').optional(),
  limit: z.string().regex(/^\d{1,3}$/, 'Give a whole number from 1 to 200').transform(Number).pipe(z.number().min(1, 'At least 1').max(COMMENT_PAGE_MAX, `At most ${COMMENT_PAGE_MAX} at a time`)).default(100),
})

/**
 * One page of the revision's comments, oldest first, starting after the
 * comment `after` (keyset: creation time, then id); `more` says whether
 * another page follows. Null when the revision (or `after`) is not the shop's.
 */
export async function listComments(db: Database, shopId: string, revisionId: string, page: { after?: string; limit: number } = { limit: 100 }): Promise<{ comments: CommentRow[]; more: boolean } | null> {
  if (!await revisionInShop(db, shopId, revisionId)) return null
  const inRevision = and(eq(revisionComments.revisionId, revisionId), eq(revisionComments.shopId, shopId))
  let start
  if (page.after) {
    const [mark] = await db.select({ id: revisionComments.id }).from(revisionComments).where(and(inRevision, eq(revisionComments.id, page.after)))
    if (!mark) return null
    // Compared in the database: its timestamps carry microseconds, a JavaScript Date only milliseconds.
    start = sql`(${revisionComments.createdAt}, ${revisionComments.id}) > (select c.created_at, c.id from revision_comments c where c.id = ${page.after})`
  }
  const rows = await db.select({ id: revisionComments.id, body: revisionComments.body, createdAt: revisionComments.createdAt, authorId: revisionComments.authorId, authorName: users.name })
    .from(revisionComments)
    .leftJoin(users, eq(users.id, revisionComments.authorId))
    .where(and(inRevision, start))
    .orderBy(asc(revisionComments.createdAt), asc(revisionComments.id))
    .limit(page.limit + 1)
  const more = rows.length > page.limit
  return { comments: rows.slice(0, page.limit).map(r => ({ id: r.id, body: r.body, createdAt: r.createdAt, author: { id: r.authorId, name: r.authorName } })), more }
}

/** Leaves a comment and records it in the shop's activity; null when the revision is not the shop's. */
export async function addComment(db: Database, actor: Actor & { name: string }, revisionId: string, body: string): Promise<CommentRow | null> {
  return db.transaction(async (tx) => {
    const rev = await revisionInShop(tx, actor.shopId, revisionId)
    if (!rev) return null
    const [row] = await tx.insert(revisionComments).values({ shopId: actor.shopId, revisionId, authorId: actor.userId, body }).returning()
    if (!row) throw new Error('insert returned no comment')
    // A short excerpt: the activity list is a log, not a second copy of the comments.
    await recordActivity(tx, { shopId: actor.shopId, userId: actor.userId, designId: rev.designId, action: 'revision.comment', detail: { revision: rev.number, commentId: row.id, excerpt: body.length > 80 ? `${body.slice(0, 79)}…` : body } })
    return { id: row.id, body: row.body, createdAt: row.createdAt, author: { id: actor.userId, name: actor.name } }
  })
}

import { and, desc, eq, ilike, isNotNull, isNull, or, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { activity, designs, revisions, shows, users } from '../database/schema'

export interface Actor { userId: string; shopId: string }

export interface RevisionSummary {
  id: string
  number: number
  note: string
  createdAt: Date
  author: { id: string | null; name: string | null }
}

export interface RevisionDetail extends RevisionSummary {
  designId: string
  params: unknown
}

export interface DesignListItem {
  id: string
  name: string
  sizeLabel: string | null
  show: { id: string; name: string } | null
  latestRevision: number
  updatedAt: Date
  author: string | null
  quantity: number
  archivedAt: Date | null
  parentDesignId: string | null
  /** The latest revision's tube, so a size label can never be the only word on the size. */
  tubeDiameter: number | null
}

export interface DesignFilter {
  /** Words to find in the name, the size label or the show's name. */
  q?: string
  /** A show's id, or 'none' for designs in no show. */
  show?: string
  archived?: 'hide' | 'only' | 'all'
}

/** `%` and `_` typed into a search box are letters, not wildcards. */
/** Joins a design to its latest revision: the one every list, show, family and plan reads. */
export const latestRevisionOf = and(eq(revisions.designId, designs.id), eq(revisions.number, designs.latestRevision))

/** A design with its latest revision's id, number and params, as shows and families read it. */
export const designWithLatestColumns = {
  id: designs.id,
  name: designs.name,
  sizeLabel: designs.sizeLabel,
  quantity: designs.quantity,
  archivedAt: designs.archivedAt,
  parentDesignId: designs.parentDesignId,
  revisionId: revisions.id,
  number: revisions.number,
  params: revisions.params,
}

const likeText = (s: string) => `%${s.replace(/[\\%_]/g, c => `\\${c}`)}%`

export interface DesignDetail {
  id: string
  name: string
  sizeLabel: string | null
  show: { id: string; name: string } | null
  quantity: number
  archivedAt: Date | null
  parentDesignId: string | null
  createdAt: Date
  updatedAt: Date
  latest: RevisionDetail
}

const revisionColumns = {
  id: revisions.id,
  designId: revisions.designId,
  number: revisions.number,
  note: revisions.note,
  createdAt: revisions.createdAt,
  authorId: revisions.authorId,
  authorName: users.name,
}

type RevisionRow = { id: string; designId: string; number: number; note: string; createdAt: Date; authorId: string | null; authorName: string | null }

function summary(row: RevisionRow): RevisionSummary {
  return { id: row.id, number: row.number, note: row.note, createdAt: row.createdAt, author: { id: row.authorId, name: row.authorName } }
}

/** Designs of one shop with the author of their latest revision, newest first; archived ones only when asked. */
export async function listDesigns(db: Database, shopId: string, filter: DesignFilter = {}): Promise<DesignListItem[]> {
  const archived = filter.archived ?? 'hide'
  const words = (filter.q ?? '').split(/\s+/).filter(Boolean)
  const rows = await db.select({
    id: designs.id,
    name: designs.name,
    sizeLabel: designs.sizeLabel,
    showId: shows.id,
    showName: shows.name,
    latestRevision: designs.latestRevision,
    updatedAt: designs.updatedAt,
    author: users.name,
    quantity: designs.quantity,
    archivedAt: designs.archivedAt,
    parentDesignId: designs.parentDesignId,
    tubeDiameter: sql<number | null>`(${revisions.params}->>'tubeDiameter')::float8`,
  }).from(designs)
    .leftJoin(shows, eq(shows.id, designs.showId))
    .leftJoin(revisions, and(eq(revisions.designId, designs.id), eq(revisions.number, designs.latestRevision)))
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(and(
      eq(designs.shopId, shopId),
      archived === 'hide' ? isNull(designs.archivedAt) : archived === 'only' ? isNotNull(designs.archivedAt) : undefined,
      filter.show === 'none' ? isNull(designs.showId) : filter.show ? eq(designs.showId, filter.show) : undefined,
      ...words.map(w => or(ilike(designs.name, likeText(w)), ilike(designs.sizeLabel, likeText(w)), ilike(shows.name, likeText(w)))),
    ))
    .orderBy(desc(designs.updatedAt), designs.name)
  return rows.map(r => ({
    id: r.id,
    name: r.name,
    sizeLabel: r.sizeLabel,
    show: r.showId && r.showName ? { id: r.showId, name: r.showName } : null,
    latestRevision: r.latestRevision,
    updatedAt: r.updatedAt,
    author: r.author,
    quantity: r.quantity,
    archivedAt: r.archivedAt,
    parentDesignId: r.parentDesignId,
    tubeDiameter: r.tubeDiameter,
  }))
}

// Hot statements, built once per database and prepared on each connection:
// no SQL is rebuilt per request and PostgreSQL plans each once.
const preparedDesign = new WeakMap<Database, ReturnType<typeof prepareGetDesign>>()

function prepareGetDesign(db: Database) {
  return db.select({
    id: designs.id,
    name: designs.name,
    sizeLabel: designs.sizeLabel,
    showId: shows.id,
    showName: shows.name,
    quantity: designs.quantity,
    archivedAt: designs.archivedAt,
    parentDesignId: designs.parentDesignId,
    createdAt: designs.createdAt,
    updatedAt: designs.updatedAt,
    latest: { ...revisionColumns, params: revisions.params },
  }).from(designs)
    .innerJoin(revisions, latestRevisionOf)
    .leftJoin(shows, eq(shows.id, designs.showId))
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(designs.id, sql.placeholder('designId')), eq(designs.shopId, sql.placeholder('shopId'))))
    .prepare('get_design')
}

/** One design of the shop with its latest revision (one round trip); null when absent or in another shop. */
export async function getDesign(db: Database, shopId: string, designId: string): Promise<DesignDetail | null> {
  let query = preparedDesign.get(db)
  if (!query) {
    query = prepareGetDesign(db)
    preparedDesign.set(db, query)
  }
  const [row] = await query.execute({ designId, shopId })
  if (!row) return null
  return {
    id: row.id,
    name: row.name,
    sizeLabel: row.sizeLabel,
    show: row.showId && row.showName ? { id: row.showId, name: row.showName } : null,
    quantity: row.quantity,
    archivedAt: row.archivedAt,
    parentDesignId: row.parentDesignId,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    latest: { ...summary(row.latest), designId: row.latest.designId, params: row.latest.params },
  }
}

/** Every revision of a design of the shop, newest first; null when the design is not the shop's. */
export async function listRevisions(db: Database, shopId: string, designId: string): Promise<RevisionSummary[] | null> {
  const owner = await db.query.designs.findFirst({ columns: { id: true }, where: and(eq(designs.id, designId), eq(designs.shopId, shopId)) })
  if (!owner) return null
  const rows = await db.select(revisionColumns).from(revisions)
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(eq(revisions.designId, designId))
    .orderBy(desc(revisions.number))
  return rows.map(summary)
}

/** One revision with its params, when its design belongs to the shop. */
export async function getRevision(db: Database, shopId: string, revisionId: string): Promise<(RevisionDetail & { designName: string; sizeLabel: string | null }) | null> {
  const [row] = await db.select({ ...revisionColumns, params: revisions.params, designName: designs.name, sizeLabel: designs.sizeLabel })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.id, revisionId), eq(designs.shopId, shopId)))
  if (!row) return null
  return { ...summary(row), designId: row.designId, params: row.params, designName: row.designName, sizeLabel: row.sizeLabel }
}

export async function showInShop(db: Database, shopId: string, showId: string): Promise<boolean> {
  const row = await db.query.shows.findFirst({ columns: { id: true }, where: and(eq(shows.id, showId), eq(shows.shopId, shopId)) })
  return !!row
}

export interface NewDesign { name: string; sizeLabel?: string | null; showId?: string | null; params: unknown; note?: string }

/** A design and its first revision, in one transaction. */
export async function createDesign(db: Database, actor: Actor, input: NewDesign): Promise<{ id: string; revision: { id: string; number: number } }> {
  return db.transaction(async (tx) => {
    const [design] = await tx.insert(designs).values({
      shopId: actor.shopId,
      showId: input.showId ?? null,
      name: input.name,
      sizeLabel: input.sizeLabel ?? null,
      latestRevision: 1,
      createdBy: actor.userId,
    }).returning({ id: designs.id })
    if (!design) throw new Error('insert returned no design')
    const [revision] = await tx.insert(revisions).values({
      designId: design.id,
      number: 1,
      params: input.params,
      note: input.note ?? 'First revision',
      authorId: actor.userId,
    }).returning({ id: revisions.id, number: revisions.number })
    if (!revision) throw new Error('insert returned no revision')
    await tx.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId: design.id, action: 'design.created', detail: { name: input.name } })
    return { id: design.id, revision }
  })
}

export type SaveResult =
  | { ok: true; revision: RevisionSummary }
  | { ok: false; reason: 'not-found' }
  | { ok: false; reason: 'conflict'; latest: RevisionSummary }

/**
 * Saves a new revision on top of `basedOn`, in one statement (one round trip,
 * one implicit transaction): the guarded UPDATE takes the design's row lock,
 * so of many racing saves on the same base exactly one matches
 * `latest_revision = basedOn`; the others match nothing and, through the
 * chained CTEs, insert nothing. The unique (design, number) index backs this up.
 */
export async function saveRevision(
  db: Database,
  actor: Actor,
  designId: string,
  input: { params: unknown; note: string; basedOn: number },
): Promise<SaveResult> {
  const client = db.$client
  // Tagged-template queries of postgres.js are prepared per connection.
  const [row] = await client<{ id: string; number: number; note: string; created_at: string | Date; author_name: string | null }[]>`
    with bumped as (
      update designs set latest_revision = latest_revision + 1, updated_at = now()
      where id = ${designId}::uuid and shop_id = ${actor.shopId}::uuid and latest_revision = ${input.basedOn}::int
      returning latest_revision
    ), inserted as (
      insert into revisions (design_id, number, params, note, author_id)
      select ${designId}::uuid, latest_revision, ${JSON.stringify(input.params)}::jsonb, ${input.note}::text, ${actor.userId}::uuid from bumped
      returning id, number, note, created_at
    ), logged as (
      insert into activity (shop_id, user_id, design_id, action, detail)
      select ${actor.shopId}::uuid, ${actor.userId}::uuid, ${designId}::uuid, 'revision.saved', jsonb_build_object('number', number, 'note', note) from inserted
    )
    select inserted.id, inserted.number, inserted.note, inserted.created_at,
      (select name from users where id = ${actor.userId}::uuid) as author_name
    from inserted`
  if (row) {
    return {
      ok: true,
      revision: { id: row.id, number: row.number, note: row.note, createdAt: new Date(row.created_at), author: { id: actor.userId, name: row.author_name } },
    } as const
  }
  // Nothing saved: the design is not the shop's, or someone saved first.
  const current = await db.query.designs.findFirst({ columns: { latestRevision: true }, where: and(eq(designs.id, designId), eq(designs.shopId, actor.shopId)) })
  if (!current) return { ok: false, reason: 'not-found' } as const
  const [latest] = await db.select(revisionColumns).from(revisions)
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.designId, designId), eq(revisions.number, current.latestRevision)))
  if (!latest) throw new Error(`design ${designId} has no revision ${current.latestRevision}`)
  return { ok: false, reason: 'conflict', latest: summary(latest) } as const
}

// Size families: sizes derived from one design, each a design of its own on
// its own measured tube, each remembering which revision of its parent it
// last followed, so the parent can say which sizes are behind.
import { and, asc, eq, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { activity, designs, revisions } from '../database/schema'
import { deriveForTube, formatLength, plateParamsSchema, type PlateParams } from '../../geometry/core'
import type { Actor } from './designs'
import { latestRevisionOf, designWithLatestColumns } from './designs'

export interface FamilyMember {
  id: string
  name: string
  sizeLabel: string | null
  quantity: number
  archivedAt: Date | null
  latest: { id: string; number: number; params: unknown }
}

export interface FamilySize extends FamilyMember {
  /** The parent's revision this size was last derived from (null when that revision is gone). */
  follows: { id: string; number: number } | null
  behind: boolean
}

export interface Family {
  parent: FamilyMember
  sizes: FamilySize[]
}

const tubeOf = (params: unknown) => sql<number>`(${params}->>'tubeDiameter')::float8`

async function member(db: Database, shopId: string, id: string): Promise<(FamilyMember & { parentDesignId: string | null }) | null> {
  const [row] = await db.select(designWithLatestColumns).from(designs)
    .innerJoin(revisions, latestRevisionOf)
    .where(and(eq(designs.id, id), eq(designs.shopId, shopId)))
  if (!row) return null
  const { revisionId, number, params, ...rest } = row
  return { ...rest, latest: { id: revisionId, number, params } }
}

/**
 * The family a design belongs to: its parent and the parent's sizes when it is
 * a size, else itself and its own sizes (smallest tube first). Null when the
 * design is not the shop's.
 */
export async function getFamily(db: Database, shopId: string, designId: string): Promise<Family | null> {
  const start = await member(db, shopId, designId)
  if (!start) return null
  const parentRow = start.parentDesignId ? await member(db, shopId, start.parentDesignId) : null
  const parent = parentRow ?? start
  const rows = await db.select({
    id: designs.id,
    name: designs.name,
    sizeLabel: designs.sizeLabel,
    quantity: designs.quantity,
    archivedAt: designs.archivedAt,
    revisionId: revisions.id,
    number: revisions.number,
    params: revisions.params,
    followsId: designs.parentRevisionId,
    followsNumber: sql<number | null>`(select r.number from ${revisions} r where r.id = ${designs.parentRevisionId})`,
  }).from(designs)
    .innerJoin(revisions, latestRevisionOf)
    .where(and(eq(designs.shopId, shopId), eq(designs.parentDesignId, parent.id)))
    .orderBy(asc(tubeOf(revisions.params)), asc(designs.name))
  const { parentDesignId: _, ...parentOut } = parent
  return {
    parent: parentOut,
    sizes: rows.map(r => ({
      id: r.id,
      name: r.name,
      sizeLabel: r.sizeLabel,
      quantity: r.quantity,
      archivedAt: r.archivedAt,
      latest: { id: r.revisionId, number: r.number, params: r.params },
      follows: r.followsId && r.followsNumber !== null ? { id: r.followsId, number: r.followsNumber } : null,
      behind: r.followsId !== parent.latest.id,
    })),
  }
}

function readStored(params: unknown): PlateParams | null {
  const parsed = plateParamsSchema.safeParse(params)
  return parsed.success ? parsed.data : null
}

/** Both units, so a note reads right whatever the reader chose. */
const bothUnits = (mm: number) => `${formatLength(mm, 'in')} (${formatLength(mm, 'mm')})`

export interface NewSize { label: string; tubeDiameter: number; name?: string }

export type MakeSizesResult =
  | { ok: true; sizes: { id: string; name: string; sizeLabel: string; revision: { id: string; number: number } }[] }
  | { ok: false; reason: 'not-found' | 'unreadable' }

/**
 * A design per size, derived from the parent's latest revision for its tube
 * (deriveForTube: hardware keeps its size, the look follows the trunk). Asked
 * of a size, the sizes are made from its parent. Sizes join the parent's show;
 * all are made in one transaction or none.
 */
export async function makeSizes(db: Database, actor: Actor, designId: string, sizes: NewSize[]): Promise<MakeSizesResult> {
  const start = await member(db, actor.shopId, designId)
  if (!start) return { ok: false, reason: 'not-found' }
  // Sizes asked for from a size join its family: every size follows the one parent, never a chain.
  const parent = (start.parentDesignId ? await member(db, actor.shopId, start.parentDesignId) : null) ?? start
  const parentId = parent.id
  const parentParams = readStored(parent.latest.params)
  if (!parentParams) return { ok: false, reason: 'unreadable' }
  const row = await db.query.designs.findFirst({ columns: { showId: true }, where: eq(designs.id, parentId) })
  return db.transaction(async (tx) => {
    const made = []
    for (const size of sizes) {
      const params = deriveForTube(parentParams, size.tubeDiameter)
      const name = size.name || parent.name
      const [design] = await tx.insert(designs).values({
        shopId: actor.shopId,
        showId: row?.showId ?? null,
        name,
        sizeLabel: size.label,
        latestRevision: 1,
        createdBy: actor.userId,
        parentDesignId: parent.id,
        parentRevisionId: parent.latest.id,
      }).returning({ id: designs.id })
      if (!design) throw new Error('insert returned no design')
      const [revision] = await tx.insert(revisions).values({
        designId: design.id,
        number: 1,
        params,
        note: `Size “${size.label}” of ${parent.name} r${parent.latest.number}, on a ${bothUnits(params.tubeDiameter)} tube`,
        authorId: actor.userId,
      }).returning({ id: revisions.id, number: revisions.number })
      if (!revision) throw new Error('insert returned no revision')
      await tx.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId: design.id, action: 'design.size-made', detail: { name, sizeLabel: size.label, parent: parent.name, parentRevision: parent.latest.number } })
      made.push({ id: design.id, name, sizeLabel: size.label, revision })
    }
    return { ok: true, sizes: made } as const
  })
}

/** What a size would become if brought up to the parent's latest revision: the parent re-derived for the size's own tube. */
export function sizeUpdate(parentParams: PlateParams, sizeParams: unknown): PlateParams | null {
  const own = readStored(sizeParams)
  return own ? deriveForTube(parentParams, own.tubeDiameter) : null
}

export type UpdateSizesResult =
  | { ok: true; saved: { id: string; revision: { id: string; number: number } }[] }
  | { ok: false; reason: 'not-found' | 'unreadable' }
  | { ok: false; reason: 'parent-moved'; latest: number }
  | { ok: false; reason: 'not-a-size'; id: string }
  | { ok: false; reason: 'conflict'; id: string; name: string; latest: number }

class Abort extends Error {
  constructor(readonly result: UpdateSizesResult) { super('aborted') }
}

/**
 * Brings the accepted sizes up to the parent's latest revision: each gets a
 * new revision derived for its own tube, noted with the parent's revision, and
 * now follows it. `parentRevision` and each `basedOn` are what the person
 * looked at in the preview: if the parent or a size moved since, nothing is
 * saved (409), so no one accepts a preview of something that changed.
 */
export async function bringSizesUpToDate(
  db: Database,
  actor: Actor,
  parentId: string,
  input: { parentRevision: number; sizes: { id: string; basedOn: number }[] },
): Promise<UpdateSizesResult> {
  const parent = await member(db, actor.shopId, parentId)
  if (!parent) return { ok: false, reason: 'not-found' }
  if (parent.latest.number !== input.parentRevision) return { ok: false, reason: 'parent-moved', latest: parent.latest.number }
  const parentParams = readStored(parent.latest.params)
  if (!parentParams) return { ok: false, reason: 'unreadable' }
  try {
    return await db.transaction(async (tx) => {
      const saved = []
      for (const want of input.sizes) {
        const size = await member(tx as unknown as Database, actor.shopId, want.id)
        if (!size || size.parentDesignId !== parent.id) throw new Abort({ ok: false, reason: 'not-a-size', id: want.id })
        const params = sizeUpdate(parentParams, size.latest.params)
        if (!params) throw new Abort({ ok: false, reason: 'unreadable' })
        // The guarded update is the lock: a size saved since the preview matches nothing.
        const [bumped] = await tx.update(designs)
          .set({ latestRevision: sql`${designs.latestRevision} + 1`, parentRevisionId: parent.latest.id })
          .where(and(eq(designs.id, want.id), eq(designs.shopId, actor.shopId), eq(designs.latestRevision, want.basedOn)))
          .returning({ number: designs.latestRevision })
        if (!bumped) throw new Abort({ ok: false, reason: 'conflict', id: size.id, name: size.name, latest: size.latest.number })
        const note = `Brought up to date with ${parent.name} r${parent.latest.number}`
        const [revision] = await tx.insert(revisions).values({ designId: want.id, number: bumped.number, params, note, authorId: actor.userId })
          .returning({ id: revisions.id, number: revisions.number })
        if (!revision) throw new Error('insert returned no revision')
        await tx.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId: want.id, action: 'revision.saved', detail: { number: revision.number, note } })
        saved.push({ id: want.id, revision })
      }
      return { ok: true, saved } as const
    })
  }
  catch (err: unknown) {
    if (err instanceof Abort) return err.result
    throw err
  }
}

/** Cuts a size loose from its parent: it keeps its revisions and own changes and is no longer reported behind. */
export async function detachSize(db: Database, actor: Actor, id: string): Promise<'ok' | 'not-found' | 'not-a-size'> {
  const row = await db.query.designs.findFirst({ columns: { parentDesignId: true, name: true }, where: and(eq(designs.id, id), eq(designs.shopId, actor.shopId)) })
  if (!row) return 'not-found'
  if (!row.parentDesignId) return 'not-a-size'
  await db.update(designs).set({ parentDesignId: null, parentRevisionId: null }).where(and(eq(designs.id, id), eq(designs.shopId, actor.shopId)))
  await db.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId: id, action: 'design.detached', detail: { name: row.name } })
  return 'ok'
}

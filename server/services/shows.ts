// Shows (the productions that group designs) and the details of a design that
// are not its shape: name, size label, show, how many the show needs, archive.
import { and, asc, eq, isNotNull, isNull, ne, sql } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { activity, designs, revisions, shows } from '../database/schema'
import { plateFigures, type PlateFigures } from './plate-figures'
import type { Actor } from './designs'
import { latestRevisionOf, designWithLatestColumns } from './designs'

export interface ShowRow {
  id: string
  name: string
  venue: string | null
  opensOn: string | null
  archivedAt: Date | null
  designCount: number
}

export type Archived = 'hide' | 'only' | 'all'

function archivedFilter(column: typeof shows.archivedAt | typeof designs.archivedAt, archived: Archived) {
  if (archived === 'hide') return isNull(column)
  if (archived === 'only') return isNotNull(column)
  return undefined
}

/** The shop's shows with how many live designs each holds, by name. */
export async function listShows(db: Database, shopId: string, archived: Archived = 'hide'): Promise<ShowRow[]> {
  const rows = await db.select({
    id: shows.id,
    name: shows.name,
    venue: shows.venue,
    opensOn: shows.opensOn,
    archivedAt: shows.archivedAt,
    designCount: sql<number>`(select count(*)::int from ${designs} where ${designs.showId} = ${shows.id} and ${designs.archivedAt} is null)`,
  }).from(shows)
    .where(and(eq(shows.shopId, shopId), archivedFilter(shows.archivedAt, archived)))
    .orderBy(asc(sql`lower(${shows.name})`))
  return rows
}

export interface ShowInput { name?: string; venue?: string | null; opensOn?: string | null; archived?: boolean }

export type ShowResult = { ok: true; show: ShowRow } | { ok: false; reason: 'not-found' } | { ok: false; reason: 'duplicate' }

async function nameTaken(db: Database, shopId: string, name: string, except?: string): Promise<boolean> {
  const row = await db.query.shows.findFirst({
    columns: { id: true },
    where: and(eq(shows.shopId, shopId), sql`lower(${shows.name}) = lower(${name})`, isNull(shows.archivedAt), except ? ne(shows.id, except) : undefined),
  })
  return !!row
}

async function showRow(db: Database, shopId: string, id: string): Promise<ShowRow | null> {
  const rows = await listShows(db, shopId, 'all')
  return rows.find(r => r.id === id) ?? null
}

/** A new show; two live shows of a shop never share a name (it is how the crew tells them apart). */
export async function createShow(db: Database, actor: Actor, input: ShowInput & { name: string }): Promise<ShowResult> {
  if (await nameTaken(db, actor.shopId, input.name)) return { ok: false, reason: 'duplicate' }
  const [row] = await db.insert(shows).values({
    shopId: actor.shopId,
    name: input.name,
    venue: input.venue ?? null,
    opensOn: input.opensOn ?? null,
  }).returning({ id: shows.id })
  if (!row) throw new Error('insert returned no show')
  await db.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, action: 'show.created', detail: { name: input.name } })
  return { ok: true, show: (await showRow(db, actor.shopId, row.id))! }
}

/** Renames, re-dates or archives (and restores) a show of the shop. Its designs stay as they are. */
export async function updateShow(db: Database, actor: Actor, id: string, input: ShowInput): Promise<ShowResult> {
  const current = await db.query.shows.findFirst({ where: and(eq(shows.id, id), eq(shows.shopId, actor.shopId)) })
  if (!current) return { ok: false, reason: 'not-found' }
  const name = input.name ?? current.name
  const live = input.archived === undefined ? current.archivedAt === null : !input.archived
  if (live && await nameTaken(db, actor.shopId, name, id)) return { ok: false, reason: 'duplicate' }
  await db.update(shows).set({
    ...(input.name !== undefined ? { name: input.name } : {}),
    ...(input.venue !== undefined ? { venue: input.venue } : {}),
    ...(input.opensOn !== undefined ? { opensOn: input.opensOn } : {}),
    ...(input.archived !== undefined ? { archivedAt: input.archived ? (current.archivedAt ?? new Date()) : null } : {}),
  }).where(and(eq(shows.id, id), eq(shows.shopId, actor.shopId)))
  const action = input.archived === true && !current.archivedAt ? 'show.archived' : input.archived === false && current.archivedAt ? 'show.restored' : 'show.changed'
  await db.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, action, detail: { name, ...(name !== current.name ? { was: current.name } : {}) } })
  return { ok: true, show: (await showRow(db, actor.shopId, id))! }
}

export interface ShowDesign {
  id: string
  name: string
  sizeLabel: string | null
  quantity: number
  archivedAt: Date | null
  parentDesignId: string | null
  latest: { id: string; number: number }
  /** From the latest revision; null only for stored params the current schema no longer reads. */
  tubeDiameter: number | null
  /** One plate's estimated weight, kg (plywood only; see the metrics' density source). */
  weight: number | null
  width: number | null
  height: number | null
  errors: number
  warnings: number
}

export interface ShowDetail extends ShowRow {
  designs: ShowDesign[]
  totals: { plates: number; weight: number; designs: number }
}

/**
 * The figures of each revision's plate, kept by revision id: revisions never
 * change, so a plate is built once, not on every view of every show. Least
 * recently used first out; a few hundred bytes each.
 */
const figuresByRevision = new Map<string, PlateFigures>()
const FIGURES_KEPT = 20_000

function keep(id: string, figures: PlateFigures): void {
  figuresByRevision.delete(id)
  figuresByRevision.set(id, figures)
  while (figuresByRevision.size > FIGURES_KEPT) figuresByRevision.delete(figuresByRevision.keys().next().value!)
}

/** Builds the plates of revisions not yet seen (on the worker pool, through the route's runner). */
export type BuildFigures = (revisions: { id: string; params: unknown }[]) => Promise<Record<string, PlateFigures>>

/** Builds them in this thread: for scripts and tests without a pool. */
export const buildFiguresHere: BuildFigures = async revisions => Object.fromEntries(revisions.map(r => [r.id, plateFigures(r.params)]))

/**
 * A show with its live designs, each with the figures of its latest
 * revision's plate as the server builds it (nothing computed is taken from a
 * client; each revision's plate built once, on a worker), and the totals the
 * shop orders and lifts by: plates and their weight, each times its quantity.
 * `built` says how many plates this answer had to build.
 */
export async function getShow(db: Database, shopId: string, id: string, build: BuildFigures = buildFiguresHere): Promise<{ show: ShowDetail; built: number } | null> {
  const show = await showRow(db, shopId, id)
  if (!show) return null
  const rows = await db.select(designWithLatestColumns).from(designs)
    .innerJoin(revisions, latestRevisionOf)
    .where(and(eq(designs.shopId, shopId), eq(designs.showId, id), isNull(designs.archivedAt)))
    .orderBy(asc(sql`lower(${designs.name})`), asc(sql`(${revisions.params}->>'tubeDiameter')::float8`))
  const missing = rows.filter(r => !figuresByRevision.has(r.revisionId))
  const unique = [...new Map(missing.map(r => [r.revisionId, { id: r.revisionId, params: r.params }])).values()]
  const made = unique.length ? await build(unique) : {}
  for (const r of unique) if (made[r.id]) keep(r.id, made[r.id]!)
  const out: ShowDesign[] = rows.map((r) => {
    const figures = made[r.revisionId] ?? figuresByRevision.get(r.revisionId)!
    return {
      id: r.id,
      name: r.name,
      sizeLabel: r.sizeLabel,
      quantity: r.quantity,
      archivedAt: r.archivedAt,
      parentDesignId: r.parentDesignId,
      latest: { id: r.revisionId, number: r.number },
      ...figures,
    }
  })
  return {
    built: unique.length,
    show: {
      ...show,
      designs: out,
      totals: {
        designs: out.length,
        plates: out.reduce((n, d) => n + d.quantity, 0),
        weight: out.reduce((w, d) => w + d.quantity * (d.weight ?? 0), 0),
      },
    },
  }
}

export interface DesignDetailsInput { name?: string; sizeLabel?: string | null; showId?: string | null; quantity?: number; archived?: boolean }

export type DesignDetailsResult =
  | { ok: true; design: { id: string; name: string; sizeLabel: string | null; showId: string | null; quantity: number; archivedAt: Date | null } }
  | { ok: false; reason: 'not-found' | 'show-not-found' }

/**
 * Renames a design, moves it to a show, sets its size label or quantity, or
 * archives and restores it. Nothing here touches its revisions: archiving
 * only takes it out of the lists.
 */
export async function updateDesignDetails(db: Database, actor: Actor, id: string, input: DesignDetailsInput): Promise<DesignDetailsResult> {
  return db.transaction(async (tx) => {
    const current = await tx.query.designs.findFirst({ where: and(eq(designs.id, id), eq(designs.shopId, actor.shopId)) })
    if (!current) return { ok: false, reason: 'not-found' } as const
    if (input.showId) {
      const show = await tx.query.shows.findFirst({ columns: { id: true }, where: and(eq(shows.id, input.showId), eq(shows.shopId, actor.shopId)) })
      if (!show) return { ok: false, reason: 'show-not-found' } as const
    }
    const [row] = await tx.update(designs).set({
      ...(input.name !== undefined ? { name: input.name } : {}),
      ...(input.sizeLabel !== undefined ? { sizeLabel: input.sizeLabel || null } : {}),
      ...(input.showId !== undefined ? { showId: input.showId } : {}),
      ...(input.quantity !== undefined ? { quantity: input.quantity } : {}),
      ...(input.archived !== undefined ? { archivedAt: input.archived ? (current.archivedAt ?? new Date()) : null } : {}),
    }).where(and(eq(designs.id, id), eq(designs.shopId, actor.shopId)))
      .returning({ id: designs.id, name: designs.name, sizeLabel: designs.sizeLabel, showId: designs.showId, quantity: designs.quantity, archivedAt: designs.archivedAt })
    if (!row) return { ok: false, reason: 'not-found' } as const
    const changed = Object.keys(input).filter(k => input[k as keyof DesignDetailsInput] !== undefined)
    const action = input.archived === true && !current.archivedAt ? 'design.archived' : input.archived === false && current.archivedAt ? 'design.restored' : 'design.changed'
    await tx.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId: id, action, detail: { name: row.name, fields: changed, ...(row.name !== current.name ? { was: current.name } : {}) } })
    return { ok: true, design: row } as const
  })
}

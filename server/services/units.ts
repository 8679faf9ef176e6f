import { and, asc, count, desc, eq, ilike, isNull, lt, or, sql, type SQL } from 'drizzle-orm'
import type { Database } from '../utils/db'
import { activity, attachments, designs, revisions, unitEvents, unitLoans, units, users } from '../database/schema'
import type { UnitKind, UnitStatus } from '../../shared/utils/units'
import type { Actor } from './designs'
import { attachmentUrl } from './uploads'

export interface UnitFilter { status?: UnitStatus; kind?: UnitKind; designId?: string; q?: string }
export interface NewUnit { kind: UnitKind; label: string; designId?: string | null; revisionId?: string | null; sizeLabel?: string | null; status?: UnitStatus; location?: string; notes?: string }
export type UnitPatch = Partial<Pick<NewUnit, 'label' | 'sizeLabel' | 'status' | 'location' | 'notes' | 'revisionId'>>

export type UnitError = { ok: false; reason: 'not-found' | 'bad-design' | 'bad-revision' | 'label-taken' | 'on-loan' | 'not-lendable' | 'not-on-loan' | 'before-out' }

const listColumns = {
  id: units.id,
  kind: units.kind,
  label: units.label,
  status: units.status,
  sizeLabel: units.sizeLabel,
  location: units.location,
  notes: units.notes,
  designId: units.designId,
  designName: designs.name,
  revisionId: units.revisionId,
  revisionNumber: revisions.number,
  updatedAt: units.updatedAt,
  createdAt: units.createdAt,
  loanId: unitLoans.id,
  borrower: unitLoans.borrower,
  outOn: unitLoans.outOn,
  dueOn: unitLoans.dueOn,
}

type LoanColumns = { loanId: string | null; borrower: string | null; outOn: string | null; dueOn: string | null }
function fromList(today: string) {
  return <R extends LoanColumns>(r: R) => {
    const { loanId, borrower, outOn, dueOn, ...rest } = r
    return {
      ...rest,
      loan: loanId ? { id: loanId, borrower: borrower!, outOn: outOn!, dueOn: dueOn!, overdue: dueOn! < today } : null,
    }
  }
}

function baseQuery(db: Database) {
  return db.select(listColumns).from(units)
    .leftJoin(designs, eq(designs.id, units.designId))
    .leftJoin(revisions, eq(revisions.id, units.revisionId))
    .leftJoin(unitLoans, and(eq(unitLoans.unitId, units.id), isNull(unitLoans.returnedOn)))
}

/** ISO date of today in the server's zone; loans are kept by calendar day. */
export function today(now = new Date()): string {
  const local = new Date(now.getTime() - now.getTimezoneOffset() * 60_000)
  return local.toISOString().slice(0, 10)
}

export async function listUnits(db: Database, shopId: string, filter: UnitFilter = {}, now = today()) {
  const where: SQL[] = [eq(units.shopId, shopId)]
  if (filter.status) where.push(eq(units.status, filter.status))
  if (filter.kind) where.push(eq(units.kind, filter.kind))
  if (filter.designId) where.push(eq(units.designId, filter.designId))
  if (filter.q) {
    const like = `%${filter.q.replace(/[\\%_]/g, m => `\\${m}`)}%`
    where.push(or(ilike(units.label, like), ilike(units.location, like), ilike(units.notes, like), ilike(designs.name, like))!)
  }
  const rows = await baseQuery(db).where(and(...where)).orderBy(asc(units.label))
  return rows.map(fromList(now))
}

/** Units out on loan past their due date, soonest due first. */
export async function overdueLoans(db: Database, shopId: string, now = today()) {
  const rows = await baseQuery(db)
    .where(and(eq(units.shopId, shopId), lt(unitLoans.dueOn, now)))
    .orderBy(asc(unitLoans.dueOn))
  return rows.map(fromList(now))
}

export async function getUnit(db: Database, shopId: string, id: string, now = today()) {
  const [row] = await baseQuery(db).where(and(eq(units.id, id), eq(units.shopId, shopId)))
  if (!row) return null
  const [history, loans, photos] = await Promise.all([
    db.select({ id: unitEvents.id, action: unitEvents.action, changes: unitEvents.changes, createdAt: unitEvents.createdAt, userName: users.name })
      .from(unitEvents).leftJoin(users, eq(users.id, unitEvents.userId))
      .where(eq(unitEvents.unitId, id)).orderBy(desc(unitEvents.createdAt), desc(unitEvents.id)),
    db.select({ id: unitLoans.id, borrower: unitLoans.borrower, outOn: unitLoans.outOn, dueOn: unitLoans.dueOn, returnedOn: unitLoans.returnedOn })
      .from(unitLoans).where(eq(unitLoans.unitId, id)).orderBy(desc(unitLoans.outOn), desc(unitLoans.createdAt)),
    db.select({ id: attachments.id, kind: attachments.kind, name: attachments.name, size: attachments.size, createdAt: attachments.createdAt })
      .from(attachments).where(eq(attachments.unitId, id)).orderBy(desc(attachments.createdAt)),
  ])
  return { ...fromList(now)(row), history, loans, photos: photos.map(p => ({ ...p, url: attachmentUrl(p.id) })) }
}

type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

async function record(tx: Tx, actor: Actor, unit: { id: string; label: string; designId: string | null }, action: string, changes: Record<string, unknown>) {
  await tx.insert(unitEvents).values({ unitId: unit.id, userId: actor.userId, action, changes })
  await tx.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId: unit.designId, action: `unit.${action}`, detail: { unitId: unit.id, label: unit.label, ...changes } })
}

async function checkRevision(tx: Tx, shopId: string, designId: string | null | undefined, revisionId: string | null | undefined) {
  if (!designId) return revisionId ? 'bad-revision' as const : null
  const design = await tx.query.designs.findFirst({ columns: { id: true, sizeLabel: true, latestRevision: true }, where: and(eq(designs.id, designId), eq(designs.shopId, shopId)) })
  if (!design) return 'bad-design' as const
  if (revisionId) {
    const rev = await tx.query.revisions.findFirst({ columns: { id: true }, where: and(eq(revisions.id, revisionId), eq(revisions.designId, designId)) })
    if (!rev) return 'bad-revision' as const
  }
  return design
}

function isUniqueViolation(err: unknown): boolean {
  const e = err as { code?: string; cause?: { code?: string } }
  return e?.code === '23505' || e?.cause?.code === '23505'
}

export async function createUnit(db: Database, actor: Actor, input: NewUnit): Promise<{ ok: true; id: string } | UnitError> {
  try {
    return await db.transaction(async (tx) => {
      const design = await checkRevision(tx, actor.shopId, input.designId, input.revisionId)
      if (design === 'bad-design' || design === 'bad-revision') return { ok: false, reason: design } as const
      let revisionId = input.revisionId ?? null
      if (design && !revisionId) {
        const latest = await tx.query.revisions.findFirst({ columns: { id: true }, where: and(eq(revisions.designId, design.id), eq(revisions.number, design.latestRevision)) })
        revisionId = latest?.id ?? null
      }
      const [row] = await tx.insert(units).values({
        shopId: actor.shopId,
        kind: input.kind,
        label: input.label,
        designId: design?.id ?? null,
        revisionId,
        sizeLabel: input.sizeLabel ?? design?.sizeLabel ?? null,
        status: input.status ?? 'cut',
        location: input.location ?? '',
        notes: input.notes ?? '',
        createdBy: actor.userId,
      }).returning()
      if (!row) throw new Error('insert returned no unit')
      await record(tx, actor, row, 'created', { status: [null, row.status], label: [null, row.label] })
      return { ok: true, id: row.id } as const
    })
  }
  catch (err: unknown) {
    if (isUniqueViolation(err)) return { ok: false, reason: 'label-taken' }
    throw err
  }
}

/** Changes what was sent; the history keeps each changed field's before and after. */
export async function updateUnit(db: Database, actor: Actor, id: string, patch: UnitPatch): Promise<{ ok: true } | UnitError> {
  try {
    return await db.transaction(async (tx) => {
      // Row lock: two people moving the same unit at once are applied one after the other.
      const [unit] = await tx.select().from(units).where(and(eq(units.id, id), eq(units.shopId, actor.shopId))).for('update')
      if (!unit) return { ok: false, reason: 'not-found' } as const
      if (patch.revisionId !== undefined) {
        const check = await checkRevision(tx, actor.shopId, unit.designId, patch.revisionId)
        if (check === 'bad-design' || check === 'bad-revision') return { ok: false, reason: 'bad-revision' } as const
      }
      if (patch.status && patch.status !== unit.status && unit.status === 'on_loan') return { ok: false, reason: 'on-loan' } as const
      const changes: Record<string, [unknown, unknown]> = {}
      for (const key of ['label', 'sizeLabel', 'status', 'location', 'notes', 'revisionId'] as const) {
        const next = patch[key]
        if (next !== undefined && next !== unit[key]) changes[key] = [unit[key], next]
      }
      if (!Object.keys(changes).length) return { ok: true } as const
      await tx.update(units).set({ ...Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, v[1]])), updatedAt: new Date() }).where(eq(units.id, id))
      await record(tx, actor, { ...unit, label: patch.label ?? unit.label }, changes.status ? 'status' : 'updated', changes)
      return { ok: true } as const
    })
  }
  catch (err: unknown) {
    if (isUniqueViolation(err)) return { ok: false, reason: 'label-taken' }
    throw err
  }
}

export async function lendUnit(db: Database, actor: Actor, id: string, loan: { borrower: string; outOn: string; dueOn: string }): Promise<{ ok: true; loanId: string } | UnitError> {
  return db.transaction(async (tx) => {
    const [unit] = await tx.select().from(units).where(and(eq(units.id, id), eq(units.shopId, actor.shopId))).for('update')
    if (!unit) return { ok: false, reason: 'not-found' } as const
    if (unit.status === 'on_loan') return { ok: false, reason: 'on-loan' } as const
    if (unit.status === 'retired') return { ok: false, reason: 'not-lendable' } as const
    const [row] = await tx.insert(unitLoans).values({ unitId: id, ...loan, createdBy: actor.userId }).returning({ id: unitLoans.id })
    if (!row) throw new Error('insert returned no loan')
    await tx.update(units).set({ status: 'on_loan', updatedAt: new Date() }).where(eq(units.id, id))
    await record(tx, actor, unit, 'lent', { status: [unit.status, 'on_loan'], borrower: loan.borrower, outOn: loan.outOn, dueOn: loan.dueOn })
    return { ok: true, loanId: row.id } as const
  })
}

/** Closes the open loan and puts the unit back in stock. */
export async function returnUnit(db: Database, actor: Actor, id: string, returnedOn: string): Promise<{ ok: true } | UnitError> {
  return db.transaction(async (tx) => {
    const [unit] = await tx.select().from(units).where(and(eq(units.id, id), eq(units.shopId, actor.shopId))).for('update')
    if (!unit) return { ok: false, reason: 'not-found' } as const
    const open = await tx.query.unitLoans.findFirst({ where: and(eq(unitLoans.unitId, id), isNull(unitLoans.returnedOn)) })
    if (!open) return { ok: false, reason: 'not-on-loan' } as const
    if (returnedOn < open.outOn) return { ok: false, reason: 'before-out' } as const
    await tx.update(unitLoans).set({ returnedOn }).where(eq(unitLoans.id, open.id))
    await tx.update(units).set({ status: 'in_stock', updatedAt: new Date() }).where(eq(units.id, id))
    await record(tx, actor, unit, 'returned', { status: [unit.status, 'in_stock'], borrower: open.borrower, returnedOn })
    return { ok: true } as const
  })
}

/** How many units were built from each revision of a design, and how many are out on loan. */
export async function unitCounts(db: Database, shopId: string, designId: string) {
  const design = await db.query.designs.findFirst({ columns: { id: true }, where: and(eq(designs.id, designId), eq(designs.shopId, shopId)) })
  if (!design) return null
  return db.select({
    revisionId: units.revisionId,
    number: revisions.number,
    built: count(),
    active: sql<number>`count(*) filter (where ${units.status} <> 'retired')`.mapWith(Number),
    onLoan: sql<number>`count(*) filter (where ${units.status} = 'on_loan')`.mapWith(Number),
  }).from(units)
    .leftJoin(revisions, eq(revisions.id, units.revisionId))
    .where(and(eq(units.designId, designId), eq(units.shopId, shopId), eq(units.kind, 'plate')))
    .groupBy(units.revisionId, revisions.number)
    .orderBy(desc(revisions.number))
}

import { sql } from 'drizzle-orm'
import journal from '../database/migrations/meta/_journal.json'
import { databaseProblem, type Database } from './db'

export type MigrationState =
  | { ok: true }
  | { ok: false; reason: 'unreachable'; message: string }
  | { ok: false; reason: 'missing'; message: string }

/** The newest migration this build was made with (drizzle records its `when` as created_at). */
const expected = journal.entries.at(-1)

/**
 * Whether the database carries this build's migrations: drizzle's own
 * bookkeeping table must hold the newest migration of the build's journal.
 */
export async function checkMigrations(db: Database): Promise<MigrationState> {
  if (!expected) return { ok: true }
  try {
    const rows = await db.execute<{ newest: string | null }>(sql`select max(created_at)::text as newest from drizzle.__drizzle_migrations`)
    const newest = Number(rows[0]?.newest ?? 0)
    if (newest >= expected.when) return { ok: true }
    return { ok: false, reason: 'missing', message: `its newest migration is older than ${expected.tag}` }
  }
  catch (err: unknown) {
    const problem = databaseProblem(err)
    if (problem === 'unreachable') return { ok: false, reason: 'unreachable', message: err instanceof Error ? err.message : String(err) }
    if (problem === 'unmigrated') return { ok: false, reason: 'missing', message: 'it has no migrations table' }
    throw err
  }
}

let seen = false
let pending: Promise<MigrationState> | null = null

/** Called once the migrations have been seen in place; later requests skip the check. */
export function markMigrationsChecked() {
  seen = true
}

/**
 * Until the migrations have been seen once (the database was away at start,
 * or is not Rootplate's), each call checks again, sharing one check among
 * concurrent callers. Once seen, it costs one boolean test.
 */
export async function migrationsReady(db: Database): Promise<MigrationState> {
  if (seen) return { ok: true }
  pending ??= checkMigrations(db).then((state) => {
    if (state.ok) seen = true
    return state
  }).finally(() => { pending = null })
  return pending
}

import { createHash } from 'node:crypto'
import { drizzle } from 'drizzle-orm/postgres-js'
import postgres from 'postgres'
import * as schema from '../database/schema'

export { schema }
export type Database = ReturnType<typeof createDatabase>

/**
 * The default port of the project's own cluster, derived from the checkout's
 * folder exactly as scripts/db.sh does, so two checkouts on one machine never
 * share a cluster by accident. PG_PORT overrides it.
 */
export function defaultPgPort(root = process.cwd()): number {
  const hex = createHash('md5').update(root).digest('hex').slice(0, 4)
  return 55500 + (Number.parseInt(hex, 16) % 1000)
}

export function databaseUrl(): string {
  return process.env.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${process.env.PG_PORT ?? defaultPgPort()}/rootplate`
}

/** Pool size: each save holds a connection for one short transaction; more than the cores' worth only queues in PostgreSQL. */
const POOL_MAX = Number(process.env.DB_POOL_MAX ?? 10)

export function createDatabase(url = databaseUrl()) {
  // A short connect timeout: while the database is away, requests answer 503
  // within seconds instead of hanging for postgres.js' default 30 s.
  const client = postgres(url, { max: POOL_MAX, connect_timeout: 5, onnotice: () => {} })
  return drizzle(client, { schema, casing: 'snake_case' })
}

let instance: Database | undefined

/** The one database entry point of the server. */
export function useDb(): Database {
  instance ??= createDatabase()
  return instance
}

// Connection-level failures: the server is down, restarting, refusing
// connections, or the network between is gone. SQLSTATE class 08 and the
// shutdown codes of class 57; postgres.js' own codes for closed sockets.
const UNREACHABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE',
  'CONNECT_TIMEOUT', 'CONNECTION_CLOSED', 'CONNECTION_ENDED', 'CONNECTION_DESTROYED',
  '57P01', '57P02', '57P03', '53300', '3D000',
  '08000', '08001', '08003', '08004', '08006',
])
// The database answers but lacks Rootplate's tables: another checkout's
// cluster on this port, or migrations not applied.
const UNMIGRATED_CODES = new Set(['42P01', '3F000'])

export type DatabaseProblem = 'unreachable' | 'unmigrated'

/** Whether an error (or any error it wraps) means the database is away or is not Rootplate's. */
export function databaseProblem(err: unknown): DatabaseProblem | null {
  let e: unknown = err
  for (let depth = 0; e && typeof e === 'object' && depth < 6; depth++) {
    const code = (e as { code?: unknown }).code
    if (typeof code === 'string') {
      if (UNREACHABLE_CODES.has(code)) return 'unreachable'
      if (UNMIGRATED_CODES.has(code)) return 'unmigrated'
    }
    const errors = (e as { errors?: unknown }).errors
    if (Array.isArray(errors) && errors.some(inner => databaseProblem(inner) === 'unreachable')) return 'unreachable'
    e = (e as { cause?: unknown }).cause
  }
  return null
}

export const DATABASE_MESSAGES: Record<DatabaseProblem, string> = {
  unreachable: 'Rootplate cannot reach its database right now. Nothing you send is saved until it is back; try again in a moment.',
  unmigrated: 'Rootplate\'s database does not carry its tables (migrations not applied, or another checkout\'s database on this port). Run `npm run db:migrate`, or check PG_PORT and DATABASE_URL.',
}

import { drizzle } from 'drizzle-orm/postgres-js'
import postgres from 'postgres'
import * as schema from '../database/schema'

export { schema }
export type Database = ReturnType<typeof createDatabase>

export function databaseUrl(): string {
  return process.env.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${process.env.PG_PORT ?? 55432}/rootplate`
}

export function createDatabase(url = databaseUrl()) {
  const client = postgres(url, { max: 10, onnotice: () => {} })
  return drizzle(client, { schema, casing: 'snake_case' })
}

let instance: Database | undefined

/** The one database entry point of the server. */
export function useDb(): Database {
  instance ??= createDatabase()
  return instance
}

import { sql } from 'drizzle-orm'
import type { Database } from '../utils/db'

/** One round trip to the database; throws (and so answers 503) when it is away. */
export async function databaseHealth(db: Database): Promise<{ ok: true }> {
  await db.execute(sql`select 1`)
  return { ok: true }
}

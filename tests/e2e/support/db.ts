import postgres from 'postgres'
import { inject } from 'vitest'

/** Runs one statement on the test database, for a test to age its own rows (expired links). */
export async function testSql<T extends readonly object[] = postgres.Row[]>(query: string, params: postgres.ParameterOrJSON<never>[] = []): Promise<T> {
  const sql = postgres(inject('databaseUrl'), { max: 1, onnotice: () => {} })
  try {
    return (await sql.unsafe(query, params)) as unknown as T
  }
  finally {
    await sql.end()
  }
}

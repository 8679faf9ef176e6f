// Applies the committed migrations. Run before the server starts (Nitro does
// not wait for async plugins) and in the tests' global setup.
import { migrate } from 'drizzle-orm/postgres-js/migrator'
import { fileURLToPath } from 'node:url'
import { createDatabase } from '../server/utils/db'

export async function applyMigrations(url?: string): Promise<void> {
  const db = createDatabase(url)
  try {
    await migrate(db, { migrationsFolder: fileURLToPath(new URL('../server/database/migrations', import.meta.url)) })
  }
  finally {
    await db.$client.end()
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  applyMigrations().then(
    () => console.log('migrations applied'),
    (err: unknown) => {
      console.error('migration failed:', err instanceof Error ? err.message : err)
      process.exit(1)
    },
  )
}

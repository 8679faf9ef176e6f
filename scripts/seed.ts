// Seeds the demo shop on an empty database (idempotent: skips when any user exists).
import { fileURLToPath } from 'node:url'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { createDatabase } from '../server/utils/db'
import { seedDemo } from '../server/database/seed/demo'
import { normaliseParams } from '../server/utils/params'

// The same hashing nuxt-auth-utils uses with its default options.
export const hasher = new Hash(new Scrypt({}))

export async function runSeed(url?: string): Promise<boolean> {
  const db = createDatabase(url)
  try {
    return await seedDemo(db, hasher, normaliseParams)
  }
  finally {
    await db.$client.end()
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  runSeed().then(
    done => console.log(done ? 'demo shop seeded' : 'database already has users; demo seed skipped'),
    (err: unknown) => {
      console.error('seed failed:', err instanceof Error ? err.message : err)
      process.exit(1)
    },
  )
}

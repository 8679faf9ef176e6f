// Issue 15, backup and restore: `npm run db:backup` writes a pg_dump custom
// format file and prints its path last; `npm run db:restore -- FILE` puts it
// back with --clean. Round trip on a throwaway database: what comes back is
// read with an independent query and compared row by row with the source.
import { existsSync, rmSync } from 'node:fs'
import { afterAll, describe, expect, it, inject } from 'vitest'
import { asc, eq } from 'drizzle-orm'
import { createDatabase } from '../../server/utils/db'
import { designs, revisions } from '../../server/database/schema'
import { recreateDatabase, withDatabase } from './support/fixtures'
import { npmRun } from './support/cluster'
import postgres from 'postgres'

const source = inject('databaseUrl')
const throwaway = withDatabase(source, `rootplate_backup_${process.pid}_test`)
let file = ''

afterAll(async () => {
  if (file && existsSync(file)) rmSync(file)
  const admin = postgres(withDatabase(source, 'postgres'), { max: 1, onnotice: () => {} })
  await admin.unsafe(`drop database if exists "${new URL(throwaway).pathname.slice(1)}" with (force)`)
  await admin.end()
})

async function snapshot(url: string) {
  const db = createDatabase(url)
  try {
    return {
      designs: await db.select({ id: designs.id, name: designs.name, latest: designs.latestRevision }).from(designs).orderBy(asc(designs.id)),
      revisions: await db.select({ id: revisions.id, number: revisions.number, params: revisions.params, note: revisions.note }).from(revisions).orderBy(asc(revisions.id)),
    }
  }
  finally {
    await db.$client.end()
  }
}

describe('npm run db:backup and db:restore', () => {
  it('round-trips the database: every design and revision comes back, and a restore replaces what changed since', async () => {
    const out = npmRun('db:backup', [], { DATABASE_URL: source })
    file = out.trim().split('\n').at(-1)!
    expect(file).toMatch(/\.data\/backups\/.+\.dump$/)
    expect(existsSync(file)).toBe(true)

    await recreateDatabase(throwaway)
    expect(npmRun('db:restore', [file], { DATABASE_URL: throwaway })).toMatch(/restored/)
    const original = await snapshot(source)
    const restored = await snapshot(throwaway)
    expect(original.designs.length).toBeGreaterThan(0)
    expect(restored).toEqual(original)

    // A change after the backup is gone after the next restore (--clean).
    const db = createDatabase(throwaway)
    try {
      const [first] = await db.select().from(designs).limit(1)
      await db.update(designs).set({ name: 'Renamed after the backup' }).where(eq(designs.id, first!.id))
      // The restored database still refuses to change a revision (the trigger came back too).
      const [rev] = await db.select().from(revisions).limit(1)
      await expect(db.update(revisions).set({ note: 'rewritten' }).where(eq(revisions.id, rev!.id))).rejects.toThrow()
    }
    finally {
      await db.$client.end()
    }
    npmRun('db:restore', [file], { DATABASE_URL: throwaway })
    expect(await snapshot(throwaway)).toEqual(original)
  })

  it('refuses a file that is not a backup, with a clear message and without touching the database', async () => {
    let message = ''
    try {
      npmRun('db:restore', ['package.json'], { DATABASE_URL: throwaway })
    }
    catch (err: unknown) {
      message = String((err as { stderr?: string }).stderr ?? err)
    }
    expect(message).toMatch(/not a backup/)
  })
})

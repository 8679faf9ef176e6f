import { afterAll, describe, expect, it, inject } from 'vitest'
import { eq } from 'drizzle-orm'
import { createDatabase } from '../../server/utils/db'
import { revisions } from '../../server/database/schema'

const db = createDatabase(inject('databaseUrl'))
afterAll(() => db.$client.end())

describe('the database itself', () => {
  it('refuses to change a saved revision', async () => {
    const [row] = await db.select().from(revisions).limit(1)
    expect(row).toBeTruthy()
    await expect(db.update(revisions).set({ note: 'rewritten history' }).where(eq(revisions.id, row!.id))).rejects.toThrow()
    const [again] = await db.select().from(revisions).where(eq(revisions.id, row!.id))
    expect(again!.note).toBe(row!.note)
  })

  it('refuses a second revision with the same number for one design', async () => {
    const [row] = await db.select().from(revisions).limit(1)
    await expect(db.insert(revisions).values({ designId: row!.designId, number: row!.number, params: {}, note: 'duplicate' })).rejects.toThrow()
  })
})

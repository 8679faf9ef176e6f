import postgres from 'postgres'
import { createDatabase, databaseUrl } from '../../../server/utils/db'
import { memberships, shops, users } from '../../../server/database/schema'
import { createDesign } from '../../../server/services/designs'
import { plateDefaults } from './plate'

export const OTHER_LEAD = { email: 'other-lead@harbour.test', password: 'harbour-test-pass', name: 'Casey Harbour' }
/** An account the sign-in limit test may lock without harming other tests. */
export const LIMIT_USER = { email: 'limit@harbour.test', password: 'harbour-test-pass', name: 'Robin Limit' }

/** A database URL with another database name. */
export function withDatabase(url: string, name: string): string {
  const u = new URL(url)
  u.pathname = `/${name}`
  return u.toString()
}

export function testDatabaseUrl(): string {
  if (process.env.TEST_DATABASE_URL) return process.env.TEST_DATABASE_URL
  const base = databaseUrl()
  const name = new URL(base).pathname.slice(1) || 'rootplate'
  return withDatabase(base, `${name}_test`)
}

/** Drops and creates the test database; never touches any other database. */
export async function recreateDatabase(url: string): Promise<void> {
  const name = new URL(url).pathname.slice(1)
  if (!/_test$/.test(name)) throw new Error(`refusing to drop ${name}: test databases end in _test`)
  const admin = postgres(withDatabase(url, 'postgres'), { max: 1, onnotice: () => {} })
  try {
    await admin.unsafe(`drop database if exists "${name}" with (force)`)
    await admin.unsafe(`create database "${name}"`)
  }
  finally {
    await admin.end()
  }
}

/** A second shop with its own lead and design, to prove shops cannot see each other. */
export async function seedOtherShop(url: string, hash: (p: string) => Promise<string>): Promise<{ designId: string; revisionId: string }> {
  const db = createDatabase(url)
  try {
    const [shop] = await db.insert(shops).values({ name: 'Harbour Lane Youth Theatre' }).returning()
    const [user] = await db.insert(users).values({ email: OTHER_LEAD.email, name: OTHER_LEAD.name, passwordHash: await hash(OTHER_LEAD.password) }).returning()
    if (!shop || !user) throw new Error('fixture insert failed')
    const [limited] = await db.insert(users).values({ email: LIMIT_USER.email, name: LIMIT_USER.name, passwordHash: await hash(LIMIT_USER.password) }).returning()
    if (!limited) throw new Error('fixture insert failed')
    await db.insert(memberships).values([
      { userId: user.id, shopId: shop.id, role: 'lead' },
      { userId: limited.id, shopId: shop.id, role: 'viewer' },
    ])
    const created = await createDesign(db, { userId: user.id, shopId: shop.id }, { name: 'Harbour piling', sizeLabel: '12 in tube', params: plateDefaults() })
    return { designId: created.id, revisionId: created.revision.id }
  }
  finally {
    await db.$client.end()
  }
}

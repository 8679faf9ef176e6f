import postgres from 'postgres'
import { createDatabase, databaseUrl } from '../../../server/utils/db'
import { memberships, shops, shows, users } from '../../../server/database/schema'
import { createDesign } from '../../../server/services/designs'
import { plateDefaults } from './plate'

export const OTHER_LEAD = { email: 'other-lead@harbour.test', password: 'harbour-test-pass', name: 'Casey Harbour' }
/** An account the sign-in limit test may lock without harming other tests. */
export const LIMIT_USER = { email: 'limit@harbour.test', password: 'harbour-test-pass', name: 'Robin Limit' }
/** The second shop's one show (invented), to prove shows stay inside their shop. */
export const OTHER_SHOW = 'Tides of Harbour Lane'

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
    await db.insert(shows).values({ shopId: shop.id, name: OTHER_SHOW, venue: 'Harbour Lane hall' })
    const created = await createDesign(db, { userId: user.id, shopId: shop.id }, { name: 'Harbour piling', sizeLabel: '12 in tube', params: plateDefaults() })
    return { designId: created.id, revisionId: created.revision.id }
  }
  finally {
    await db.$client.end()
  }
}

/**
 * A member of its own for a test that changes what belongs to a person (its
 * preferences), so no other test sees the change. Returns the e-mail and password.
 */
export async function createOwnMember(url: string, hash: (p: string) => Promise<string>, shopName: string, role: 'lead' | 'designer' | 'builder' | 'viewer'): Promise<{ email: string; password: string }> {
  const db = createDatabase(url)
  try {
    const shop = await db.query.shops.findFirst({ where: (t, { eq }) => eq(t.name, shopName) })
    if (!shop) throw new Error(`no shop named ${shopName}`)
    const email = `own-${crypto.randomUUID().slice(0, 8)}@harbour.test`
    const password = 'own-member-pass'
    const [user] = await db.insert(users).values({ email, name: 'Own Member', passwordHash: await hash(password) }).returning()
    if (!user) throw new Error('fixture insert failed')
    await db.insert(memberships).values({ userId: user.id, shopId: shop.id, role })
    return { email, password }
  }
  finally {
    await db.$client.end()
  }
}

/**
 * A shop of its own with one member per role asked for, for a test that
 * changes what belongs to people (their preferences) and must not touch the
 * demo shop's crew. Returns the members' sign-ins by role.
 */
export async function createOwnShop<R extends 'lead' | 'designer' | 'builder' | 'viewer'>(url: string, hash: (p: string) => Promise<string>, roles: R[]): Promise<Record<R, { email: string; password: string }>> {
  const db = createDatabase(url)
  const tag = crypto.randomUUID().slice(0, 8)
  try {
    const [shop] = await db.insert(shops).values({ name: `Own shop ${tag}` }).returning()
    if (!shop) throw new Error('fixture insert failed')
    const out = {} as Record<R, { email: string; password: string }>
    for (const role of roles) {
      const email = `${role}-${tag}@own-shop.test`
      const password = 'own-member-pass'
      const [user] = await db.insert(users).values({ email, name: `Own ${role}`, passwordHash: await hash(password) }).returning()
      if (!user) throw new Error('fixture insert failed')
      await db.insert(memberships).values({ userId: user.id, shopId: shop.id, role })
      out[role] = { email, password }
    }
    return out
  }
  finally {
    await db.$client.end()
  }
}

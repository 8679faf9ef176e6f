import { createHash } from 'node:crypto'
import { inject } from 'vitest'
import { createDatabase } from '../../../server/utils/db'
import { memberships, shops, users } from '../../../server/database/schema'
import { hasher } from '../../../scripts/seed'
import { api, freshAddress } from './api'


/** The value of the session cookie in a Cookie header. */
export function cookieValue(cookie: string): string {
  const value = cookie.split('; ').find(c => c.startsWith('nuxt-session='))?.slice('nuxt-session='.length)
  if (!value) throw new Error('no session cookie')
  return decodeURIComponent(value)
}

/** The sessions-table id of a cookie's session: SHA-256 of its token (computed here with node:crypto). */
export async function sessionRowId(cookie: string): Promise<string> {
  return createHash('sha256').update(cookieValue(cookie)).digest('hex')
}

let counter = 0
/** A unique address for one test's own account or invitation. */
export function uniqueEmail(tag: string): string {
  counter++
  return `${tag}-${Date.now().toString(36)}-${counter}@crew.test`
}

export interface TestPerson { id: string; email: string; password: string; name: string }

/** A shop of the test's own with the given people, so a test can change roles and passwords freely. */
export async function makeShop(name: string, people: { role: 'lead' | 'designer' | 'builder' | 'viewer'; name: string }[]): Promise<{ shopId: string; people: TestPerson[] }> {
  const db = createDatabase(inject('databaseUrl'))
  try {
    const [shop] = await db.insert(shops).values({ name }).returning()
    if (!shop) throw new Error('no shop')
    const out: TestPerson[] = []
    for (const p of people) {
      const email = uniqueEmail(p.name.toLowerCase().replace(/\W+/g, '-'))
      const password = `pw-${crypto.randomUUID()}`
      const [user] = await db.insert(users).values({ email, name: p.name, passwordHash: await hasher.make(password) }).returning()
      if (!user) throw new Error('no user')
      await db.insert(memberships).values({ userId: user.id, shopId: shop.id, role: p.role })
      out.push({ id: user.id, email, password, name: p.name })
    }
    return { shopId: shop.id, people: out }
  }
  finally {
    await db.$client.end()
  }
}

/** Signs in and returns the cookie, or throws with the server's answer. */
export async function signInAs(email: string, password: string): Promise<string> {
  const res = await api('/api/auth/login', { method: 'POST', body: { email, password }, address: freshAddress() })
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}: ${JSON.stringify(res.body)}`)
  return res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}

/** The cookie a response set (after accepting an invitation, for instance). */
export function setCookieOf(headers: Headers): string {
  return headers.getSetCookie().map(c => c.split(';')[0]).filter(c => c && !c.endsWith('=')).join('; ')
}

export function tokenOf(link: string): string {
  const token = link.split('/').pop() ?? ''
  if (!/^[\w-]{43}$/.test(token)) throw new Error(`no token in ${link}`)
  return token
}

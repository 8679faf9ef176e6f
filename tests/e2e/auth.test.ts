import { describe, expect, inject, it } from 'vitest'
import { api, demo, freshAddress, signIn } from './support/api'
import { makeShop } from './support/crew'
import { testSql } from './support/db'
import { LIMIT_USER } from './support/fixtures'

describe('sign-in', () => {
  it('signs in each demo account with its role and shop', async () => {
    for (const [role, email] of Object.entries(demo)) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email, password: 'rootplate-demo' }, address: freshAddress() })
      expect(res.status).toBe(200)
      expect(res.body.role).toBe(role)
      expect(res.body.shopName).toBe('Alder Street Players')
      expect(res.headers.getSetCookie().some(c => c.startsWith('nuxt-session='))).toBe(true)
    }
  })

  it('accepts the e-mail in any case and with spaces around it', async () => {
    const res = await api('/api/auth/login', { method: 'POST', body: { email: '  Designer@RootPlate.test ', password: 'rootplate-demo' }, address: freshAddress() })
    expect(res.status).toBe(200)
  })

  it('answers 401 for a wrong password and for an unknown account, with the same message', async () => {
    const wrong = await api('/api/auth/login', { method: 'POST', body: { email: demo.viewer, password: 'nope' }, address: freshAddress() })
    const unknown = await api('/api/auth/login', { method: 'POST', body: { email: 'nobody@rootplate.test', password: 'nope' }, address: freshAddress() })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body.message).toBe(unknown.body.message)
  })

  it('answers 422 with field messages for a malformed e-mail or an empty password', async () => {
    const res = await api('/api/auth/login', { method: 'POST', body: { email: 'not-an-email', password: '' }, address: freshAddress() })
    expect(res.status).toBe(422)
    expect(res.body.data.fields.email).toMatch(/e-mail/i)
    expect(res.body.data.fields.password).toMatch(/password/i)
  })

  it('answers 400 for a body that is not JSON', async () => {
    const res = await api('/api/auth/login', { method: 'POST', rawBody: '{"email":', address: freshAddress() })
    expect(res.status).toBe(400)
  })

  it('slows failed sign-ins per account with growing delays, not a lock-out: the right password still gets in', async () => {
    const email = LIMIT_USER.email
    for (let i = 0; i < 10; i++) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email, password: `wrong-${i}` }, address: freshAddress() })
      expect(res.status).toBe(401)
    }
    // Past the free tries a wrong password is 429 with a Retry-After (RFC 9110 section 10.2.3, seconds) that grows.
    const waits: number[] = []
    for (let i = 0; i < 4; i++) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email, password: `still-wrong-${i}` }, address: freshAddress() })
      expect(res.status).toBe(429)
      expect(res.body.message).toMatch(/too many failed sign-ins/i)
      waits.push(Number(res.headers.get('retry-after')))
    }
    for (let i = 1; i < waits.length; i++) expect(waits[i]).toBeGreaterThanOrEqual(waits[i - 1]!)
    expect(waits.at(-1)!).toBeGreaterThan(waits[0]!)
    // No lock-out: the account's owner signs in (after the pause the server makes them wait).
    const right = await api('/api/auth/login', { method: 'POST', body: { email, password: LIMIT_USER.password }, address: freshAddress() })
    expect(right.status).toBe(200)
    // And the right password cleared the account's count: a wrong one is a plain 401 again.
    const again = await api('/api/auth/login', { method: 'POST', body: { email, password: 'wrong-again' }, address: freshAddress() })
    expect(again.status).toBe(401)
  })

  it('limits failed sign-ins per address across accounts, yet never refuses the right password for the address alone', async () => {
    const address = freshAddress()
    for (let i = 0; i < 10; i++) {
      const res = await api('/api/auth/login', { method: 'POST', body: { email: `guess-${i}@rootplate.test`, password: 'x' }, address })
      expect(res.status).toBe(401)
    }
    const blocked = await api('/api/auth/login', { method: 'POST', body: { email: 'guess-11@rootplate.test', password: 'x' }, address })
    expect(blocked.status).toBe(429)
    const right = await api('/api/auth/login', { method: 'POST', body: { email: demo.lead, password: 'rootplate-demo' }, address })
    expect(right.status).toBe(200)
    const elsewhere = await api('/api/auth/login', { method: 'POST', body: { email: demo.lead, password: 'rootplate-demo' }, address: freshAddress() })
    expect(elsewhere.status).toBe(200)
  })

  it('signs out on the server: the ORIGINAL cookie, sent again, answers 401', async () => {
    const cookie = await signIn(demo.viewer)
    expect((await api('/api/designs', { cookie })).status).toBe(200)
    const out = await api('/api/auth/logout', { method: 'POST', cookie })
    expect(out.status).toBe(200)
    // Re-sending the cookie from before sign-out, as a stolen copy would be.
    const after = await api('/api/designs', { cookie })
    expect(after.status).toBe(401)
  })
})

// Issue 17 items 1, 2, 8 and 9. Status codes and texts are RFC 9110's
// (401 Unauthorized, 429 Too Many Requests from RFC 6585); X-Forwarded-For
// order as MDN describes it (each proxy appends the address it saw).
describe('sign-in limit under parallel tries and behind a proxy', () => {
  const wrongFrom = (address: string, email: string) => api('/api/auth/login', { method: 'POST', body: { email, password: 'not-the-password' }, address })

  it('40 parallel wrong passwords from one address get at most 10 checked 401 answers, the rest 429; the right password from there still gets in', async () => {
    const address = freshAddress()
    const tag = Date.now().toString(36)
    const answers = await Promise.all(Array.from({ length: 40 }, (_, i) => wrongFrom(address, `race-${tag}-${i}@rootplate.test`)))
    const statuses = answers.map(a => a.status)
    expect(statuses.filter(s => s === 401)).toHaveLength(10)
    expect(statuses.filter(s => s !== 401 && s !== 429)).toEqual([])
    const right = await api('/api/auth/login', { method: 'POST', body: { email: demo.builder, password: 'rootplate-demo' }, address })
    expect(right.status).toBe(200)
  })

  it('40 parallel wrong passwords for one account from 40 addresses get at most 10 checked 401 answers; its owner still signs in', async () => {
    const { people: [p] } = await makeShop('Parallel Players', [{ role: 'viewer', name: 'Pat Parallel' }])
    const answers = await Promise.all(Array.from({ length: 40 }, () => wrongFrom(freshAddress(), p!.email)))
    const statuses = answers.map(a => a.status)
    expect(statuses.filter(s => s === 401)).toHaveLength(10)
    expect(statuses.filter(s => s !== 401 && s !== 429)).toEqual([])
    const right = await api('/api/auth/login', { method: 'POST', body: { email: p!.email, password: p!.password }, address: freshAddress() })
    expect(right.status).toBe(200)
  })

  it('behind one trusted proxy the client is the RIGHTMOST X-Forwarded-For entry: a client cannot choose its bucket by writing one in front', async () => {
    const filled = freshAddress()
    for (let i = 0; i < 10; i++) expect((await wrongFrom(filled, `xff-${i}@rootplate.test`)).status).toBe(401)
    // The client wrote the full bucket's address itself; our proxy appended the real one: a fresh bucket.
    expect((await wrongFrom(`${filled}, ${freshAddress()}`, 'xff-a@rootplate.test')).status).toBe(401)
    // The client wrote a fresh address in front of its own: still its own, full bucket.
    expect((await wrongFrom(`${freshAddress()}, ${filled}`, 'xff-b@rootplate.test')).status).toBe(429)
  })

  it('forgets quiet buckets: a row older than the window is deleted by the next try', async () => {
    const key = `address:192.0.2.${1 + Math.floor(Math.random() * 250)}`
    await testSql(`insert into sign_in_limits (key, failures, updated_at) values ($1, 4, now() - interval '2 hours') on conflict (key) do update set updated_at = excluded.updated_at`, [key])
    expect((await wrongFrom(freshAddress(), 'quiet@rootplate.test')).status).toBe(401)
    expect(await testSql('select key from sign_in_limits where key = $1', [key])).toHaveLength(0)
  })
})

describe('the session cookie and status texts (issue 17 item 9)', () => {
  const base = () => inject('baseUrl')

  it('reads the session from the cookie only: the same token in an x-nuxt-session-session header is no session', async () => {
    const cookie = await signIn(demo.viewer)
    const value = decodeURIComponent(cookie.split('; ').find(c => c.startsWith('nuxt-session='))!.slice('nuxt-session='.length))
    expect((await fetch(`${base()}/api/designs`, { headers: { cookie } })).status).toBe(200)
    const viaHeader = await fetch(`${base()}/api/designs`, { headers: { 'x-nuxt-session-session': value } })
    expect(viaHeader.status).toBe(401)
  })

  it('sets no session cookie for anonymous requests: pages, the session route, refused API calls', async () => {
    for (const path of ['/login', '/', '/api/_auth/session', '/api/designs', '/api/me']) {
      const res = await fetch(`${base()}${path}`, { redirect: 'manual' })
      await res.arrayBuffer()
      expect(res.headers.getSetCookie(), path).toEqual([])
    }
    const session = await fetch(`${base()}/api/_auth/session`)
    expect(await session.json()).toEqual({})
  })

  it('gives status texts that match the status', async () => {
    const anonymous = await fetch(`${base()}/api/designs`)
    expect([anonymous.status, anonymous.statusText]).toEqual([401, 'Unauthorized'])
    const everywhere = await fetch(`${base()}/api/auth/logout-everywhere`, { method: 'POST' })
    expect([everywhere.status, everywhere.statusText]).toEqual([401, 'Unauthorized'])
    const wrong = await fetch(`${base()}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': freshAddress() }, body: JSON.stringify({ email: demo.viewer, password: 'nope' }) })
    expect([wrong.status, wrong.statusText]).toEqual([401, 'Unauthorized'])
    const viewer = await signIn(demo.viewer)
    const forbidden = await fetch(`${base()}/api/designs`, { method: 'POST', headers: { cookie: viewer, 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Not allowed', params: {} }) })
    expect([forbidden.status, forbidden.statusText]).toEqual([403, 'Forbidden'])
  })

  it('signing out of an anonymous request sets no cookie; signing out of a session clears it', async () => {
    const anonymous = await fetch(`${base()}/api/auth/logout`, { method: 'POST' })
    expect(anonymous.headers.getSetCookie()).toEqual([])
    const cookie = await signIn(demo.viewer)
    const out = await fetch(`${base()}/api/auth/logout`, { method: 'POST', headers: { cookie } })
    expect(out.headers.getSetCookie().some(c => /^nuxt-session=;.*Max-Age=0/i.test(c))).toBe(true)
  })
})

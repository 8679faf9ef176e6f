// Issue 17 items 4-7 and the header part of issue 15: body limits before
// parsing, JSON and same-origin only for changes, text PostgreSQL cannot
// store, integer bounds, caching and cookie flags. Expected statuses are
// RFC 9110's (403, 413, 415) and RFC 4918's 422; header meanings are from
// the Fetch standard (Sec-Fetch-Site), CSP Level 3, RFC 6265bis (cookies)
// and RFC 9111 (no-store).
import { request } from 'node:http'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { count, eq } from 'drizzle-orm'
import { createDatabase } from '../../server/utils/db'
import { designs, revisions, users } from '../../server/database/schema'
import { api, demo, freshAddress, signIn } from './support/api'
import { plateDefaults } from './support/plate'
import { listenerPid, residentBytes } from './support/process'

const db = createDatabase(inject('databaseUrl'))
afterAll(() => db.$client.end())

let designer: string
let designId: string
beforeAll(async () => {
  designer = await signIn(demo.designer)
  // A design of this file's own, so the demo designs are never changed.
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Hardening test stump', params: plateDefaults() } })
  expect(created.status).toBe(201)
  designId = created.body.id
})

async function designCount(): Promise<number> {
  const [row] = await db.select({ n: count() }).from(designs)
  return row!.n
}
async function revisionCount(): Promise<number> {
  const [row] = await db.select({ n: count() }).from(revisions).where(eq(revisions.designId, designId))
  return row!.n
}

/** A raw request, so headers fetch would not allow (Content-Length, Origin) can be set. */
function raw(path: string, opts: { method?: string; headers?: Record<string, string>; body?: string }) {
  return fetch(`${inject('baseUrl')}${path}`, { method: opts.method ?? 'POST', headers: opts.headers, body: opts.body })
}

describe('body limits, before the body is read (issue 17 item 4)', () => {
  it('a 50 MB sign-in body declared up front is refused with 413 and a JSON message, without the server reading it', async () => {
    const { hostname, port } = new URL(inject('baseUrl'))
    const status = await new Promise<{ status: number; body: string; sentBytes: number }>((resolve, reject) => {
      const req = request({ host: hostname, port, method: 'POST', path: '/api/auth/login', headers: { 'content-type': 'application/json', 'content-length': String(50 * 1024 * 1024), 'x-forwarded-for': freshAddress() } }, (res) => {
        let body = ''
        res.on('data', (d: Buffer) => { body += d.toString() })
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body, sentBytes: sent }))
      })
      req.on('error', reject)
      // Only 64 kB of the declared 50 MB are ever sent: the answer must come anyway.
      let sent = 65536
      req.write(Buffer.alloc(65536, 0x20))
    })
    expect(status.status).toBe(413)
    expect(JSON.parse(status.body).message).toMatch(/larger than this route takes/)
  })

  it('a 50 MB chunked body (no length given) is cut off at the limit: 413, and the server\'s memory stays roughly where it was', async () => {
    const pid = listenerPid(Number(new URL(inject('baseUrl')).port))
    expect(pid, 'the test server process could not be found through /proc').not.toBeNull()
    const before = residentBytes(pid!)
    const chunk = Buffer.alloc(1024 * 1024, 0x61)
    const stream = new ReadableStream<Uint8Array>({
      start(controller) {
        for (let i = 0; i < 50; i++) controller.enqueue(chunk)
        controller.close()
      },
    })
    const res = await fetch(`${inject('baseUrl')}/api/me/preferences`, { method: 'PATCH', headers: { 'content-type': 'application/json', cookie: designer }, body: stream, duplex: 'half' } as RequestInit).catch((err: unknown) => err)
    // Either the 413 arrives, or the server closed the socket after answering while we were still sending.
    if (res instanceof Response) {
      expect(res.status).toBe(413)
      expect((await res.json()).data.code).toBe('too-large')
    }
    const after = residentBytes(pid!)
    // Reading the whole body would have added at least 50 MB (main: +130 MB for a 50 MB sign-in body).
    expect(after - before).toBeLessThan(20 * 1024 * 1024)
    const prefs = await api('/api/me', { cookie: designer })
    expect(prefs.status).toBe(200)
  })

  it('a design body over 256 kB is 413; a preferences body with unknown keys is 422 naming them', async () => {
    const big = JSON.stringify({ name: 'Too big', params: { ...plateDefaults(), filler: 'x'.repeat(300 * 1024) } })
    const before = await designCount()
    const res = await raw('/api/designs', { headers: { 'content-type': 'application/json', cookie: designer }, body: big })
    expect(res.status).toBe(413)
    expect(await designCount()).toBe(before)

    const unknown = await api('/api/me/preferences', { method: 'PATCH', cookie: designer, body: { units: 'mm', colour: 'red' } })
    expect(unknown.status).toBe(422)
    const nested = await api('/api/me/preferences', { method: 'PATCH', cookie: designer, body: { export: { paper: 'a4', extra: 1 } } })
    expect(nested.status).toBe(422)
    const me = await api('/api/me', { cookie: designer })
    expect(me.body.preferences.units).not.toBe('mm')
  })
})

describe('changes only as JSON and only from this site (issue 17 item 5, issue 15 cross-site)', () => {
  const body = JSON.stringify({ name: 'Planted from elsewhere', params: {} })

  it('refuses a cross-origin POST (Origin of another site) with 403 and stores nothing', async () => {
    const before = await designCount()
    const res = await raw('/api/designs', { headers: { 'content-type': 'application/json', cookie: designer, origin: 'http://sibling.rootplate.test' }, body })
    expect(res.status).toBe(403)
    expect((await res.json()).message).toMatch(/other sites/)
    expect(await designCount()).toBe(before)
  })

  it('refuses a same-site but cross-origin request named by Sec-Fetch-Site', async () => {
    const before = await designCount()
    const res = await raw('/api/designs', { headers: { 'content-type': 'application/json', cookie: designer, 'sec-fetch-site': 'same-site' }, body })
    expect(res.status).toBe(403)
    expect(await designCount()).toBe(before)
  })

  it('refuses the multipart-with-a-JSON-body trick (no preflight needed) and text/plain with 415, storing nothing', async () => {
    const before = await designCount()
    const multipart = await raw('/api/designs', { headers: { 'content-type': 'multipart/form-data', cookie: designer }, body })
    expect(multipart.status).toBe(415)
    expect((await multipart.json()).message).toMatch(/JSON/)
    const text = await raw('/api/designs', { headers: { 'content-type': 'text/plain', cookie: designer }, body })
    expect(text.status).toBe(415)
    const form = await raw('/api/auth/login', { headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-forwarded-for': freshAddress() }, body: 'email=designer%40rootplate.test&password=rootplate-demo' })
    expect(form.status).toBe(415)
    expect(await designCount()).toBe(before)
  })

  it('still takes a same-origin JSON request from the browser (Origin equal to the site, Sec-Fetch-Site same-origin)', async () => {
    const res = await raw('/api/designs', { headers: { 'content-type': 'application/json', cookie: designer, origin: inject('baseUrl'), 'sec-fetch-site': 'same-origin' }, body: JSON.stringify({ name: 'Same-origin stump', params: plateDefaults() }) })
    expect(res.status).toBe(201)
  })
})

describe('input that used to reach PostgreSQL and fail with 500 (issue 17 item 6)', () => {
  it('basedOn beyond the integer column (2147483648) is 422 and stores nothing', async () => {
    const before = await revisionCount()
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: designer, body: { params: plateDefaults(), note: 'overflow', basedOn: 2147483648 } })
    expect(res.status).toBe(422)
    expect(res.body.data.fields.basedOn).toBeTruthy()
    expect(await revisionCount()).toBe(before)
  })

  it.each([
    ['a NUL character', 'Root\u0000ball'],
    ['a lone high surrogate', 'Root\ud800ball'],
    ['a lone low surrogate', 'Root\udc00ball'],
  ])('%s in a name or a note is 422 naming the field, and nothing is stored', async (_what, bad) => {
    const designsBefore = await designCount()
    const byName = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: bad, params: plateDefaults() } })
    expect(byName.status).toBe(422)
    expect(byName.body.data.fields.name).toMatch(/control character|broken symbol/)
    const byNote = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Fine name', note: bad, params: plateDefaults() } })
    expect(byNote.status).toBe(422)
    expect(byNote.body.data.fields.note).toBeTruthy()
    expect(await designCount()).toBe(designsBefore)

    const revisionsBefore = await revisionCount()
    const current = await api(`/api/designs/${designId}`, { cookie: designer })
    const save = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: designer, body: { params: plateDefaults(), note: bad, basedOn: current.body.latest.number } })
    expect(save.status).toBe(422)
    expect(await revisionCount()).toBe(revisionsBefore)
  })

  it('a well-formed emoji (a surrogate pair) is kept as written', async () => {
    const res = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Beech 🌳 small', params: plateDefaults() } })
    expect(res.status).toBe(201)
    const back = await api(`/api/designs/${res.body.id}`, { cookie: designer })
    expect(back.body.name).toBe('Beech 🌳 small')
  })
})

describe('headers and cookies (issue 15; issue 17 item 7)', () => {
  it('pages carry a content security policy that allows only this site, frame protection, nosniff, a referrer policy and no-store', async () => {
    const res = await fetch(`${inject('baseUrl')}/login`)
    expect(res.status).toBe(200)
    const csp = res.headers.get('content-security-policy') ?? ''
    expect(csp).toMatch(/frame-ancestors 'none'/)
    expect(csp).toMatch(/default-src 'self'/)
    expect(csp).toMatch(/object-src 'none'/)
    expect(csp).toMatch(/script-src [^;]*'nonce-[A-Za-z0-9+/=_-]+'/)
    expect(csp).not.toMatch(/script-src [^;]*'unsafe-inline'/)
    expect(csp).not.toMatch(/upgrade-insecure-requests/)
    expect(res.headers.get('x-frame-options')).toBe('DENY')
    expect(res.headers.get('x-content-type-options')).toBe('nosniff')
    expect(res.headers.get('referrer-policy')).toMatch(/^(same-origin|no-referrer|strict-origin-when-cross-origin)$/)
    expect(res.headers.get('strict-transport-security')).toBeNull()
    expect(res.headers.get('cache-control')).toBe('no-store')
    // The nonce in the header is the one on the page's scripts.
    const nonce = /'nonce-([^']+)'/.exec(csp)![1]
    expect(await res.text()).toContain(`nonce="${nonce}"`)
  })

  it('API answers, errors included, carry no-store and nosniff', async () => {
    const ok = await api('/api/designs', { cookie: designer })
    expect(ok.status).toBe(200)
    expect(ok.headers.get('cache-control')).toBe('no-store')
    expect(ok.headers.get('x-content-type-options')).toBe('nosniff')
    const denied = await api('/api/designs')
    expect(denied.status).toBe(401)
    expect(denied.headers.get('cache-control')).toBe('no-store')
  })

  it('downloads carry no-store', async () => {
    const design = await api(`/api/designs/${designId}`, { cookie: designer })
    const res = await fetch(`${inject('baseUrl')}/api/revisions/${design.body.latest.id}/cut.dxf?units=in`, { headers: { cookie: designer } })
    expect(res.status).toBe(200)
    expect(res.headers.get('cache-control')).toBe('no-store')
  })

  it('the session cookie is HttpOnly, SameSite=Lax, has a lifetime, and is Secure only when the request came over HTTPS', async () => {
    const login = (headers: Record<string, string>) => fetch(`${inject('baseUrl')}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-forwarded-for': freshAddress(), ...headers },
      body: JSON.stringify({ email: demo.viewer, password: 'rootplate-demo' }),
    })
    const plain = await login({})
    expect(plain.status).toBe(200)
    const cookie = plain.headers.getSetCookie().find(c => /session/i.test(c))
    expect(cookie).toBeTruthy()
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    expect(cookie).toMatch(/;\s*(Max-Age=\d+|Expires=)/i)
    expect(cookie).not.toMatch(/;\s*Secure/i)

    // The test server trusts its proxy (NUXT_TRUST_PROXY=1): a request the proxy got over HTTPS.
    const secure = await login({ 'x-forwarded-proto': 'https' })
    expect(secure.status).toBe(200)
    expect(secure.headers.getSetCookie().find(c => /session/i.test(c))).toMatch(/;\s*Secure/i)
    expect(secure.headers.get('strict-transport-security')).toMatch(/max-age=\d+/)
  })

  it('a preferences change from this site still works and is stored', async () => {
    const res = await api('/api/me/preferences', { method: 'PATCH', cookie: designer, body: { fraction: 32 } })
    expect(res.status).toBe(200)
    const [row] = await db.select({ p: users.preferences }).from(users).where(eq(users.email, demo.designer))
    expect((row!.p as { fraction: number }).fraction).toBe(32)
    await api('/api/me/preferences', { method: 'PATCH', cookie: designer, body: { fraction: 16 } })
  })
})

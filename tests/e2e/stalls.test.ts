// Issue 25 items 1-4: nothing a signed-out or low-privileged request sends may
// stall the server for others. Deep JSON is refused before anything walks it,
// costly work (sheet plans, label sheets, a show's plates) runs on the worker
// pool within each member's limit, a member's share links count against that
// member and each shop gets its turn in the pool, and slow senders are cut off
// with 408. These are functional checks (status codes, never 500, the server
// still answering); the waits of an unrelated member are measured in
// scripts/bench/stalls.ts. Statuses are RFC 9110's (400, 408, 429, 503) and
// RFC 4918's 422; Retry-After is RFC 9110 section 10.2.3.
import { connect } from 'node:net'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { hasher } from '../../scripts/seed'
import { api, demo, freshAddress, signIn } from './support/api'
import { createOwnShop, OTHER_LEAD } from './support/fixtures'
import { planShop } from './support/plan'
import { deriveForTube, presetParams } from '../../geometry'

const IN = 25.4
const SHEET = { width: 48 * IN, height: 96 * IN, thickness: 0.703 * IN, margin: 0.5 * IN, kerf: 0.25 * IN }
// Our own large shape (as in scripts/bench/export-load.ts): a 49 in tube with twelve long roots, over 100 Letter sheets.
const LARGE = { tubeDiameter: 1244.6, casterCount: 8, casterOffset: 1000, lobes: { count: 12, reach: 600, width: 600, valley: 100, irregularity: 0, roundness: 1 } }

function post(path: string, body: string, headers: Record<string, string> = {}) {
  return fetch(`${inject('baseUrl')}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body })
}

/** The server still answers a plain request, and answers it right. */
async function stillAnswers(cookie?: string) {
  const me = await api('/api/me', { cookie })
  expect(me.status).toBe(cookie ? 200 : 401)
}

describe('deep JSON is refused before anything walks it (item 1)', () => {
  it('a 4,000-deep array sent signed out to sign-in (8 kB) is a 400, not a 500, and the server goes on', async () => {
    const deep = `${'['.repeat(4000)}${']'.repeat(4000)}`
    const res = await post('/api/auth/login', deep, { 'x-forwarded-for': freshAddress() })
    expect(res.status).toBe(400)
    expect((await res.json()).data.code).toBe('too-deep')
    await stillAnswers()
  })

  it('a 100,000-deep object inside a design (200 kB, under the route limit) is a 400; nothing is saved', async () => {
    const designer = await signIn(demo.designer)
    const deep = `{"name":"Deep stump","params":${'{"a":'.repeat(20_000)}1${'}'.repeat(20_000)}}`
    const arrays = `{"name":"Deep stump","params":{"lobes":${'['.repeat(100_000)}${']'.repeat(100_000)}}}`
    for (const body of [deep, arrays]) {
      const res = await fetch(`${inject('baseUrl')}/api/designs`, { method: 'POST', headers: { 'content-type': 'application/json', cookie: designer }, body })
      expect(res.status).toBe(400)
    }
    const list = await api('/api/designs', { cookie: designer })
    expect(JSON.stringify(list.body)).not.toContain('Deep stump')
    await stillAnswers(designer)
  })

  it('brackets inside strings do not count, and a body nested a few levels still reaches its checks', async () => {
    // 4,000 brackets inside a password string: an ordinary wrong sign-in, 401 (or 422 for its length), never "too deep".
    const res = await post('/api/auth/login', JSON.stringify({ email: 'nobody@rootplate.test', password: '['.repeat(4000) }), { 'x-forwarded-for': freshAddress() })
    expect([401, 422]).toContain(res.status)
    // A NUL at depth 20 is still found and named (the walk goes all the way down).
    let value: unknown = 'bad\u0000'
    for (let i = 0; i < 19; i++) value = [value]
    const nul = await post('/api/auth/login', JSON.stringify({ email: value, password: 'x' }), { 'x-forwarded-for': freshAddress() })
    expect(nul.status).toBe(422)
    expect(Object.keys((await nul.json()).data.fields)[0]).toBe(`email${'.0'.repeat(19)}`)
  })
})

describe('costly work: capped, limited per member, off the event loop (item 2)', () => {
  let own: Record<'builder' | 'viewer', { email: string; password: string }>
  beforeAll(async () => {
    own = await createOwnShop(inject('databaseUrl'), p => hasher.make(p), ['builder', 'viewer'])
  })

  it('a label sheet for a register of 201 units is a 422 naming the cap; 200 print (20 pages of 10), a narrower filter prints', async () => {
    const builder = await signIn(own.builder.email, own.builder.password)
    const ids: string[] = []
    for (let i = 0; i < 201; i++) {
      const res = await api('/api/units', { method: 'POST', cookie: builder, body: { kind: i < 3 ? 'plate' : 'pattern', label: `Stall label ${i}` } })
      expect(res.status).toBe(201)
      ids.push(res.body.id)
    }
    const viewer = await signIn(own.viewer.email, own.viewer.password)
    const all = await api('/api/units/labels.pdf', { cookie: viewer })
    expect(all.status).toBe(422)
    expect(all.body.data.fields.ids).toMatch(/201 labels.*at most 200/)
    const plates = await fetch(`${inject('baseUrl')}/api/units/labels.pdf?kind=plate`, { headers: { cookie: viewer } })
    expect(plates.status).toBe(200)
    expect((await PDFDocument.load(new Uint8Array(await plates.arrayBuffer()))).getPageCount()).toBe(1)
    const chosen = await fetch(`${inject('baseUrl')}/api/units/labels.pdf?ids=${ids.slice(0, 200).join(',')}`, { headers: { cookie: viewer } })
    expect(chosen.status).toBe(200)
    // US Letter, ten labels a page (server/services/labels.ts): 200 labels are 20 pages.
    expect((await PDFDocument.load(new Uint8Array(await chosen.arrayBuffer()))).getPageCount()).toBe(20)
    await stillAnswers(viewer)
  }, 120_000)

  it('one member asking for five plans at once gets two made and three 429 with Retry-After; another shop is not held up', async () => {
    const shop = await planShop('Quarry Road Players (stalls)')
    const other = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
    // Five different plans (not cached, not joined), each many plates.
    const plans = [26, 27, 28, 29, 30].map(n => post('/api/sheet-plans', JSON.stringify({
      items: shop.designIds.map(designId => ({ designId, count: Math.floor(n / 2) })),
      sheet: SHEET,
      workflow: 'panels',
    }), { cookie: shop.cookie }))
    const me = await api('/api/me', { cookie: other })
    expect(me.status).toBe(200)
    const replies = await Promise.all(plans)
    const statuses = replies.map(r => r.status)
    expect(statuses.filter(s => s === 429).length, statuses.join(' ')).toBeGreaterThanOrEqual(1)
    expect(statuses.every(s => s === 200 || s === 429), statuses.join(' ')).toBe(true)
    for (const r of replies) {
      if (r.status === 429) expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
      else {
        const plan = await r.json()
        // Every plate asked for is on the plan.
        expect(plan.figures.plates).toBe(plan.entries.reduce((n: number, e: { count: number }) => n + e.count, 0))
      }
    }
    await stillAnswers(shop.cookie)
  }, 120_000)

  it('a show page builds each revision\'s plates once: the second view builds none and shows the same figures', async () => {
    const shop = await planShop('Quarry Road Players (show figures)')
    const first = await fetch(`${inject('baseUrl')}/api/shows/${shop.showId}`, { headers: { cookie: shop.cookie } })
    expect(first.status).toBe(200)
    expect(first.headers.get('x-rootplate-plates-built')).toBe(String(shop.designIds.length))
    const again = await fetch(`${inject('baseUrl')}/api/shows/${shop.showId}`, { headers: { cookie: shop.cookie } })
    expect(again.headers.get('x-rootplate-plates-built')).toBe('0')
    const [a, b] = [await first.json(), await again.json()]
    expect(b.designs).toEqual(a.designs)
    // A new revision is a new plate: built once more, and its figures change with the tube.
    const designId = shop.designIds[0]!
    const before = a.designs.find((d: { id: string }) => d.id === designId)
    const saved = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: shop.cookie, body: { params: deriveForTube(presetParams('river-stone')!, 20 * IN), note: 'wider tube', basedOn: before.latest.number } })
    expect(saved.status).toBe(201)
    const third = await fetch(`${inject('baseUrl')}/api/shows/${shop.showId}`, { headers: { cookie: shop.cookie } })
    expect(third.headers.get('x-rootplate-plates-built')).toBe('1')
    const after = (await third.json()).designs.find((d: { id: string }) => d.id === designId)
    expect(after.tubeDiameter).toBeCloseTo(20 * IN, 6)
    expect(after.width).toBeGreaterThan(before.width)
  })
})

describe('a fair share of the export pool (item 3)', () => {
  it('one designer\'s 18 share links count as that designer: two files in the making, the rest 429, never 503; another shop still gets its file', async () => {
    const designer = await signIn(demo.designer)
    const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Fair share roots', params: LARGE } })
    expect(created.status).toBe(201)
    const revisionId = created.body.revision.id
    const links: string[] = []
    for (let i = 0; i < 18; i++) {
      const res = await api(`/api/revisions/${revisionId}/shares`, { method: 'POST', cookie: designer, body: { days: 1 } })
      expect(res.status).toBe(201)
      links.push(new URL(res.body.url).pathname)
    }
    // Two downloads per link, each a different query (not cached, not joined).
    let firstRefusal: () => void = () => {}
    const refused = new Promise<void>(r => { firstRefusal = r })
    const downloads = links.flatMap((path, i) => [0, 1].map(k => fetch(`${inject('baseUrl')}${path}/template.pdf?paper=letter&overlap=${2 * i + k}`)
      .then(async (res) => {
        if (res.status !== 200) firstRefusal()
        await res.arrayBuffer()
        return res.status
      })))
    await Promise.race([refused, Promise.all(downloads)])
    // While the designer's links wait, a lead of another shop asks for a file of their own.
    const other = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
    const theirs = await fetch(`${inject('baseUrl')}/api/revisions/${inject('other').revisionId}/cut.dxf?units=mm`, { headers: { cookie: other } })
    expect(theirs.status).toBe(200)
    expect(await theirs.text()).toContain('SECTION')
    const statuses = await Promise.all(downloads)
    expect(statuses.filter(s => s === 503), statuses.join(' ')).toHaveLength(0)
    expect(statuses.filter(s => s === 429).length, statuses.join(' ')).toBeGreaterThanOrEqual(30)
    expect(statuses.every(s => s === 200 || s === 429)).toBe(true)
  }, 180_000)
})

/** A raw connection, so bytes can be sent as slowly as an attacker would. Resolves with what the server sent before it closed. */
function trickle(head: string, drip: string): Promise<{ reply: string; closed: boolean }> {
  const { hostname, port } = new URL(inject('baseUrl'))
  return new Promise((resolve, reject) => {
    const socket = connect(Number(port), hostname)
    let reply = ''
    let i = 0
    let timer: ReturnType<typeof setInterval> | undefined
    socket.on('connect', () => {
      socket.write(head)
      // One byte a second, for as long as the server keeps the connection open.
      timer = setInterval(() => {
        if (!socket.writable) return
        socket.write(drip[i++ % drip.length]!)
      }, 1000)
    })
    socket.on('data', (d: Buffer) => { reply += d.toString() })
    socket.on('error', () => { /* the server closed it while a byte was on its way */ })
    socket.on('close', () => {
      clearInterval(timer)
      resolve({ reply, closed: true })
    })
    setTimeout(() => {
      clearInterval(timer)
      socket.destroy()
      reject(new Error(`still open after 50 s; received: ${reply.slice(0, 200)}`))
    }, 50_000).unref()
  })
}

describe('slow senders are cut off (item 4)', () => {
  it('a sign-in body trickled at one byte a second is answered 408 and the connection closed', async () => {
    const host = new URL(inject('baseUrl')).host
    const { reply, closed } = await trickle(
      `POST /api/auth/login HTTP/1.1\r\nHost: ${host}\r\nContent-Type: application/json\r\nContent-Length: 4000\r\nX-Forwarded-For: ${freshAddress()}\r\n\r\n{`,
      '"a',
    )
    expect(reply).toMatch(/^HTTP\/1\.1 408/)
    expect(closed).toBe(true)
    await stillAnswers()
  }, 60_000)

  it('headers trickled at one byte a second are answered 408 and the connection closed', async () => {
    const host = new URL(inject('baseUrl')).host
    const { reply, closed } = await trickle(`GET /api/me HTTP/1.1\r\nHost: ${host}\r\nX-Slow: `, 'abcdef')
    expect(reply).toMatch(/^HTTP\/1\.1 408/)
    expect(closed).toBe(true)
    await stillAnswers()
  }, 60_000)
})

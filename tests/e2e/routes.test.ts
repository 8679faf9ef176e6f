import { beforeAll, describe, expect, it, inject } from 'vitest'
import { api, demo, signIn, type DemoRole } from './support/api'
import { LIMIT_USER, OTHER_LEAD, OTHER_SHOW } from './support/fixtures'

// Every core route (CONTRACTS.md) for every role, without a session, and across two shops.
const roles = Object.keys(demo) as DemoRole[]
const editors: DemoRole[] = ['lead', 'designer']
const cookies = {} as Record<DemoRole, string>
let otherLead = ''
let designId = ''
let revisionId = ''

// This file saves revisions, so it works on a design of its own (three
// revisions), never on the shared demo designs.
const DESIGN = 'Routes test elm'

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  otherLead = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
  const created = await api('/api/designs', { method: 'POST', cookie: cookies.lead, body: { name: DESIGN, sizeLabel: 'Medium', params: {} } })
  expect(created.status).toBe(201)
  designId = created.body.id
  for (const basedOn of [1, 2]) {
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.lead, body: { params: { tubeDiameter: 300 + basedOn }, note: `setup ${basedOn}`, basedOn } })
    expect(res.status).toBe(201)
  }
  const detail = await api(`/api/designs/${designId}`, { cookie: cookies.lead })
  revisionId = detail.body.latest.id
})

describe('without a session', () => {
  it.each([
    ['GET', '/api/designs'],
    ['POST', '/api/designs'],
    ['GET', '/api/designs/00000000-0000-4000-8000-000000000000'],
    ['GET', '/api/designs/00000000-0000-4000-8000-000000000000/revisions'],
    ['POST', '/api/designs/00000000-0000-4000-8000-000000000000/revisions'],
    ['GET', '/api/revisions/00000000-0000-4000-8000-000000000000'],
    ['GET', '/api/shows'],
    ['GET', '/api/shop/members'],
  ])('%s %s answers 401', async (method, path) => {
    const res = await api(path, { method, body: method === 'POST' ? {} : undefined })
    expect(res.status).toBe(401)
  })
})

describe('GET /api/designs', () => {
  it.each(roles)('lists the shop\'s three demo designs for a %s, and nothing of the other shop', async (role) => {
    const res = await api('/api/designs', { cookie: cookies[role] })
    expect(res.status).toBe(200)
    const names = res.body.map((d: { name: string }) => d.name)
    expect(names).toEqual(expect.arrayContaining(['Rowan sapling', 'Hollow oak', 'Old king beech']))
    expect(names).not.toContain('Harbour piling')
    for (const d of res.body) expect(d.latestRevision).toBeGreaterThanOrEqual(1)
  })

  it('lists only its own design for the other shop', async () => {
    const res = await api('/api/designs', { cookie: otherLead })
    const names = res.body.map((d: { name: string }) => d.name)
    expect(names).toContain('Harbour piling')
    for (const ours of ['Rowan sapling', 'Hollow oak', 'Old king beech', DESIGN]) expect(names).not.toContain(ours)
  })
})

describe('GET /api/designs/:id and its revisions', () => {
  it.each(roles)('a %s sees the design, its latest params and every revision newest first', async (role) => {
    const res = await api(`/api/designs/${designId}`, { cookie: cookies[role] })
    expect(res.status).toBe(200)
    expect(res.body.name).toBe(DESIGN)
    expect(typeof res.body.latest.params).toBe('object')
    const revs = await api(`/api/designs/${designId}/revisions`, { cookie: cookies[role] })
    expect(revs.status).toBe(200)
    const numbers = revs.body.map((r: { number: number }) => r.number)
    expect(numbers.length).toBeGreaterThanOrEqual(3)
    expect(numbers[0]).toBe(res.body.latest.number)
    expect([...numbers].sort((a: number, b: number) => b - a)).toEqual(numbers)
    const one = await api(`/api/revisions/${revisionId}`, { cookie: cookies[role] })
    expect(one.status).toBe(200)
    expect(one.body.designId).toBe(designId)
  })

  it.each(roles)('a design of another shop is a 404 for a %s, never a leak', async (role) => {
    const other = inject('other')
    for (const path of [`/api/designs/${other.designId}`, `/api/designs/${other.designId}/revisions`, `/api/revisions/${other.revisionId}`]) {
      const res = await api(path, { cookie: cookies[role] })
      expect(res.status).toBe(404)
      expect(JSON.stringify(res.body)).not.toContain('Harbour')
    }
  })

  it('an id that is not a uuid, or that names nothing, is a 404', async () => {
    expect((await api('/api/designs/not-a-uuid', { cookie: cookies.viewer })).status).toBe(404)
    expect((await api('/api/designs/00000000-0000-4000-8000-000000000000', { cookie: cookies.viewer })).status).toBe(404)
  })
})

describe('POST /api/designs', () => {
  it.each(editors)('a %s creates a design with revision 1', async (role) => {
    const res = await api('/api/designs', { method: 'POST', cookie: cookies[role], body: { name: `Test stump by ${role}`, sizeLabel: 'Tiny', params: {} } })
    expect(res.status).toBe(201)
    expect(res.body.revision.number).toBe(1)
    const detail = await api(`/api/designs/${res.body.id}`, { cookie: cookies.viewer })
    expect(detail.status).toBe(200)
    expect(detail.body.latest.number).toBe(1)
  })

  it.each(['builder', 'viewer'] as DemoRole[])('a %s may not create a design (403) and nothing is stored', async (role) => {
    const before = (await api('/api/designs', { cookie: cookies.lead })).body.length
    const res = await api('/api/designs', { method: 'POST', cookie: cookies[role], body: { name: 'Forbidden', params: {} } })
    expect(res.status).toBe(403)
    expect((await api('/api/designs', { cookie: cookies.lead })).body.length).toBe(before)
  })

  // Limits: a name up to 120 characters and a size label up to 40, after trimming (our own bounds, server/api/designs/index.post.ts).
  it('takes a name of 120 characters and a size label of 40, and refuses one more of each with a field message, storing nothing', async () => {
    const name = `Limit ${'n'.repeat(114)}`
    const label = 'L'.repeat(40)
    expect(name).toHaveLength(120)
    const ok = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: `  ${name}  `, sizeLabel: label, params: {} } })
    expect(ok.status).toBe(201)
    const stored = await api(`/api/designs/${ok.body.id}`, { cookie: cookies.viewer })
    expect(stored.body.name).toBe(name)
    expect(stored.body.sizeLabel).toBe(label)

    const before = (await api('/api/designs', { cookie: cookies.lead })).body.length
    const longName = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: `${name}x`, params: {} } })
    expect(longName.status).toBe(422)
    expect(longName.body.data.fields.name).toMatch(/120 characters/)
    const longLabel = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: 'Label test', sizeLabel: `${label}x`, params: {} } })
    expect(longLabel.status).toBe(422)
    expect(longLabel.body.data.fields.sizeLabel).toMatch(/40 characters/)
    const wrongType = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: 42, sizeLabel: ['x'], params: {} } })
    expect(wrongType.status).toBe(422)
    expect(Object.keys(wrongType.body.data.fields)).toEqual(expect.arrayContaining(['name', 'sizeLabel']))
    expect((await api('/api/designs', { cookie: cookies.lead })).body.length).toBe(before)
  })

  it('answers 422 with field messages for a missing name or params, and for another shop\'s show', async () => {
    const res = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: '  ' } })
    expect(res.status).toBe(422)
    expect(Object.keys(res.body.data.fields)).toEqual(expect.arrayContaining(['name', 'params']))
    const badShow = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: 'x', params: {}, showId: '00000000-0000-4000-8000-000000000000' } })
    expect(badShow.status).toBe(422)
    expect(badShow.body.data.fields.showId).toBeTruthy()
  })
})

describe('POST /api/designs/:id/revisions', () => {
  async function latest(id: string) {
    return (await api(`/api/designs/${id}`, { cookie: cookies.viewer })).body.latest
  }

  it.each(editors)('a %s saves on top of the latest revision: 201 and the next number', async (role) => {
    const before = await latest(designId)
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies[role], body: { params: before.params, note: `Checked by ${role}`, basedOn: before.number } })
    expect(res.status).toBe(201)
    expect(res.body.number).toBe(before.number + 1)
    expect(res.body.note).toBe(`Checked by ${role}`)
    expect((await latest(designId)).number).toBe(before.number + 1)
  })

  it.each(['builder', 'viewer'] as DemoRole[])('a %s may not save (403)', async (role) => {
    const before = await latest(designId)
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies[role], body: { params: before.params, note: 'x', basedOn: before.number } })
    expect(res.status).toBe(403)
    expect((await latest(designId)).number).toBe(before.number)
  })

  it('answers 409 on a stale base and stores nothing, naming who saved meanwhile', async () => {
    const before = await latest(designId)
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params: before.params, note: 'stale', basedOn: before.number - 1 } })
    expect(res.status).toBe(409)
    expect(res.body.data.latest.number).toBe(before.number)
    expect(res.body.data.latest.author.name).toBeTruthy()
    const ahead = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params: before.params, note: 'from the future', basedOn: before.number + 5 } })
    expect(ahead.status).toBe(409)
    expect((await latest(designId)).number).toBe(before.number)
  })

  it('takes a note of 500 characters after trimming, and refuses 501 (our own bound)', async () => {
    const before = await latest(designId)
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params: before.params, note: ` ${'n'.repeat(500)} `, basedOn: before.number } })
    expect(res.status).toBe(201)
    expect(res.body.note).toHaveLength(500)
    const long = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params: before.params, note: 'n'.repeat(501), basedOn: before.number + 1 } })
    expect(long.status).toBe(422)
    expect(long.body.data.fields.note).toMatch(/500 characters/)
    expect((await latest(designId)).number).toBe(before.number + 1)
  })

  it('answers 422 for a missing or non-integer basedOn, params that are not an object, or an over-long note', async () => {
    for (const body of [
      { params: {}, note: 'x' },
      { params: {}, note: 'x', basedOn: 1.5 },
      { params: 'plate', note: 'x', basedOn: 1 },
      { params: {}, note: 'n'.repeat(501), basedOn: 1 },
    ]) {
      const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body })
      expect(res.status, JSON.stringify(body)).toBe(422)
      expect(Object.keys(res.body.data.fields).length).toBeGreaterThan(0)
    }
  })

  it('validates params with the plate schema: 422 naming the field, and nothing stored', async () => {
    const before = await latest(designId)
    for (const params of [{ casterCount: 12 }, { tubeDiameter: -5 }, { lobes: { count: 2.5 } }, { minWood: 'lots' }]) {
      const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params, note: 'bad', basedOn: before.number } })
      expect(res.status, JSON.stringify(params)).toBe(422)
      const key = `params.${Object.keys(params)[0]}`
      expect(Object.keys(res.body.data.fields).some(k => k.startsWith(key)), JSON.stringify(res.body.data.fields)).toBe(true)
    }
    expect((await latest(designId)).number).toBe(before.number)
  })

  it('stores the parsed params: defaults filled in, unknown keys dropped', async () => {
    const before = await latest(designId)
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params: { tubeDiameter: 444.5, colour: 'green' }, note: 'partial', basedOn: before.number } })
    expect(res.status).toBe(201)
    const stored = (await latest(designId)).params
    expect(stored.tubeDiameter).toBe(444.5)
    expect(stored).not.toHaveProperty('colour')
    expect(stored.casterCount).toBeGreaterThanOrEqual(3)
    expect(stored.lobes).toHaveProperty('count')
    expect(stored.lobes.overrides).toEqual([])
  })

  it('a lead of another shop gets 404 for this design', async () => {
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: otherLead, body: { params: {}, note: 'x', basedOn: 1 } })
    expect(res.status).toBe(404)
  })
})

describe('shop routes', () => {
  it.each(roles)('GET /api/shows works for a %s', async (role) => {
    const res = await api('/api/shows', { cookie: cookies[role] })
    expect(res.status).toBe(200)
    // The demo's show is there and the other shop's is not; other files may add shows of their own, so not an exact list.
    const names = res.body.map((s: { name: string }) => s.name)
    expect(names).toContain('Beneath the Rowan Wood')
    expect(names).not.toContain(OTHER_SHOW)
  })

  it('GET /api/shows: the other shop sees only its own show, and no shop sees the other\'s', async () => {
    const other = await api('/api/shows', { cookie: otherLead })
    expect(other.status).toBe(200)
    expect(other.body.map((s: { name: string }) => s.name)).toContain(OTHER_SHOW)
    const ours = await api('/api/shows', { cookie: cookies.viewer })
    expect(JSON.stringify(ours.body)).not.toContain(OTHER_SHOW)
    expect(JSON.stringify(other.body)).not.toContain('Rowan')
  })

  it('GET /api/shop/members: each lead sees exactly its own crew, no one of the other shop', async () => {
    const other = await api('/api/shop/members', { cookie: otherLead })
    expect(other.status).toBe(200)
    const emails = other.body.map((m: { email: string }) => m.email)
    expect(emails).toEqual(expect.arrayContaining([OTHER_LEAD.email, LIMIT_USER.email]))
    for (const e of Object.values(demo)) expect(emails).not.toContain(e)
    const ours = await api('/api/shop/members', { cookie: cookies.lead })
    expect(JSON.stringify(ours.body)).not.toContain('harbour.test')
  })

  it.each(roles)('GET /api/shop/members: only a lead sees the crew (%s)', async (role) => {
    const res = await api('/api/shop/members', { cookie: cookies[role] })
    if (role === 'lead') {
      expect(res.status).toBe(200)
      expect(res.body.map((m: { email: string }) => m.email).sort()).toEqual(Object.values(demo).sort())
    }
    else {
      expect(res.status).toBe(403)
    }
  })
})

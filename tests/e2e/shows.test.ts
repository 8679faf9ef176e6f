// Shows and size families through the API: every role, and across shops.
// Each test works in a shop of its own (createOwnShop) and makes its own designs.
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { api, signIn } from './support/api'
import { createOwnShop, OTHER_LEAD } from './support/fixtures'
import { plateDefaults } from './support/plate'
import { hasher } from '../../scripts/seed'

const INCH = 25.4
type Role = 'lead' | 'designer' | 'builder' | 'viewer'
const ROLES: Role[] = ['lead', 'designer', 'builder', 'viewer']

let cookie: Record<Role, string>
let other: string

beforeAll(async () => {
  const own = await createOwnShop(inject('databaseUrl'), p => hasher.make(p), ROLES)
  cookie = {} as Record<Role, string>
  for (const role of ROLES) cookie[role] = await signIn(own[role].email, own[role].password)
  other = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
})

async function newDesign(name: string, params: Record<string, unknown> = plateDefaults(), showId: string | null = null) {
  const res = await api('/api/designs', { method: 'POST', cookie: cookie.designer, body: { name, params, showId } })
  expect(res.status).toBe(201)
  return res.body as { id: string; revision: { id: string; number: number } }
}

describe('shows', () => {
  it('lead and designer create, rename and archive shows; builder and viewer only look', async () => {
    for (const role of ['builder', 'viewer'] as const) {
      expect((await api('/api/shows', { method: 'POST', cookie: cookie[role], body: { name: `Not mine ${role}` } })).status).toBe(403)
    }
    expect((await api('/api/shows', { method: 'POST', body: { name: 'Nobody' } })).status).toBe(401)

    const made = await api('/api/shows', { method: 'POST', cookie: cookie.lead, body: { name: 'Owls at Dusk', venue: 'Barn stage', opensOn: '2027-03-12' } })
    expect(made.status).toBe(201)
    expect(made.body).toMatchObject({ name: 'Owls at Dusk', venue: 'Barn stage', opensOn: '2027-03-12', archivedAt: null, designCount: 0 })
    const id = made.body.id as string

    // Two live shows never share a name (case aside).
    const twin = await api('/api/shows', { method: 'POST', cookie: cookie.designer, body: { name: 'owls at dusk' } })
    expect(twin.status).toBe(422)
    expect(twin.body.data.fields.name).toMatch(/already/)

    const bad = await api('/api/shows', { method: 'POST', cookie: cookie.lead, body: { name: '  ', opensOn: '12/03/2027' } })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['name', 'opensOn'])

    for (const role of ['builder', 'viewer'] as const) {
      expect((await api(`/api/shows/${id}`, { method: 'PATCH', cookie: cookie[role], body: { name: 'Taken over' } })).status).toBe(403)
    }
    const renamed = await api(`/api/shows/${id}`, { method: 'PATCH', cookie: cookie.designer, body: { name: 'Owls at Midnight' } })
    expect(renamed.status).toBe(200)
    expect(renamed.body.name).toBe('Owls at Midnight')
    expect((await api(`/api/shows/${id}`, { method: 'PATCH', cookie: cookie.designer, body: {} })).status).toBe(422)

    const archived = await api(`/api/shows/${id}`, { method: 'PATCH', cookie: cookie.lead, body: { archived: true } })
    expect(archived.body.archivedAt).not.toBeNull()
    for (const role of ROLES) {
      const live = await api('/api/shows', { cookie: cookie[role] })
      expect(live.status).toBe(200)
      expect(live.body.map((s: { id: string }) => s.id)).not.toContain(id)
      const old = await api('/api/shows?archived=only', { cookie: cookie[role] })
      expect(old.body.map((s: { id: string }) => s.id)).toContain(id)
      expect((await api(`/api/shows/${id}`, { cookie: cookie[role] })).status).toBe(200)
    }
    expect((await api('/api/shows?archived=maybe', { cookie: cookie.lead })).status).toBe(422)
    const restored = await api(`/api/shows/${id}`, { method: 'PATCH', cookie: cookie.lead, body: { archived: false } })
    expect(restored.body.archivedAt).toBeNull()
  })

  it('a show lists its designs with quantities and totals; designs and shows stay in their shop', async () => {
    const show = (await api('/api/shows', { method: 'POST', cookie: cookie.lead, body: { name: `Forest ${crypto.randomUUID().slice(0, 6)}` } })).body
    const a = await newDesign('Oak stump', plateDefaults(), show.id)
    const b = await newDesign('Ash stump', plateDefaults(), show.id)
    expect((await api(`/api/designs/${a.id}`, { method: 'PATCH', cookie: cookie.designer, body: { quantity: 3 } })).status).toBe(200)
    const detail = await api(`/api/shows/${show.id}`, { cookie: cookie.viewer })
    expect(detail.status).toBe(200)
    expect(detail.body.designs.map((d: { name: string }) => d.name)).toEqual(['Ash stump', 'Oak stump'])
    const one = detail.body.designs[0].weight as number
    expect(one).toBeGreaterThan(0)
    // Totals by hand: 3 + 1 plates, each the same default plate, so 4 times one plate's weight.
    expect(detail.body.totals.plates).toBe(4)
    expect(detail.body.totals.weight).toBeCloseTo(4 * one, 6)

    // Another shop sees none of it, and cannot change it or move its designs into it.
    expect((await api(`/api/shows/${show.id}`, { cookie: other })).status).toBe(404)
    expect((await api(`/api/shows/${show.id}`, { method: 'PATCH', cookie: other, body: { name: 'Mine now' } })).status).toBe(404)
    expect((await api(`/api/designs/${b.id}`, { method: 'PATCH', cookie: other, body: { archived: true } })).status).toBe(404)
    const theirShows = (await api('/api/shows', { cookie: other })).body as { id: string }[]
    expect(theirShows.map(s => s.id)).not.toContain(show.id)
    const theirs = (await api('/api/designs', { cookie: other })).body as { id: string }[]
    const ourShowInTheirs = await api(`/api/designs/${b.id}`, { method: 'PATCH', cookie: cookie.lead, body: { showId: theirShows[0]!.id } })
    expect(ourShowInTheirs.status).toBe(422)
    expect(ourShowInTheirs.body.data.fields.showId).toMatch(/not in your shop/)
    expect(theirs.map(d => d.id)).not.toContain(a.id)
  })
})

describe('design details (name, size label, show, archive)', () => {
  it('only lead and designer change them; the server checks every field', async () => {
    const d = await newDesign(`Willow ${crypto.randomUUID().slice(0, 6)}`)
    for (const role of ['builder', 'viewer'] as const) {
      expect((await api(`/api/designs/${d.id}`, { method: 'PATCH', cookie: cookie[role], body: { name: 'Renamed' } })).status).toBe(403)
    }
    const renamed = await api(`/api/designs/${d.id}`, { method: 'PATCH', cookie: cookie.lead, body: { name: '  Weeping willow ', sizeLabel: 'Large' } })
    expect(renamed.status).toBe(200)
    expect(renamed.body).toMatchObject({ name: 'Weeping willow', sizeLabel: 'Large' })
    const bad = await api(`/api/designs/${d.id}`, { method: 'PATCH', cookie: cookie.lead, body: { name: '', sizeLabel: 'x'.repeat(41), quantity: -1, showId: 'nope' } })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['name', 'quantity', 'showId', 'sizeLabel'])
    expect((await api(`/api/designs/${d.id}`, { method: 'PATCH', cookie: cookie.lead, body: { colour: 'red' } })).status).toBe(422)
    // Nothing of the refused change was kept.
    expect((await api(`/api/designs/${d.id}`, { cookie: cookie.viewer })).body).toMatchObject({ name: 'Weeping willow', sizeLabel: 'Large', quantity: 1 })
  })

  it('archives a design out of the list, finds it again, and restores it with its revisions', async () => {
    const tag = crypto.randomUUID().slice(0, 6)
    const d = await newDesign(`Hollow log ${tag}`)
    expect((await api(`/api/designs/${d.id}/revisions`, { method: 'POST', cookie: cookie.designer, body: { params: { ...plateDefaults(), rotation: 10 }, note: 'turned', basedOn: 1 } })).status).toBe(201)
    expect((await api(`/api/designs/${d.id}`, { method: 'PATCH', cookie: cookie.designer, body: { archived: true } })).status).toBe(200)
    const live = (await api(`/api/designs?q=${tag}`, { cookie: cookie.builder })).body as { id: string }[]
    expect(live).toEqual([])
    const found = (await api(`/api/designs?q=${tag}&archived=only`, { cookie: cookie.builder })).body as { id: string; archivedAt: string }[]
    expect(found.map(x => x.id)).toEqual([d.id])
    expect((await api(`/api/designs/${d.id}/revisions`, { cookie: cookie.viewer })).body.length).toBe(2)
    await api(`/api/designs/${d.id}`, { method: 'PATCH', cookie: cookie.lead, body: { archived: false } })
    expect(((await api(`/api/designs?q=hollow%20${tag}`, { cookie: cookie.viewer })).body as { id: string }[]).map(x => x.id)).toEqual([d.id])
    // A percent sign typed into the search is a letter, not a wildcard.
    expect((await api(`/api/designs?q=%25${tag}`, { cookie: cookie.viewer })).body).toEqual([])
    expect((await api('/api/designs?show=nope', { cookie: cookie.viewer })).status).toBe(422)
  })
})

describe('size families', () => {
  it('makes sizes for lead and designer only, each on its tube with the hardware kept', async () => {
    const parent = await newDesign(`Beech ${crypto.randomUUID().slice(0, 6)}`)
    const sizes = [{ label: 'Medium', tubeDiameter: 16 * INCH }, { label: 'Large', tubeDiameter: 20 * INCH }]
    for (const role of ['builder', 'viewer'] as const) {
      expect((await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: cookie[role], body: { sizes } })).status).toBe(403)
    }
    expect((await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: other, body: { sizes } })).status).toBe(404)
    const bad = await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: cookie.designer, body: { sizes: [{ label: '', tubeDiameter: 50 }] } })
    expect(bad.status).toBe(422)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['sizes.0.label', 'sizes.0.tubeDiameter'])
    expect((await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: cookie.designer, body: { sizes: [sizes[0], sizes[0]] } })).status).toBe(422)

    const made = await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: cookie.designer, body: { sizes } })
    expect(made.status).toBe(201)
    expect(made.body.map((s: { sizeLabel: string }) => s.sizeLabel)).toEqual(['Medium', 'Large'])
    const parentParams = (await api(`/api/designs/${parent.id}`, { cookie: cookie.viewer })).body.latest.params
    for (const [i, s] of made.body.entries()) {
      const got = (await api(`/api/designs/${s.id}`, { cookie: cookie.viewer })).body
      expect(got.parentDesignId).toBe(parent.id)
      // Hand values: the measured tube is kept to the micrometre; pocket, rabbet and caster are the parent's.
      expect(got.latest.params.tubeDiameter).toBeCloseTo(sizes[i]!.tubeDiameter, 3)
      expect(got.latest.params.pocketDiameter).toBe(parentParams.pocketDiameter)
      expect(got.latest.params.rabbetWidth).toBe(parentParams.rabbetWidth)
      expect(got.latest.params.caster).toEqual(parentParams.caster)
      expect(got.latest.note).toContain('r1')
    }
    const family = await api(`/api/designs/${made.body[0].id}/family`, { cookie: cookie.builder })
    expect(family.status).toBe(200)
    expect(family.body.parent.id).toBe(parent.id)
    expect(family.body.sizes.map((s: { sizeLabel: string; behind: boolean }) => [s.sizeLabel, s.behind])).toEqual([['Medium', false], ['Large', false]])
    expect((await api(`/api/designs/${parent.id}/family`, { cookie: other })).status).toBe(404)

    // Asked of a size, a new size is made from (and follows) the family's parent: no chains.
    const more = await api(`/api/designs/${made.body[0].id}/sizes`, { method: 'POST', cookie: cookie.lead, body: { sizes: [{ label: 'Small', tubeDiameter: 14 * INCH }] } })
    expect(more.status).toBe(201)
    expect((await api(`/api/designs/${more.body[0].id}`, { cookie: cookie.viewer })).body.parentDesignId).toBe(parent.id)
    const grown = (await api(`/api/designs/${parent.id}/family`, { cookie: cookie.viewer })).body
    // Smallest tube first.
    expect(grown.sizes.map((s: { sizeLabel: string }) => s.sizeLabel)).toEqual(['Small', 'Medium', 'Large'])
  })

  it('reports sizes behind after the parent changes and brings the accepted ones up to date', async () => {
    const parent = await newDesign(`Elm ${crypto.randomUUID().slice(0, 6)}`)
    const made = (await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: cookie.lead, body: { sizes: [{ label: 'Medium', tubeDiameter: 16 * INCH }, { label: 'Large', tubeDiameter: 20 * INCH }] } })).body as { id: string }[]
    const changed = { ...plateDefaults(), lobes: { ...(plateDefaults().lobes as object), count: 7 } }
    expect((await api(`/api/designs/${parent.id}/revisions`, { method: 'POST', cookie: cookie.designer, body: { params: changed, note: 'seven roots', basedOn: 1 } })).status).toBe(201)
    const family = (await api(`/api/designs/${parent.id}/family`, { cookie: cookie.viewer })).body
    expect(family.sizes.every((s: { behind: boolean }) => s.behind)).toBe(true)

    const body = { parentRevision: 2, sizes: [{ id: made[0]!.id, basedOn: 1 }] }
    for (const role of ['builder', 'viewer'] as const) {
      expect((await api(`/api/designs/${parent.id}/sizes/update`, { method: 'POST', cookie: cookie[role], body })).status).toBe(403)
    }
    expect((await api(`/api/designs/${parent.id}/sizes/update`, { method: 'POST', cookie: other, body })).status).toBe(404)
    // A preview of an older parent revision is not accepted.
    expect((await api(`/api/designs/${parent.id}/sizes/update`, { method: 'POST', cookie: cookie.designer, body: { ...body, parentRevision: 1 } })).status).toBe(409)
    // The parent is not a size of itself.
    expect((await api(`/api/designs/${parent.id}/sizes/update`, { method: 'POST', cookie: cookie.designer, body: { parentRevision: 2, sizes: [{ id: parent.id, basedOn: 2 }] } })).status).toBe(422)

    const saved = await api(`/api/designs/${parent.id}/sizes/update`, { method: 'POST', cookie: cookie.designer, body })
    expect(saved.status).toBe(201)
    const medium = (await api(`/api/designs/${made[0]!.id}`, { cookie: cookie.viewer })).body
    expect(medium.latest.number).toBe(2)
    expect(medium.latest.note).toMatch(/ r2$/)
    expect(medium.latest.params.lobes.count).toBe(7)
    expect(medium.latest.params.tubeDiameter).toBeCloseTo(16 * INCH, 3)
    const after = (await api(`/api/designs/${parent.id}/family`, { cookie: cookie.viewer })).body
    expect(after.sizes.map((s: { behind: boolean }) => s.behind)).toEqual([false, true])
    // Saving the same preview twice: the size moved on, so 409 and nothing saved.
    expect((await api(`/api/designs/${parent.id}/sizes/update`, { method: 'POST', cookie: cookie.designer, body })).status).toBe(409)
  })

  it('detaches a size, which keeps its revisions and is no longer in the family', async () => {
    const parent = await newDesign(`Larch ${crypto.randomUUID().slice(0, 6)}`)
    const [size] = (await api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: cookie.designer, body: { sizes: [{ label: 'Small', tubeDiameter: 14 * INCH }] } })).body as { id: string }[]
    for (const role of ['builder', 'viewer'] as const) {
      expect((await api(`/api/designs/${size!.id}/detach`, { method: 'POST', cookie: cookie[role] })).status).toBe(403)
    }
    expect((await api(`/api/designs/${size!.id}/detach`, { method: 'POST', cookie: other })).status).toBe(404)
    expect((await api(`/api/designs/${size!.id}/detach`, { method: 'POST', cookie: cookie.designer })).status).toBe(200)
    expect((await api(`/api/designs/${size!.id}/detach`, { method: 'POST', cookie: cookie.designer })).status).toBe(409)
    expect((await api(`/api/designs/${parent.id}/family`, { cookie: cookie.viewer })).body.sizes).toEqual([])
    expect((await api(`/api/designs/${size!.id}/revisions`, { cookie: cookie.viewer })).body.length).toBe(1)
  })
})

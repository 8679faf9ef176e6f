// Revision comments (issue 18 item 17): every role of the shop may read and
// leave them; another shop sees a 404 either way; bad bodies are 422s naming
// the field; a comment is written into the shop's activity. Roles as in
// shared/utils/permissions.ts; the 2000-character bound is our own choice.
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { api, demo, signIn, type DemoRole } from './support/api'
import { OTHER_LEAD } from './support/fixtures'

const roles = Object.keys(demo) as DemoRole[]
const cookies = {} as Record<DemoRole, string>
let otherLead = ''
let designId = ''
let revisionId = ''

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  otherLead = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
  const created = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: 'Comment test hornbeam', params: { tubeDiameter: 300 } } })
  expect(created.status).toBe(201)
  designId = created.body.id
  revisionId = created.body.revision.id
})

const path = (id = revisionId) => `/api/revisions/${id}/comments`

describe('revision comments', () => {
  it('lets every role leave a comment and read them all back, oldest first, with its author', async () => {
    for (const role of roles) {
      const res = await api(path(), { method: 'POST', cookie: cookies[role], body: { body: `  From the ${role}: check the pocket depth.  ` } })
      expect(res.status, `${role}: ${JSON.stringify(res.body)}`).toBe(201)
      // Trimmed, as every text field of the product.
      expect(res.body.body).toBe(`From the ${role}: check the pocket depth.`)
    }
    for (const role of roles) {
      const list = await api(path(), { cookie: cookies[role] })
      expect(list.status).toBe(200)
      expect(list.body.map((c: { body: string }) => c.body)).toEqual(roles.map(r => `From the ${r}: check the pocket depth.`))
      expect(list.body.every((c: { author: { name: string | null } }) => typeof c.author.name === 'string' && c.author.name.length > 0)).toBe(true)
    }
  })

  it('keeps comments inside the shop: another shop gets 404 for reading and writing, and ours for theirs', async () => {
    expect((await api(path(), { cookie: otherLead })).status).toBe(404)
    expect((await api(path(), { method: 'POST', cookie: otherLead, body: { body: 'Not our plate' } })).status).toBe(404)
    const theirs = inject('other').revisionId
    for (const role of roles) {
      expect((await api(path(theirs), { cookie: cookies[role] })).status).toBe(404)
      expect((await api(path(theirs), { method: 'POST', cookie: cookies[role], body: { body: 'Not our plate' } })).status).toBe(404)
    }
    // Nothing was written by the refused requests.
    const list = await api(path(), { cookie: cookies.lead })
    expect(list.body.some((c: { body: string }) => c.body === 'Not our plate')).toBe(false)
  })

  it('answers 401 without a session and 404 for a revision that does not exist or an id that is not one', async () => {
    expect((await api(path())).status).toBe(401)
    expect((await api(path(), { method: 'POST', body: { body: 'x' } })).status).toBe(401)
    expect((await api(path('00000000-0000-4000-8000-000000000000'), { cookie: cookies.builder })).status).toBe(404)
    expect((await api(path('not-a-revision'), { method: 'POST', cookie: cookies.builder, body: { body: 'x' } })).status).toBe(404)
  })

  it('refuses empty, blank, too long, unstorable and unexpected input with a 422 naming the field', async () => {
    const refuse = async (body: unknown, field: string, message: RegExp) => {
      const res = await api(path(), { method: 'POST', cookie: cookies.builder, body })
      expect(res.status, JSON.stringify(body).slice(0, 60)).toBe(422)
      expect(res.body.data.fields[field], JSON.stringify(res.body.data.fields)).toMatch(message)
    }
    await refuse({}, 'body', /./)
    await refuse({ body: '   ' }, 'body', /Write the comment/)
    await refuse({ body: 'x'.repeat(2001) }, 'body', /under 2000/)
    await refuse({ body: 'a\u0000b' }, 'body', /control character/)
    await refuse({ body: 42 }, 'body', /./)
    await refuse({ body: 'fine', authorId: '00000000-0000-4000-8000-000000000000' }, '_', /./)
    // 2000 characters exactly is taken.
    expect((await api(path(), { method: 'POST', cookie: cookies.builder, body: { body: 'y'.repeat(2000) } })).status).toBe(201)
  })

  it('writes an activity entry the lead sees for the design', async () => {
    const res = await api(path(), { method: 'POST', cookie: cookies.builder, body: { body: 'The rabbet is too shallow for our pans.' } })
    expect(res.status).toBe(201)
    const log = await api(`/api/shop/activity?design=${designId}`, { cookie: cookies.lead })
    expect(log.status).toBe(200)
    const items = (log.body.items ?? log.body) as { action: string; detail: { excerpt?: string; revision?: number }; user: { name: string | null } }[]
    const entry = items.find(i => i.action === 'revision.comment' && i.detail.excerpt === 'The rabbet is too shallow for our pans.')
    expect(entry, JSON.stringify(items.slice(0, 3))).toBeTruthy()
    expect(entry!.detail.revision).toBe(1)
  })
})

// Share links for an outside shop: who may make and withdraw them, what a link
// opens without an account, and that it stops once withdrawn or expired.
// Files are read back with dxf-parser and pdf-lib, independent of our writers.
import DxfParser, { type IDxf, type ILwpolylineEntity } from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { api, demo, signIn, type DemoRole } from './support/api'
import { OTHER_LEAD } from './support/fixtures'
import { testSql } from './support/db'
import { uniqueEmail } from './support/crew'
import { waitForMail } from './support/mail'

const roles = Object.keys(demo) as DemoRole[]
const cookies = {} as Record<DemoRole, string>
let otherLead = ''
let designId = ''
let firstRevision = ''
let secondRevision = ''

async function fetchRaw(url: string, cookie?: string) {
  const res = await fetch(url, { headers: cookie ? { cookie } : {}, redirect: 'manual' })
  return { status: res.status, type: res.headers.get('content-type') ?? '', bytes: new Uint8Array(await res.arrayBuffer()) }
}
const text = (b: Uint8Array) => new TextDecoder().decode(b)
const parseDxf = (b: Uint8Array): IDxf => new DxfParser().parseSync(text(b))!
/** The widest closed polyline: the outside profile. */
function outlineWidth(dxf: IDxf): number {
  const closed = dxf.entities.filter((e): e is ILwpolylineEntity => e.type === 'LWPOLYLINE' && !!(e as ILwpolylineEntity).shape)
  const widths = closed.map(e => Math.max(...e.vertices.map(v => v.x)) - Math.min(...e.vertices.map(v => v.x)))
  return Math.max(...widths)
}

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  otherLead = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
  // A design of this file's own, with two revisions on different tubes.
  const created = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: 'Share test birch', params: { tubeDiameter: 300 } } })
  expect(created.status).toBe(201)
  designId = created.body.id
  firstRevision = created.body.revision.id
  const saved = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: cookies.designer, body: { params: { tubeDiameter: 450 }, note: 'bigger tube', basedOn: 1 } })
  expect(saved.status).toBe(201)
  secondRevision = saved.body.id
})

async function makeShare(role: DemoRole = 'designer', body: Record<string, unknown> = { days: 7, note: 'Cut from the glued panel, please' }) {
  const res = await api(`/api/revisions/${firstRevision}/shares`, { method: 'POST', cookie: cookies[role], body })
  expect(res.status).toBe(201)
  return res.body as { id: string; url: string }
}

describe('making and withdrawing share links', () => {
  it.each(['lead', 'designer'] as const)('a %s makes one: 201 with an id and an absolute url', async (role) => {
    const share = await makeShare(role)
    expect(share.url).toMatch(new RegExp(`^${inject('baseUrl')}/s/[\\w-]{43}$`))
    expect(share.id).toMatch(/^[0-9a-f-]{36}$/)
  })

  it.each(['builder', 'viewer'] as const)('a %s may not make, list or withdraw one (403)', async (role) => {
    expect((await api(`/api/revisions/${firstRevision}/shares`, { method: 'POST', cookie: cookies[role], body: { days: 7 } })).status).toBe(403)
    expect((await api(`/api/revisions/${firstRevision}/shares`, { cookie: cookies[role] })).status).toBe(403)
    const share = await makeShare()
    expect((await api(`/api/shares/${share.id}`, { method: 'DELETE', cookie: cookies[role] })).status).toBe(403)
  })

  it.each([
    ['POST', '/api/revisions/00000000-0000-4000-8000-000000000000/shares'],
    ['GET', '/api/revisions/00000000-0000-4000-8000-000000000000/shares'],
    ['DELETE', '/api/shares/00000000-0000-4000-8000-000000000000'],
  ])('%s %s answers 401 without a session', async (method, path) => {
    expect((await api(path, { method, body: method === 'POST' ? { days: 7 } : undefined })).status).toBe(401)
  })

  it('another shop can neither share this revision nor withdraw its links (404)', async () => {
    expect((await api(`/api/revisions/${firstRevision}/shares`, { method: 'POST', cookie: otherLead, body: { days: 7 } })).status).toBe(404)
    expect((await api(`/api/revisions/${firstRevision}/shares`, { cookie: otherLead })).status).toBe(404)
    const share = await makeShare()
    expect((await api(`/api/shares/${share.id}`, { method: 'DELETE', cookie: otherLead })).status).toBe(404)
    expect((await fetchRaw(`${share.url}/cut.dxf?units=in`)).status).toBe(200)
  })

  it.each([
    [{ days: 0 }, /At least 1 day/],
    [{ days: 1000 }, /At most 90 days/],
    [{ days: 'soon' }, /number of days|expected number/i],
    [{ days: 2.5 }, /whole number/],
    [{ days: 7, email: 'not-an-address' }, /e-mail/],
  ])('answers 422 for %j', async (body, message) => {
    const res = await api(`/api/revisions/${firstRevision}/shares`, { method: 'POST', cookie: cookies.designer, body })
    expect(res.status).toBe(422)
    expect(Object.values(res.body.data.fields).join(' ')).toMatch(message)
  })
})

describe('what a link opens without an account', () => {
  it('the DXF of that revision only, in inches (read back with dxf-parser)', async () => {
    const share = await makeShare()
    const shared = await fetchRaw(`${share.url}/cut.dxf?units=in`)
    expect(shared.status).toBe(200)
    expect(shared.type).toMatch(/dxf/)
    const dxf = parseDxf(shared.bytes)
    expect(dxf.header.$INSUNITS).toBe(1) // 1 = inches (DXF Reference, HEADER section)
    // The same outline as the signed-in download of revision 1, and not revision 2's (a 450 mm tube needs a wider plate).
    const own = parseDxf((await fetchRaw(`${inject('baseUrl')}/api/revisions/${firstRevision}/cut.dxf?units=in`, cookies.builder)).bytes)
    const other = parseDxf((await fetchRaw(`${inject('baseUrl')}/api/revisions/${secondRevision}/cut.dxf?units=in`, cookies.builder)).bytes)
    expect(outlineWidth(dxf)).toBeCloseTo(outlineWidth(own), 6)
    expect(outlineWidth(other) - outlineWidth(dxf)).toBeGreaterThan(3)
  })

  it('the template PDF and the SVG, and the page data with the shop\'s note', async () => {
    const share = await makeShare()
    const pdf = await fetchRaw(`${share.url}/template.pdf?paper=letter`)
    expect(pdf.status).toBe(200)
    expect(pdf.type).toBe('application/pdf')
    expect((await PDFDocument.load(pdf.bytes)).getPageCount()).toBeGreaterThan(1)
    const svg = await fetchRaw(`${share.url}/cut.svg?units=mm`)
    expect(svg.status).toBe(200)
    expect(text(svg.bytes)).toMatch(/<svg[^>]*\swidth="[\d.]+mm"/)
    const token = share.url.split('/').pop()
    const data = await api(`/api/shared/${token}`)
    expect(data.status).toBe(200)
    expect(data.body).toMatchObject({ shopName: 'Alder Street Players', designName: 'Share test birch', revision: 1, note: 'Cut from the glued panel, please' })
    expect(JSON.stringify(data.body)).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-/) // no ids of the shop's rows
    const page = await fetchRaw(share.url)
    expect(page.status).toBe(200)
    expect(page.type).toMatch(/html/)
  })

  it('answers 422 with field messages for a bad option, like the signed-in route', async () => {
    const share = await makeShare()
    const res = await api(`${share.url.replace(inject('baseUrl'), '')}/cut.dxf?units=yards`)
    expect(res.status).toBe(422)
    expect(res.body.data.fields.units).toMatch(/in or mm/)
  })

  it('a link opens nothing else: no API, no other revision', async () => {
    const share = await makeShare()
    const token = share.url.split('/').pop()
    expect((await api('/api/designs', { cookie: `share=${token}` })).status).toBe(401)
    expect((await fetchRaw(`${inject('baseUrl')}/s/${token}/../../api/revisions/${secondRevision}/cut.dxf`)).status).toBe(401)
    expect((await fetchRaw(`${inject('baseUrl')}/s/${'c'.repeat(43)}/cut.dxf`)).status).toBe(404)
    expect((await fetchRaw(`${inject('baseUrl')}/s/short/cut.dxf`)).status).toBe(404)
  })

  it('each download is recorded, and counted in the list of links', async () => {
    const share = await makeShare()
    await fetchRaw(`${share.url}/cut.dxf?units=mm`)
    await fetchRaw(`${share.url}/cut.svg`)
    const list = await api(`/api/revisions/${firstRevision}/shares`, { cookie: cookies.lead })
    expect(list.status).toBe(200)
    expect(list.body.find((s: { id: string }) => s.id === share.id)).toMatchObject({ downloads: 2, state: 'open' })
    const activity = await api(`/api/shop/activity?design=${designId}`, { cookie: cookies.lead })
    const downloads = activity.body.filter((a: { action: string; detail: { shareId?: string } }) => a.action === 'share.download' && a.detail.shareId === share.id)
    expect(downloads.map((d: { detail: { file: string } }) => d.detail.file)).toEqual(['cut.svg', 'cut.dxf'])
    expect(downloads[0].user.id).toBeNull()
  })
})

describe('a link stops working', () => {
  it('once withdrawn: the page data and every download answer 404', async () => {
    const share = await makeShare()
    const token = share.url.split('/').pop()
    expect((await fetchRaw(`${share.url}/cut.dxf`)).status).toBe(200)
    expect((await api(`/api/shares/${share.id}`, { method: 'DELETE', cookie: cookies.lead })).status).toBe(204)
    expect((await fetchRaw(`${share.url}/cut.dxf`)).status).toBe(404)
    expect((await fetchRaw(`${share.url}/cut.svg`)).status).toBe(404)
    expect((await fetchRaw(`${share.url}/template.pdf`)).status).toBe(404)
    expect((await api(`/api/shared/${token}`)).status).toBe(404)
    // A browser following the dead link gets a short page with the same status, not the sign-in page.
    const page = await fetch(`${share.url}/cut.dxf`, { headers: { accept: 'text/html,*/*' } })
    expect(page.status).toBe(404)
    expect(await page.text()).toMatch(/withdrawn by the shop/)
    expect((await api(`/api/shares/${share.id}`, { method: 'DELETE', cookie: cookies.lead })).status).toBe(404)
    const list = await api(`/api/revisions/${firstRevision}/shares`, { cookie: cookies.designer })
    expect(list.body.find((s: { id: string }) => s.id === share.id).state).toBe('withdrawn')
  })

  it('once expired: 410', async () => {
    const share = await makeShare('designer', { days: 1 })
    const life = await testSql<{ hours: number }[]>('select round(extract(epoch from (expires_at - created_at)) / 3600)::int as hours from shares where id = $1', [share.id])
    expect(life[0]!.hours).toBe(24)
    await testSql(`update shares set expires_at = now() - interval '1 second' where id = $1`, [share.id])
    const res = await api(`${share.url.replace(inject('baseUrl'), '')}/cut.dxf`)
    expect(res.status).toBe(410)
    expect(res.body.message).toMatch(/expired/)
    expect((await api(`/api/shared/${share.url.split('/').pop()}`)).status).toBe(410)
  })
})

describe('send to a shop', () => {
  it('mails the link with the note, in a plain-text and an HTML part, naming the shop', async () => {
    const to = uniqueEmail('cnc')
    const res = await api(`/api/revisions/${firstRevision}/shares`, { method: 'POST', cookie: cookies.designer, body: { days: 14, note: 'Two of these, 3/4 in birch ply', email: to } })
    expect(res.status).toBe(201)
    expect(res.body.sentTo).toBe(to)
    const mail = await waitForMail(to, /Cut files from Alder Street Players/)
    expect(mail.link).toBe(res.body.url)
    expect(mail.text).toContain('Two of these, 3/4 in birch ply')
    expect(mail.html).toContain('Alder Street Players')
    expect(mail.html).toContain(res.body.url)
    expect((await fetchRaw(`${mail.link}/cut.dxf?units=in`)).status).toBe(200)
  })
})

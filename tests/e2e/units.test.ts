import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { beforeAll, describe, expect, it, inject } from 'vitest'
import jsQR from 'jsqr'
import { PNG } from 'pngjs'
import { PDFDocument } from 'pdf-lib'
import { api, demo, signIn, type DemoRole } from './support/api'
import { OTHER_LEAD } from './support/fixtures'
import { download, makePng, upload } from './support/files'

// The register of built units and patterns: stages, loans, history, photos, labels.
const roles = Object.keys(demo) as DemoRole[]
const cookies = {} as Record<DemoRole, string>
let otherLead = ''
let design: { id: string; revisionId: string; number: number }
const stamp = Date.now().toString(36)

const isoDay = (offsetDays: number) => new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10)

beforeAll(async () => {
  for (const r of roles) cookies[r] = await signIn(demo[r])
  otherLead = await signIn(OTHER_LEAD.email, OTHER_LEAD.password)
  const created = await api('/api/designs', { method: 'POST', cookie: cookies.designer, body: { name: `Register test trunk ${stamp}`, sizeLabel: '16 in tube', params: {} } })
  design = { id: created.body.id, revisionId: created.body.revision.id, number: 1 }
})

async function newUnit(label: string, cookie = cookies.builder, extra: Record<string, unknown> = {}) {
  const res = await api('/api/units', { method: 'POST', cookie, body: { kind: 'plate', label, designId: design.id, ...extra } })
  expect(res.status).toBe(201)
  return res.body.id as string
}

describe('units: who may do what', () => {
  it('answers 401 without a session', async () => {
    for (const [method, path] of [['GET', '/api/units'], ['POST', '/api/units'], ['GET', '/api/units/overdue'], ['GET', '/api/units/labels.pdf']]) {
      expect((await api(path!, { method, body: method === 'POST' ? {} : undefined })).status).toBe(401)
    }
  })

  it.each(['lead', 'designer', 'builder'] as DemoRole[])('a %s records a built unit from the design\'s latest revision', async (role) => {
    const id = await newUnit(`T-${role}-${stamp}`, cookies[role])
    const got = await api(`/api/units/${id}`, { cookie: cookies.viewer })
    expect(got.status).toBe(200)
    expect(got.body).toMatchObject({ kind: 'plate', status: 'cut', designId: design.id, revisionId: design.revisionId, revisionNumber: 1, sizeLabel: '16 in tube' })
    expect(got.body.history[0]).toMatchObject({ action: 'created' })
    expect(got.body.history[0].userName).toBeTruthy()
  })

  it('a viewer may look but not record or change (403)', async () => {
    expect((await api('/api/units', { method: 'POST', cookie: cookies.viewer, body: { kind: 'pattern', label: 'nope' } })).status).toBe(403)
    const id = await newUnit(`V-${stamp}`)
    expect((await api(`/api/units/${id}`, { method: 'PATCH', cookie: cookies.viewer, body: { status: 'finished' } })).status).toBe(403)
    expect((await api(`/api/units/${id}/loans`, { method: 'POST', cookie: cookies.viewer, body: { borrower: 'x', outOn: isoDay(0), dueOn: isoDay(1) } })).status).toBe(403)
    expect((await upload(`/api/units/${id}/photos`, makePng(8, 8), 'p.png', { cookie: cookies.viewer })).status).toBe(403)
    expect((await api('/api/units', { cookie: cookies.viewer })).status).toBe(200)
  })

  it('another shop sees none of ours and cannot touch them (404)', async () => {
    const id = await newUnit(`X-${stamp}`)
    expect((await api(`/api/units/${id}`, { cookie: otherLead })).status).toBe(404)
    expect((await api(`/api/units/${id}`, { method: 'PATCH', cookie: otherLead, body: { status: 'finished' } })).status).toBe(404)
    expect((await api(`/api/units/${id}/loans`, { method: 'POST', cookie: otherLead, body: { borrower: 'x', outOn: isoDay(0), dueOn: isoDay(1) } })).status).toBe(404)
    expect((await upload(`/api/units/${id}/photos`, makePng(8, 8), 'p.png', { cookie: otherLead })).status).toBe(404)
    const theirs = await api('/api/units', { cookie: otherLead })
    expect(theirs.body.map((u: { id: string }) => u.id)).not.toContain(id)
    // Nor may they build a unit of our design.
    const cross = await api('/api/units', { method: 'POST', cookie: otherLead, body: { kind: 'plate', label: 'Stolen', designId: design.id } })
    expect(cross.status).toBe(422)
    expect(cross.body.data.fields.designId).toBeTruthy()
    expect((await api(`/api/designs/${design.id}/unit-counts`, { cookie: otherLead })).status).toBe(404)
  })
})

describe('units: stages, loans, history', () => {
  it('moves through two stages, is lent and returned, and the history says who changed what', async () => {
    const id = await newUnit(`S-${stamp}`)
    expect((await api(`/api/units/${id}`, { method: 'PATCH', cookie: cookies.builder, body: { status: 'laminated' } })).status).toBe(200)
    expect((await api(`/api/units/${id}`, { method: 'PATCH', cookie: cookies.builder, body: { status: 'finished', location: 'Bay 3, rack B' } })).status).toBe(200)
    // on_loan is not set by hand.
    const byHand = await api(`/api/units/${id}`, { method: 'PATCH', cookie: cookies.builder, body: { status: 'on_loan' } })
    expect(byHand.status).toBe(422)
    expect(byHand.body.data.fields.status).toBeTruthy()

    const lend = await api(`/api/units/${id}/loans`, { method: 'POST', cookie: cookies.builder, body: { borrower: 'Millbrook High drama', outOn: isoDay(-3), dueOn: isoDay(10) } })
    expect(lend.status).toBe(201)
    expect((await api(`/api/units/${id}/loans`, { method: 'POST', cookie: cookies.builder, body: { borrower: 'Twice', outOn: isoDay(0), dueOn: isoDay(1) } })).status).toBe(409)
    expect((await api(`/api/units/${id}`, { method: 'PATCH', cookie: cookies.builder, body: { status: 'in_stock' } })).status).toBe(409)
    const early = await api(`/api/units/${id}/return`, { method: 'POST', cookie: cookies.builder, body: { returnedOn: isoDay(-5) } })
    expect(early.status).toBe(422)
    expect((await api(`/api/units/${id}/return`, { method: 'POST', cookie: cookies.lead, body: { returnedOn: isoDay(0) } })).status).toBe(200)
    expect((await api(`/api/units/${id}/return`, { method: 'POST', cookie: cookies.lead, body: { returnedOn: isoDay(0) } })).status).toBe(409)

    const got = (await api(`/api/units/${id}`, { cookie: cookies.viewer })).body
    expect(got.status).toBe('in_stock')
    expect(got.location).toBe('Bay 3, rack B')
    expect(got.loans).toEqual([expect.objectContaining({ borrower: 'Millbrook High drama', outOn: isoDay(-3), dueOn: isoDay(10), returnedOn: isoDay(0) })])
    const actions = got.history.map((h: { action: string }) => h.action).reverse()
    expect(actions).toEqual(['created', 'status', 'status', 'lent', 'returned'])
    const second = got.history.find((h: { action: string; changes: Record<string, unknown> }) => h.action === 'status' && h.changes.location)
    expect(second.changes).toEqual({ status: ['laminated', 'finished'], location: ['', 'Bay 3, rack B'] })
    const returned = got.history[0]
    expect(returned.userName).toBe((await api('/api/me', { cookie: cookies.lead })).body.name)
  })

  it('validates with field messages: label, dates, kind, duplicate labels', async () => {
    const res = await api('/api/units', { method: 'POST', cookie: cookies.builder, body: { kind: 'crate', label: ' ' } })
    expect(res.status).toBe(422)
    expect(Object.keys(res.body.data.fields)).toEqual(expect.arrayContaining(['kind', 'label']))
    await newUnit(`Dup-${stamp}`)
    const dup = await api('/api/units', { method: 'POST', cookie: cookies.builder, body: { kind: 'pattern', label: `dup-${stamp}` } })
    expect(dup.status).toBe(422)
    expect(dup.body.data.fields.label).toMatch(/already/)
    const id = await newUnit(`D-${stamp}`)
    const loan = await api(`/api/units/${id}/loans`, { method: 'POST', cookie: cookies.builder, body: { borrower: '', outOn: '2026-13-01', dueOn: isoDay(0) } })
    expect(loan.status).toBe(422)
    expect(Object.keys(loan.body.data.fields)).toEqual(expect.arrayContaining(['borrower', 'outOn']))
    const backwards = await api(`/api/units/${id}/loans`, { method: 'POST', cookie: cookies.builder, body: { borrower: 'A', outOn: isoDay(5), dueOn: isoDay(1) } })
    expect(backwards.status).toBe(422)
    expect(backwards.body.data.fields.dueOn).toBeTruthy()
    const wrongRev = await api('/api/units', { method: 'POST', cookie: cookies.builder, body: { kind: 'plate', label: `R-${stamp}`, designId: design.id, revisionId: inject('other').revisionId } })
    expect(wrongRev.status).toBe(422)
    expect(wrongRev.body.data.fields.revisionId).toBeTruthy()
  })

  it('lists with filters, shows overdue loans, and counts units per revision', async () => {
    const late = await newUnit(`L-${stamp}`)
    await api(`/api/units/${late}/loans`, { method: 'POST', cookie: cookies.builder, body: { borrower: 'Riverside Players', outOn: isoDay(-20), dueOn: isoDay(-2) } })
    const pattern = await api('/api/units', { method: 'POST', cookie: cookies.designer, body: { kind: 'pattern', label: `P-${stamp}`, designId: design.id, status: 'in_stock' } })
    expect(pattern.status).toBe(201)

    const onLoan = (await api('/api/units?status=on_loan', { cookie: cookies.viewer })).body
    expect(onLoan.map((u: { id: string }) => u.id)).toContain(late)
    expect(onLoan.every((u: { status: string }) => u.status === 'on_loan')).toBe(true)
    const patterns = (await api(`/api/units?kind=pattern&q=${stamp}`, { cookie: cookies.viewer })).body
    expect(patterns.map((u: { label: string }) => u.label)).toEqual([`P-${stamp}`])
    expect((await api('/api/units?status=sideways', { cookie: cookies.viewer })).status).toBe(422)

    const overdue = (await api('/api/units/overdue', { cookie: cookies.viewer })).body
    const mine = overdue.find((u: { id: string }) => u.id === late)
    expect(mine.loan).toMatchObject({ borrower: 'Riverside Players', dueOn: isoDay(-2), overdue: true })
    expect((await api('/api/units/overdue', { cookie: otherLead })).body.map((u: { id: string }) => u.id)).not.toContain(late)

    const counts = (await api(`/api/designs/${design.id}/unit-counts`, { cookie: cookies.viewer })).body
    const r1 = counts.find((c: { number: number }) => c.number === 1)
    const all = (await api(`/api/units?designId=${design.id}&kind=plate`, { cookie: cookies.viewer })).body
    expect(r1.built).toBe(all.length)
    expect(r1.onLoan).toBe(all.filter((u: { status: string }) => u.status === 'on_loan').length)
  })

  it('keeps photos of a unit: builders add, every role views, read back byte-identical', async () => {
    const id = await newUnit(`Ph-${stamp}`)
    const png = makePng(30, 20, [{ x: 10, y: 10, r: 4 }])
    const res = await upload(`/api/units/${id}/photos`, png, 'finished.png', { cookie: cookies.builder })
    expect(res.status).toBe(201)
    const got = await download(res.body.url, cookies.viewer)
    expect(Buffer.from(got.bytes).equals(Buffer.from(png))).toBe(true)
    const unit = (await api(`/api/units/${id}`, { cookie: cookies.viewer })).body
    expect(unit.photos.map((p: { id: string }) => p.id)).toEqual([res.body.id])
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: cookies.viewer })).status).toBe(403)
    expect((await api(`/api/attachments/${res.body.id}`, { method: 'DELETE', cookie: cookies.builder })).status).toBe(204)
  })
})

describe('label sheet', () => {
  it('is a Letter PDF whose QR codes, read by an independent decoder (jsQR), open each unit\'s page', async () => {
    const a = await newUnit(`QR-A-${stamp}`)
    const b = await newUnit(`QR-B-${stamp}`)
    const res = await download(`/api/units/labels.pdf?ids=${a},${b}`, cookies.viewer)
    expect(res.status).toBe(200)
    expect(res.type).toBe('application/pdf')
    const doc = await PDFDocument.load(res.bytes)
    expect(doc.getPageCount()).toBe(1)
    // US Letter is 8.5 x 11 in = 612 x 792 pt (ASME Y14.1; 1 pt = 1/72 in, ISO 32000-1 8.3.2.3).
    expect(doc.getPage(0).getSize()).toEqual({ width: 612, height: 792 })

    const dir = mkdtempSync(join(tmpdir(), 'labels-'))
    writeFileSync(join(dir, 'labels.pdf'), res.bytes)
    execFileSync('pdftoppm', ['-r', '150', '-png', join(dir, 'labels.pdf'), join(dir, 'page')])
    const pagePng = readdirSync(dir).find(f => f.endsWith('.png'))!
    mkdirSync('test-results/e2e', { recursive: true })
    writeFileSync('test-results/e2e/unit-labels.png', readFileSync(join(dir, pagePng)))
    const page = PNG.sync.read(readFileSync(join(dir, pagePng)))
    // Each label cell is 3.75 x 2 in inside 0.5 in margins; read the code of each of the first two cells.
    const dpi = 150
    const found: string[] = []
    for (const col of [0, 1]) {
      const x0 = Math.round((0.5 + col * 3.75) * dpi)
      const y0 = Math.round(0.5 * dpi)
      const w = Math.round(3.75 * dpi)
      const h = Math.round(2 * dpi)
      const crop = new Uint8ClampedArray(w * h * 4)
      for (let y = 0; y < h; y++) crop.set(page.data.subarray(((y0 + y) * page.width + x0) * 4, ((y0 + y) * page.width + x0 + w) * 4), y * w * 4)
      const code = jsQR(crop, w, h)
      expect(code, `QR code in label ${col + 1}`).not.toBeNull()
      found.push(code!.data)
    }
    const base = inject('baseUrl')
    expect(found).toEqual([`${base}/units/${a}`, `${base}/units/${b}`])
    expect((await api(`/api/units/labels.pdf?ids=nope`, { cookie: cookies.viewer })).status).toBe(422)
  })
})

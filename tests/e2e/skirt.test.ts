// Skirt strips end to end on a design of this file's own: settings saved with
// the revision and refused with field messages when wrong, the rib profile PDF
// read back with pdf-lib, another shop's revision a 404, and the editor's
// panel and canvas in Chromium (any console error fails the test).
import { mkdirSync } from 'node:fs'
import { PDFDocument } from 'pdf-lib'
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, signIn } from './support/api'

const shots = 'test-results/e2e'
let browser: Browser
let designer = ''
let designId = ''
let revisionId = ''

// Six even lobes on a 12 in tube, 24 fixed stations: the count is ours to check.
const params = { tubeDiameter: 304.8, rotation: 0, lobes: { count: 6, irregularity: 0 }, skirt: { count: 24, profile: 'straight' } }

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  designer = await signIn('designer@rootplate.test')
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: `Skirt test stump ${Date.now()}`, params } })
  expect(created.status).toBe(201)
  designId = created.body.id
  revisionId = created.body.revision.id
  browser = await launchChromium()
})
afterAll(() => browser?.close())

describe('skirt settings and the rib profile PDF over HTTP', () => {
  it('keeps the skirt settings with the revision', async () => {
    const res = await api(`/api/revisions/${revisionId}`, { cookie: designer })
    expect(res.status).toBe(200)
    expect(res.body.params.skirt).toMatchObject({ count: 24, profile: 'straight' })
  })

  it('refuses an overlap as wide as the strip with a field message, and keeps the last revision', async () => {
    const res = await api(`/api/designs/${designId}/revisions`, { method: 'POST', cookie: designer, body: { params: { ...params, skirt: { stripWidth: 50, overlap: 60 } }, note: 'bad skirt', basedOn: 1 } })
    expect(res.status).toBe(422)
    expect(JSON.stringify(res.body.data)).toMatch(/skirt\.overlap|overlap/)
    const design = await api(`/api/designs/${designId}`, { cookie: designer })
    expect(design.body.latest.number).toBe(1)
  })

  it('writes skirt-profiles.pdf: a cover and Letter sheets (612 x 792 pt, ASME Y14.1), named for the design', async () => {
    const res = await fetch(`${inject('baseUrl')}/api/revisions/${revisionId}/skirt-profiles.pdf?paper=letter&units=mm`, { headers: { cookie: designer } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/application\/pdf/)
    expect(res.headers.get('content-disposition')).toMatch(/skirt-profiles\.pdf/)
    const doc = await PDFDocument.load(new Uint8Array(await res.arrayBuffer()))
    expect(doc.getPageCount()).toBeGreaterThan(1)
    const s = doc.getPage(1).getSize()
    expect([Math.min(s.width, s.height), Math.max(s.width, s.height)]).toEqual([612, 792])
  })

  it('refuses bad options with field messages; another shop\'s revision is a 404', async () => {
    const bad = await api(`/api/revisions/${revisionId}/skirt-profiles.pdf?paper=b5`, { cookie: designer })
    expect(bad.status).toBe(422)
    expect(bad.body.data.fields.paper).toMatch(/Paper must be one of/)
    // A revision of another shop (set up once for all tests), asked for by this shop's designer.
    const res = await api(`/api/revisions/${inject('other').revisionId}/skirt-profiles.pdf`, { cookie: designer })
    expect(res.status).toBe(404)
    const anon = await api(`/api/revisions/${revisionId}/skirt-profiles.pdf`)
    expect(anon.status).toBe(401)
  })
})

describe('the skirt panel in Chromium', () => {
  afterEach(() => { expect(takePageProblems()).toEqual([]) })

  async function open(): Promise<Page> {
    const base = inject('baseUrl')
    const page = watchPage(await browser.newPage({ viewport: { width: 1400, height: 900 } }))
    await page.goto(`${base}/login`)
    await page.getByLabel('E-mail').fill('designer@rootplate.test')
    await page.getByLabel('Password').fill('rootplate-demo')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/`)
    await page.waitForLoadState('networkidle')
    await page.goto(`${base}/designs/${designId}`)
    await page.getByTestId('plate-canvas').waitFor()
    await page.getByText('Preparing the drawing…').waitFor({ state: 'detached' })
    return page
  }

  it('shows 24 strips in the cut list and totals, and follows a change of count and profile', async () => {
    const page = await open()
    const panel = page.getByTestId('skirt-panel')
    await panel.waitFor()
    const qty = async () => (await panel.locator('tbody tr td:nth-child(2)').allTextContents()).reduce((n, t) => n + Number(t), 0)
    expect(await qty()).toBe(24)
    expect((await page.getByTestId('skirt-totals').textContent())).toContain('24')
    await page.getByTestId('plate-canvas').screenshot({ path: `${shots}/skirt-canvas.png` })
    // The panel scrolls inside its column; it never stretches the window.
    expect(await page.evaluate(() => document.documentElement.scrollHeight)).toBeLessThanOrEqual(900)
    await panel.screenshot({ path: `${shots}/skirt-panel.png` })

    await page.getByLabel('Stations').fill('30')
    await page.getByLabel('Stations').press('Enter')
    await expect.poll(qty).toBe(30)
    // Six stations round six roots on a 12 in tube: far more than a 3 in strip apart, so a warning names the gap.
    await page.getByLabel('Stations').fill('6')
    await page.getByLabel('Stations').press('Enter')
    await expect.poll(async () => (await panel.getByTestId('skirt-bare-edge').textContent()) ?? '').toMatch(/stand .+ apart along the edge, more than a strip's width .+ of edge is left bare/)
    await panel.screenshot({ path: `${shots}/skirt-bare-edge.png` })
    await page.getByLabel('Stations').fill('2')
    await page.getByLabel('Stations').press('Enter')
    await expect.poll(() => panel.getByRole('alert').first().textContent()).toMatch(/3 to 720/)
    // Straight strips are never longer than quarter ellipses on the same run and rise (a chord is the shortest path).
    const longest = async () => (await panel.locator('tbody tr td:first-child').first().textContent())!.trim()
    const straight = await longest()
    await page.getByLabel('Profile').selectOption('quarter-ellipse')
    await expect.poll(longest).not.toBe(straight)
    // Emptied, the count is automatic again: spaced by the strip width, no bare edge and no warning.
    await page.getByLabel('Stations').fill('')
    await page.getByLabel('Stations').press('Enter')
    await expect.poll(() => panel.getByTestId('skirt-bare-edge').count()).toBe(0)
    await page.close()
  })
})

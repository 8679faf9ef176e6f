// The export panel in Chromium: the builder (who may print but not edit)
// changes the paper, sees the sheet count follow, and downloads a cut file.
// Its design, its builder and their shop are its own.
import { mkdirSync, readFileSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import DxfParser from 'dxf-parser'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, freshAddress, signIn } from './support/api'
import { createOwnShop } from './support/fixtures'
import { hasher } from '../../scripts/seed'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser

const defaults = { paper: 'letter', orientation: 'auto', units: 'in', overlap: 12.7, margin: 6.35, includeReference: true, mirror: false, bushing: null, openings: 'routed' }
let cookie = ''
let designId = ''

// This file's own design (the shared demo designs stay untouched): a round
// plate, no lobes, on a 16 in tube, about 530 mm across.
const params = { tubeDiameter: 406.4, casterCount: 3, casterOffset: 170, rotation: 0, lobes: { count: 0, irregularity: 0, valley: 62 } }

// People of their own too, in a shop of their own: the tests change the builder's remembered settings.
let builder = { email: '', password: '' }

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  const own = await createOwnShop(inject('databaseUrl'), p => hasher.make(p), ['designer', 'builder'])
  builder = own.builder
  cookie = await signIn(builder.email, builder.password)
  const designer = await signIn(own.designer.email, own.designer.password)
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Export test column', sizeLabel: '16 in tube', params } })
  expect(created.status).toBe(201)
  designId = created.body.id
})
// Each test starts from the remembered defaults, whatever the one before it chose.
beforeEach(async () => {
  const reset = await api('/api/me/preferences', { method: 'PATCH', cookie, body: { export: defaults } })
  expect(reset.status).toBe(200)
})
afterAll(() => browser?.close())
// Any console error (a hydration mismatch among them) or failed request fails the test.
afterEach(() => { expect(takePageProblems()).toEqual([]) })

/** A context with a client address of its own, so these sign-ins never meet another test's sign-in limit. */
function newContext(options: { acceptDownloads?: boolean } = {}) {
  return browser.newContext({ viewport: { width: 1280, height: 800 }, extraHTTPHeaders: { 'x-forwarded-for': freshAddress() }, ...options })
}

/** Signs in as the builder through the form and opens this file's design by its address. */
async function openDesign(page: Page, allow: RegExp[] = []): Promise<void> {
  watchPage(page, allow)
  const base = inject('baseUrl')
  await signInThroughForm(page, builder.email, builder.password)
  await page.goto(`${base}/designs/${designId}`)
  await page.getByTestId('export-panel').waitFor()
}

/**
 * Sheets of one paper by hand: along a side of `extent` mm, the first sheet
 * prints `printable` = paper - 2 margins and each further one adds
 * printable - overlap, so n = ceil((extent - overlap) / (printable - overlap)).
 * The drawing is the plate plus 4 mm of clear space each side; the paper
 * turns whichever way needs fewer sheets. For a round plate on a grid at
 * most two sheets deep (or one whose corner sheets still reach the disc)
 * every sheet carries part of the plate, so all are printed.
 * Paper: Letter 215.9 x 279.4 mm (ASME Y14.1), A4 210 x 297 mm (ISO 216);
 * margin 1/4 in and overlap 1/2 in, the defaults this file resets to.
 */
function sheetsByHand(paper: [number, number], width: number, height: number): number {
  const margin = 6.35
  const overlap = 12.7
  const along = (extent: number, side: number) => Math.max(1, Math.ceil((extent - overlap) / (side - 2 * margin - overlap)))
  const w = width + 8
  const h = height + 8
  return Math.min(along(w, paper[0]) * along(h, paper[1]), along(w, paper[1]) * along(h, paper[0]))
}

/** `20-7/8"` to millimetres (1 in = 25.4 mm, NIST SP 811). */
function inches(shown: string | null): number {
  const m = /^(\d+)(?:-(\d+)\/(\d+))?"$/.exec(shown?.trim() ?? '')
  if (!m) throw new Error(`not a length in inches: ${shown}`)
  return (Number(m[1]) + (m[2] ? Number(m[2]) / Number(m[3]) : 0)) * 25.4
}

describe('the export panel in Chromium', () => {
  it('the builder switches to A4, sees the count change, downloads the DXF under the server\'s name, and finds A4 again next time', async () => {
    const context = await newContext({ acceptDownloads: true })
    const page = await context.newPage()
    // Seen once in several runs on a loaded machine: Chromium listed the DXF's GET as aborted although
    // the download event had fired and the file below parsed whole. Cause not yet found; only that
    // request's abort is let through, every other problem still fails the test.
    await openDesign(page, [/request failed: GET .*\/cut\.dxf\?.* net::ERR_ABORTED$/])

    // The plate's size as the page shows it, to 1/16 in; a round plate, so width and depth nearly agree.
    const width = inches(await page.getByTestId('metric-width').textContent())
    const height = inches(await page.getByTestId('metric-height').textContent())
    const letterByHand = sheetsByHand([215.9, 279.4], width, height)
    const a4ByHand = sheetsByHand([210, 297], width, height)
    // About 530 mm across: three Letter sheets each way (3 x 3), but A4's longer side spans it in two (3 x 2).
    expect([letterByHand, a4ByHand]).toEqual([9, 6])

    const count = page.getByTestId('sheet-count')
    await expect(count.textContent()).resolves.toMatch(/^\d+ sheets? of Letter, (portrait|landscape)$/)
    const letter = await count.textContent()
    expect(Number(letter!.split(' ')[0])).toBe(letterByHand)

    await page.getByLabel('Paper', { exact: true }).selectOption('a4')
    await page.waitForFunction(() => document.querySelector('[data-testid="sheet-count"]')?.textContent?.includes('of A4'))
    const a4 = await count.textContent()
    expect(a4).toMatch(/^\d+ sheets? of A4, (portrait|landscape)$/)
    // The count itself follows the paper, to the hand figure.
    const printed = Number(a4!.split(' ')[0])
    expect(printed).toBe(a4ByHand)
    expect(printed).not.toBe(Number(letter!.split(' ')[0]))
    // Every printed sheet is one labelled cell of the preview.
    expect(await page.getByTestId('sheet-preview').locator('text').count()).toBe(printed)

    await page.getByTestId('export-panel').scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${shots}/export-panel.png` })
    // Remembered for this person after a short pause.
    await expect.poll(async () => (await api('/api/me', { cookie })).body.preferences.export.paper, { timeout: 5000 }).toBe('a4')

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'DXF' }).click(),
    ])
    expect(download.suggestedFilename()).toBe('export-test-column-16in-tube-r1.dxf')
    const path = await download.path()
    // The file the browser saved is the DXF itself, in inches by default ($INSUNITS 1, DXF Reference, HEADER).
    const dxf = new DxfParser().parseSync(readFileSync(path, 'utf8'))
    expect(dxf?.header.$INSUNITS).toBe(1)

    // The next visit opens with the paper chosen last time.
    const again = watchPage(await context.newPage())
    await again.goto(page.url())
    await again.getByTestId('export-panel').waitFor()
    await expect(again.getByLabel('Paper', { exact: true }).inputValue()).resolves.toBe('a4')
    await context.close()
  })

  it('a guide bushing shows its offset, (bushing - bit) / 2, and the keyboard reaches the downloads', async () => {
    const context = await newContext()
    const page = await context.newPage()
    await openDesign(page)
    await page.getByLabel('Pattern for a router guide bushing').check()
    await page.getByLabel('Bushing Ø').fill('3/4')
    await page.getByLabel('Bushing Ø').press('Enter')
    await page.getByLabel('Bit Ø').fill('1/4')
    await page.getByLabel('Bit Ø').press('Tab')
    // (3/4 - 1/4) / 2 = 1/4 in (router pattern practice).
    await expect(page.getByTestId('bushing-offset').textContent()).resolves.toMatch(/^1\/4/)

    await page.getByLabel('Bit Ø').fill('1')
    await page.getByLabel('Bit Ø').press('Enter')
    await expect(page.getByRole('alert').filter({ hasText: 'wider than the bit' }).count()).resolves.toBe(1)
    await expect(page.getByRole('button', { name: 'Template PDF' }).isDisabled()).resolves.toBe(true)
    await page.screenshot({ path: `${shots}/export-panel-bushing.png` })
    // Nothing in the panel may stretch the page: the columns scroll, the window does not.
    expect(await page.evaluate(() => document.documentElement.scrollHeight)).toBeLessThanOrEqual(800)

    await page.getByLabel('Mirror').focus()
    await page.keyboard.press('Tab')
    await page.keyboard.press('Tab')
    const focused = await page.evaluate(() => document.activeElement?.textContent?.trim())
    expect(focused).toBe('SVG')
    await context.close()
  })

  it.each([1440, 390])('at %i px the cut files offer Routed (default) or Hole saw, and the DXF follows the choice', async (width) => {
    const context = await browser.newContext({ viewport: { width, height: 900 }, extraHTTPHeaders: { 'x-forwarded-for': freshAddress() }, acceptDownloads: true })
    const page = await context.newPage()
    await openDesign(page, [/request failed: GET .*\/cut\.dxf\?.* net::ERR_ABORTED$/])
    const routed = page.getByRole('radio', { name: 'Routed' })
    await expect(routed.isChecked()).resolves.toBe(true)
    await expect(page.getByTestId('export-openings-hint').textContent()).resolves.toMatch(/inside profile on the cut layer RP-INSIDE-CUT/)
    await page.getByText('Hole saw', { exact: true }).click()
    await expect(page.getByTestId('export-openings-hint').textContent()).resolves.toMatch(/pilot on RP-DRILL/)
    await page.getByTestId('export-openings-hint').scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${shots}/export-openings-${width}.png` })
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'DXF' }).click(),
    ])
    const dxf = new DxfParser().parseSync(readFileSync(await download.path(), 'utf8'))!
    // This design's 4-1/4 in pockets (three casters) on a saw layer, none routed.
    const sawn = dxf.entities.filter(e => e.type === 'CIRCLE' && e.layer === 'RP-HOLESAW-4.25IN')
    expect(sawn).toHaveLength(3)
    expect(dxf.entities.filter(e => e.layer === 'RP-INSIDE-CUT')).toHaveLength(0)
    // Remembered for this person.
    await expect.poll(async () => (await api('/api/me', { cookie })).body.preferences.export.openings, { timeout: 5000 }).toBe('hole-saw')
    await context.close()
  })

  it('shows the server\'s field messages when it refuses a file', async () => {
    const context = await newContext()
    const page = await context.newPage()
    // The 422 is provoked on purpose; Chromium also logs it as a failed resource.
    await openDesign(page, [/answer 422: GET .*\/template\.pdf/, /status of 422/])
    // The panel never offers a bad paper, so the request is altered on its way to the real server.
    await page.route('**/template.pdf?*', route => route.continue({ url: route.request().url().replace(/paper=[^&]+/, 'paper=b5') }))
    await page.getByRole('button', { name: 'Template PDF' }).click()
    const alert = page.getByRole('alert').filter({ hasText: 'Paper:' })
    await alert.waitFor()
    await expect(alert.textContent()).resolves.toMatch(/Paper must be one of/)
    await expect(page.getByLabel('Paper', { exact: true }).getAttribute('aria-invalid')).resolves.toBe('true')
    await expect(page.getByRole('button', { name: 'Template PDF' }).isEnabled()).resolves.toBe(true)
    await page.screenshot({ path: `${shots}/export-panel-refused.png` })
    await context.close()
  })
})

// The export panel in Chromium: the builder (who may print but not edit)
// changes the paper, sees the sheet count follow, and downloads a cut file.
import { mkdirSync, readFileSync } from 'node:fs'
import { afterAll, beforeAll, beforeEach, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import DxfParser from 'dxf-parser'
import { launchChromium } from './support/browser'
import { api, freshAddress, signIn } from './support/api'

const shots = 'test-results/e2e'
let browser: Browser

const defaults = { paper: 'letter', orientation: 'auto', units: 'in', overlap: 12.7, margin: 6.35, includeReference: true, mirror: false, bushing: null }
let cookie = ''

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  cookie = await signIn('builder@rootplate.test')
})
// Each test starts from the remembered defaults, whatever the one before it chose.
beforeEach(async () => {
  const reset = await api('/api/me/preferences', { method: 'PATCH', cookie, body: { export: defaults } })
  expect(reset.status).toBe(200)
})
afterAll(() => browser?.close())

/** A context with a client address of its own, so these sign-ins never meet another test's sign-in limit. */
function newContext(options: { acceptDownloads?: boolean } = {}) {
  return browser.newContext({ viewport: { width: 1280, height: 800 }, extraHTTPHeaders: { 'x-forwarded-for': freshAddress() }, ...options })
}

async function openHollowOak(page: Page): Promise<void> {
  const base = inject('baseUrl')
  await page.goto(`${base}/login`)
  await page.getByLabel('E-mail').fill('builder@rootplate.test')
  await page.getByLabel('Password').fill('rootplate-demo')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(`${base}/`)
  await page.getByRole('link', { name: 'Hollow oak' }).click()
  await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/)
  await page.getByTestId('export-panel').waitFor()
}

describe('the export panel in Chromium', () => {
  it('the builder switches to A4, sees the count change, downloads the DXF under the server\'s name, and finds A4 again next time', async () => {
    const context = await newContext({ acceptDownloads: true })
    const page = await context.newPage()
    await openHollowOak(page)

    const count = page.getByTestId('sheet-count')
    await expect(count.textContent()).resolves.toMatch(/^\d+ sheets? of Letter, (portrait|landscape)$/)
    const letter = await count.textContent()

    await page.getByLabel('Paper', { exact: true }).selectOption('a4')
    await page.waitForFunction(() => document.querySelector('[data-testid="sheet-count"]')?.textContent?.includes('of A4'))
    const a4 = await count.textContent()
    expect(a4).toMatch(/^\d+ sheets? of A4, (portrait|landscape)$/)
    expect(a4).not.toBe(letter)
    // Every printed sheet is one labelled cell of the preview.
    const printed = Number(a4!.split(' ')[0])
    expect(await page.getByTestId('sheet-preview').locator('text').count()).toBe(printed)

    await page.getByTestId('export-panel').scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${shots}/export-panel.png` })
    // Remembered for this person after a short pause.
    await expect.poll(async () => (await api('/api/me', { cookie })).body.preferences.export.paper, { timeout: 5000 }).toBe('a4')

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'DXF' }).click(),
    ])
    expect(download.suggestedFilename()).toMatch(/^hollow-oak-medium-16in-tube-r\d+\.dxf$/)
    const path = await download.path()
    // The file the browser saved is the DXF itself, in inches by default ($INSUNITS 1, DXF Reference, HEADER).
    const dxf = new DxfParser().parseSync(readFileSync(path, 'utf8'))
    expect(dxf?.header.$INSUNITS).toBe(1)

    // The next visit opens with the paper chosen last time.
    const again = await context.newPage()
    await again.goto(page.url())
    await again.getByTestId('export-panel').waitFor()
    await expect(again.getByLabel('Paper', { exact: true }).inputValue()).resolves.toBe('a4')
    await context.close()
  })

  it('a guide bushing shows its offset, (bushing - bit) / 2, and the keyboard reaches the downloads', async () => {
    const context = await newContext()
    const page = await context.newPage()
    await openHollowOak(page)
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

  it('shows the server\'s field messages when it refuses a file', async () => {
    const context = await newContext()
    const page = await context.newPage()
    await openHollowOak(page)
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

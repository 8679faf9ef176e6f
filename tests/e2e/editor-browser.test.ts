import { mkdirSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, signIn } from './support/api'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser
let designId = ''

// A plate of this file's own (never the shared demo designs): four even lobes
// on a 16 in tube, no irregularity, the first lobe along +x, so lobe 3
// (index 2) points along -x and each tip stands tube/2 + valley + reach =
// 203.2 + 30 + 120 = 353.2 mm from the centre.
const params = { tubeDiameter: 406.4, casterCount: 4, casterOffset: 230, rotation: 0, lobes: { count: 4, reach: 120, width: 160, roundness: 0.5, irregularity: 0, phase: 0, valley: 30 } }
const tipRadius = 406.4 / 2 + 30 + 120

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  const designer = await signIn('designer@rootplate.test')
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: `Editor test stump ${Date.now()}`, sizeLabel: '16 in tube', params } })
  expect(created.status).toBe(201)
  designId = created.body.id
})
afterAll(() => browser?.close())
// Any console error (a hydration mismatch among them) or failed request fails the test.
afterEach(() => { expect(takePageProblems()).toEqual([]) })

/** Signs in through the form, then opens this file's design by its address (rendered on the server, then hydrated). */
async function signInAndOpen(email: string): Promise<Page> {
  const base = inject('baseUrl')
  const page = watchPage(await browser.newPage({ viewport: { width: 1280, height: 800 } }))
  await signInThroughForm(page, email)
  await page.goto(`${base}/designs/${designId}`)
  await page.getByTestId('plate-canvas').waitFor()
  await page.getByText('Preparing the drawing…').waitFor({ state: 'detached' })
  return page
}

const text = (page: Page, id: string) => page.getByTestId(id).textContent()

/** Shop notation as the page shows it (`27-7/8"`, `28"`) to millimetres: 1 in = 25.4 mm (NIST SP 811). */
function inches(shown: string | null): number {
  const m = /^(\d+)(?:-(\d+)\/(\d+))?"$/.exec(shown?.trim() ?? '')
  if (!m) throw new Error(`not a length in inches: ${shown}`)
  return (Number(m[1]) + (m[2] ? Number(m[2]) / Number(m[3]) : 0)) * 25.4
}
/** "2.29 ft²" to a number of square feet. */
function squareFeet(shown: string | null): number {
  const m = /^([\d.]+) ft²$/.exec(shown?.trim() ?? '')
  if (!m) throw new Error(`not an area in ft²: ${shown}`)
  return Number(m[1])
}

describe('the editor in Chromium', () => {
  it('a designer drags a lobe, types a tube size, saves, compares and undoes', async () => {
    const page = await signInAndOpen('designer@rootplate.test')
    const tip = page.locator('[data-handle="lobe-2"]')
    await tip.waitFor()
    const widthBefore = await text(page, 'metric-width')
    const areaBefore = await text(page, 'metric-area')
    // Tip to tip across the plate: 2 x 353.2 = 706.4 mm (shown to 1/16 in, the tips a little rounded).
    expect(inches(widthBefore) / (2 * tipRadius)).toBeCloseTo(1, 1)
    const box = (await tip.boundingBox())!
    const canvas = (await page.getByTestId('plate-canvas').boundingBox())!
    const centre = { x: canvas.x + canvas.width / 2, y: canvas.y + canvas.height / 2 }
    const from = { x: box.x + box.width / 2, y: box.y + box.height / 2 }
    // Pull the root straight out, 60 % further from the middle of the view.
    const to = { x: from.x + (from.x - centre.x) * 0.6, y: from.y + (from.y - centre.y) * 0.6 }
    await page.mouse.move(from.x, from.y)
    await page.mouse.down()
    for (let i = 1; i <= 15; i++) await page.mouse.move(from.x + (to.x - from.x) * i / 15, from.y + (to.y - from.y) * i / 15)
    await page.mouse.up()
    await expect.poll(() => text(page, 'metric-area')).not.toBe(areaBefore)
    expect(await page.getByText('Lobes moved by hand').isVisible()).toBe(true)
    await page.screenshot({ path: `${shots}/editor-after-drag.png` })
    // The view is centred on this symmetric plate, so the tip along -x went from 353.2 mm to
    // 1.6 x 353.2 = 565.1 mm out: the width becomes 353.2 + 565.1 = 918.3 mm, 1.3 times as wide
    // (within 3 % for the pixel grid of the drag).
    const widthAfter = inches(await text(page, 'metric-width'))
    expect(widthAfter / (tipRadius * 2.6)).toBeGreaterThan(0.97)
    expect(widthAfter / (tipRadius * 2.6)).toBeLessThan(1.03)
    // A longer root is more wood: the net area grew.
    expect(squareFeet(await text(page, 'metric-area'))).toBeGreaterThan(squareFeet(areaBefore))

    const tube = page.getByRole('textbox', { name: 'Tube diameter', exact: true })
    await tube.fill('17-1/2"')
    await tube.press('Enter')
    await expect.poll(() => tube.inputValue()).toBe('17-1/2"')

    await page.getByLabel('Note for this revision').fill('Longer root toward the bench, 17-1/2 in tube')
    await page.getByTestId('save').click()
    const history = page.getByTestId('revisions')
    await expect.poll(() => history.locator('li').first().textContent()).toContain('Longer root toward the bench')

    const items = history.locator('li')
    await items.nth(0).getByRole('checkbox').check()
    await items.nth(1).getByRole('checkbox').check()
    await page.getByTestId('compare').click()
    const table = page.getByTestId('compare-table')
    await table.waitFor()
    expect(await table.textContent()).toContain('Tube diameter')
    expect(await table.textContent()).toContain('Lobes moved by hand')
    await page.screenshot({ path: `${shots}/editor-compare.png` })
    await page.getByRole('button', { name: 'End compare' }).click()

    await page.getByTestId('plate-canvas').focus()
    await page.keyboard.press('Control+z')
    await expect.poll(() => tube.inputValue()).not.toBe('17-1/2"')
    await page.keyboard.press('Control+Shift+z')
    await expect.poll(() => tube.inputValue()).toBe('17-1/2"')
    await page.close()
  })

  it('a viewer gets the same drawing with no handles and no save', async () => {
    const page = await signInAndOpen('viewer@rootplate.test')
    await page.getByTestId('metrics').waitFor()
    expect(await page.locator('[data-handle]').count()).toBe(0)
    expect(await page.getByTestId('save').count()).toBe(0)
    expect(await page.getByTestId('read-only-note').isVisible()).toBe(true)
    expect(await page.getByRole('textbox', { name: 'Tube diameter', exact: true }).getAttribute('readonly')).not.toBeNull()
    await page.screenshot({ path: `${shots}/editor-viewer.png` })
    await page.close()
  })
})

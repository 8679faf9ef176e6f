import { mkdirSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium } from './support/browser'

const shots = 'test-results/e2e'
let browser: Browser

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
})
afterAll(() => browser?.close())

async function signInAndOpen(email: string, design: string): Promise<Page> {
  const base = inject('baseUrl')
  const page = await browser.newPage({ viewport: { width: 1280, height: 800 } })
  await page.goto(`${base}/login`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill('rootplate-demo')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(`${base}/`)
  await page.getByRole('link', { name: design }).click()
  await page.getByTestId('plate-canvas').waitFor()
  await page.getByText('Preparing the drawing…').waitFor({ state: 'detached' })
  return page
}

const text = (page: Page, id: string) => page.getByTestId(id).textContent()

describe('the editor in Chromium', () => {
  it('a designer drags a lobe, types a tube size, saves, compares and undoes', async () => {
    const page = await signInAndOpen('designer@rootplate.test', 'Old king beech')
    const tip = page.locator('[data-handle="lobe-2"]')
    await tip.waitFor()
    const widthBefore = await text(page, 'metric-width')
    const areaBefore = await text(page, 'metric-area')
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
    expect(widthBefore).toBeTruthy()

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
    const page = await signInAndOpen('viewer@rootplate.test', 'Hollow oak')
    await page.getByTestId('metrics').waitFor()
    expect(await page.locator('[data-handle]').count()).toBe(0)
    expect(await page.getByTestId('save').count()).toBe(0)
    expect(await page.getByTestId('read-only-note').isVisible()).toBe(true)
    expect(await page.getByRole('textbox', { name: 'Tube diameter', exact: true }).getAttribute('readonly')).not.toBeNull()
    await page.screenshot({ path: `${shots}/editor-viewer.png` })
    await page.close()
  })
})

import { mkdirSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'

const shots = 'test-results/e2e'
let browser: Browser

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
})
afterAll(() => browser?.close())
// Any console error, uncaught exception or failed request fails the test that caused it.
afterEach(() => { expect(takePageProblems()).toEqual([]) })

describe('in Chromium', () => {
  it('the designer signs in through the form and opens a design', async () => {
    const base = inject('baseUrl')
    const page = watchPage(await browser.newPage({ viewport: { width: 1280, height: 800 } }))
    await page.goto(`${base}/`)
    await page.waitForURL(/\/login/)
    await page.getByLabel('E-mail').fill('designer@rootplate.test')
    await page.getByLabel('Password').fill('rootplate-demo')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/`)
    await page.getByRole('heading', { name: 'Beneath the Rowan Wood' }).waitFor()
    await expect(page.getByTestId('new-design').isVisible()).resolves.toBe(true)
    await page.screenshot({ path: `${shots}/home-designer.png` })

    await page.getByRole('link', { name: 'Hollow oak' }).click()
    await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/)
    await expect(page.getByTestId('design-name').textContent()).resolves.toBe('Hollow oak')
    const history = page.getByTestId('revisions')
    await history.waitFor()
    expect(await history.locator('li').count()).toBeGreaterThanOrEqual(3)
    await page.screenshot({ path: `${shots}/design-designer.png`, fullPage: true })
    await page.close()
  })

  it('the designer starts a new design from a starting shape on a measured tube', async () => {
    const base = inject('baseUrl')
    const page = watchPage(await browser.newPage({ viewport: { width: 1280, height: 800 } }))
    await page.goto(`${base}/login`)
    await page.getByLabel('E-mail').fill('designer@rootplate.test')
    await page.getByLabel('Password').fill('rootplate-demo')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/`)
    await page.getByTestId('new-design').click()
    await page.getByLabel('Name').fill('Willow stump')
    await page.getByLabel('Starting shape').selectOption({ index: 1 })
    const tube = page.getByLabel(/Measured tube diameter/)
    await tube.fill('a big one')
    await page.getByRole('button', { name: 'Create design' }).click()
    await expect(page.getByText(/Cannot read "a big one"/).isVisible()).resolves.toBe(true)
    await tube.fill('14-1/2"')
    await page.getByRole('button', { name: 'Create design' }).click()
    await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/)
    await expect(page.getByTestId('design-name').textContent()).resolves.toBe('Willow stump')
    // 14-1/2 in = 368.3 mm (1 in = 25.4 mm, NIST SP 811), shown back in shop notation.
    await expect.poll(() => page.getByRole('textbox', { name: 'Tube diameter', exact: true }).inputValue()).toBe('14-1/2"')
    await page.close()
  })

  it('a wrong password shows a clear message on the form', async () => {
    const page = watchPage(await browser.newPage(), [/answer 401: POST .*\/api\/auth\/login/, /status of 401/])
    await page.goto(`${inject('baseUrl')}/login`)
    await page.getByLabel('E-mail').fill('viewer@rootplate.test')
    await page.getByLabel('Password').fill('not the password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/do not match/)
    await page.close()
  })

  it('a viewer is not offered the new-design button', async () => {
    const page = watchPage(await browser.newPage())
    await page.goto(`${inject('baseUrl')}/login`)
    await page.getByLabel('E-mail').fill('viewer@rootplate.test')
    await page.getByLabel('Password').fill('rootplate-demo')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${inject('baseUrl')}/`)
    await page.getByRole('heading', { name: 'Beneath the Rowan Wood' }).waitFor()
    expect(await page.getByTestId('new-design').count()).toBe(0)
    await page.screenshot({ path: `${shots}/home-viewer.png` })
    await page.close()
  })
})

// The stability panel in Chromium: change the load and the counterweight and
// watch the tipping angle and the side elevation follow. Any console error,
// page error, failed request or error answer fails the test. The design is this test's own.
import { mkdirSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, demo, signIn } from './support/api'
import { signInThroughForm } from './support/sign-in'

const IN = 25.4
const shots = 'test-results/e2e'
let browser: Browser
let designId = ''

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  const cookie = await signIn(demo.designer)
  const created = await api('/api/designs', {
    method: 'POST',
    cookie,
    body: {
      name: 'Stability panel check trunk',
      params: {
        tubeDiameter: 30 * IN, casterCount: 4, casterOffset: 11 * IN,
        access: { diameter: 5 * IN, offset: 7 * IN },
        unit: { load: { weight: 20, height: 60 * IN } },
      },
    },
  })
  expect(created.status).toBe(201)
  designId = created.body.id
})
afterAll(() => browser?.close())
// Console errors, uncaught exceptions, failed requests and error answers fail the test (tests/e2e/support/browser.ts).
afterEach(() => { expect(takePageProblems()).toEqual([]) })

async function open(): Promise<{ page: Page }> {
  const base = inject('baseUrl')
  const page = watchPage(await browser.newPage({ viewport: { width: 1400, height: 1000 } }))
  await signInThroughForm(page, demo.designer)
  await page.goto(`${base}/designs/${designId}`)
  await page.getByTestId('stability-panel').waitFor()
  return { page }
}

const angleOf = async (page: Page) => Number((await page.getByTestId('stability-tipping-angle').textContent())!.replace(/[^\d.-]/g, ''))
const comY = async (page: Page) => Number(await page.getByTestId('side-elevation').getAttribute('data-com-y'))

describe('stability in the editor', () => {
  it('a heavier, higher load lowers the tipping angle; counterweight blocks raise it; the side elevation follows', async () => {
    const { page } = await open()
    const angle0 = await angleOf(page)
    const com0 = await comY(page)
    expect(angle0).toBeGreaterThan(0)

    await page.getByRole('button', { name: 'What stands on the plate' }).click()
    const load = page.getByLabel('Load weight')
    await load.fill('90 kg')
    await load.press('Enter')
    await expect.poll(() => angleOf(page)).toBeLessThan(angle0)
    const angle1 = await angleOf(page)
    // The combined centre of mass rises towards the load's: higher on screen, a smaller y.
    expect(await comY(page)).toBeLessThan(com0)
    const com1 = await comY(page)

    const blocks = page.getByRole('textbox', { name: 'Blocks', exact: true })
    await blocks.fill('8')
    await blocks.press('Enter')
    await expect.poll(() => angleOf(page)).toBeGreaterThan(angle1)
    expect(await comY(page)).toBeGreaterThan(com1)
    // The elevation draws the same lean the figures give.
    expect(Number(await page.getByTestId('side-elevation').getAttribute('data-angle'))).toBeCloseTo(await angleOf(page), 1)
    expect(await page.getByTestId('stability-panel').textContent()).toContain('qualified person')

    await page.getByTestId('stability-panel').screenshot({ path: `${shots}/stability-panel.png` })
    await page.screenshot({ path: `${shots}/stability-editor.png` })
    await page.close()
  })
})

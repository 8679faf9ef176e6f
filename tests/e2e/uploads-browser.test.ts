import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { makePng } from './support/files'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser
const stamp = Date.now().toString(36)

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
})
afterAll(() => browser?.close())
// Console errors, uncaught exceptions, failed requests and error answers fail the test (tests/e2e/support/browser.ts).
afterEach(() => { expect(takePageProblems()).toEqual([]) })

/** A page signed in as the given demo member, watched for console errors, page errors, failed requests and error answers. */
async function signedIn(email: string): Promise<{ page: Page }> {
  const page = watchPage(await browser.newPage({ viewport: { width: 1440, height: 900 } }))
  await signInThroughForm(page, email)
  return { page }
}

async function centre(page: Page, selector: string) {
  const box = await page.locator(selector).boundingBox()
  if (!box) throw new Error(`${selector} is not on screen`)
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 }
}

describe('reference image under the plate, in Chromium', () => {
  it('uploads a photo, scales it by two points to a known distance, and it matches the plate\'s scale', async () => {
    const base = inject('baseUrl')
    const { page } = await signedIn('designer@rootplate.test')
    // Our own design (default params: three casters), so the shared demo stays untouched.
    const created = await page.request.post(`${base}/api/designs`, { data: { name: `Traced stump ${stamp}`, params: {} } })
    expect(created.status()).toBe(201)
    const designId = (await created.json()).id as string
    const params = (await (await page.request.get(`${base}/api/designs/${designId}`)).json()).latest.params
    expect(params.casterCount).toBe(3)

    // A sketch 800 x 500 px with two dots 400 px apart, said to be 20 in apart.
    const dir = mkdtempSync(join(tmpdir(), 'ref-'))
    const file = join(dir, 'set-sketch.png')
    writeFileSync(file, makePng(800, 500, [{ x: 200, y: 250, r: 7 }, { x: 600, y: 250, r: 7 }]))

    await page.goto(`${base}/designs/${designId}`)
    await page.getByTestId('plate-canvas').waitFor()
    await page.getByTestId('attach-input').setInputFiles(file)
    await page.getByTestId('place-set-sketch.png').click()
    const img = page.getByTestId('reference-image')
    await img.waitFor()
    await page.getByTestId('reference-overlay').waitFor()

    const rect = async () => (await img.boundingBox())!
    let r = await rect()
    await page.mouse.click(r.x + r.width * 200 / 800, r.y + r.height * 250 / 500)
    await page.getByTestId('calibration-mark-1').waitFor()
    await page.mouse.click(r.x + r.width * 600 / 800, r.y + r.height * 250 / 500)
    await page.getByTestId('calibration-mark-2').waitFor()
    await page.getByTestId('reference-distance').fill('20"')
    await page.getByRole('button', { name: 'Apply' }).click()
    await page.getByTestId('reference-overlay').waitFor({ state: 'detached' })

    // 20 in = 508 mm (1 in = 25.4 mm, NIST SP 811) over 400 px: 1.27 mm per pixel.
    await expect.poll(async () => (await (await page.request.get(`${base}/api/designs/${designId}/reference`)).json())?.mmPerPixel, { timeout: 20_000 }).toBeCloseTo(1.27, 6)

    // On screen, the dots now stand as far apart as 508 mm of plate: compare with two caster
    // pockets, which sit on a circle of radius casterOffset, 120 degrees apart for three casters,
    // so a chord of 2 r sin 60 deg = r * sqrt(3) (plane geometry).
    r = await rect()
    const dotsOnScreen = r.width * 400 / 800
    const a = await centre(page, '[data-handle="pocket-0"]')
    const b = await centre(page, '[data-handle="pocket-1"]')
    const chordOnScreen = Math.hypot(b.x - a.x, b.y - a.y)
    const chordMm = params.casterOffset * Math.sqrt(3)
    expect(dotsOnScreen / chordOnScreen).toBeCloseTo(508 / chordMm, 2)
    await page.screenshot({ path: `${shots}/reference-calibrated.png` })

    // Turn by typing; move with the keyboard (Shift+arrow: 10 x 1/16 in = 15.875 mm).
    const before = (await (await page.request.get(`${base}/api/designs/${designId}/reference`)).json())
    await page.getByLabel('Turn in degrees').fill('30')
    await page.getByLabel('Turn in degrees').press('Enter')
    await page.getByTestId('reference-move').click()
    await page.getByTestId('reference-overlay').press('Shift+ArrowRight')
    await page.getByTestId('reference-move').click()
    await expect.poll(async () => (await (await page.request.get(`${base}/api/designs/${designId}/reference`)).json())?.rotation, { timeout: 20_000 }).toBe(30)
    const placement = async () => (await (await page.request.get(`${base}/api/designs/${designId}/reference`)).json())
    await expect.poll(async () => (await placement()).x - before.x, { timeout: 20_000 }).toBeCloseTo(15.875, 6)
    const after = await placement()
    const step = page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'in' })
    expect(await step.getAttribute('aria-pressed')).toBe('true')
    expect(after.x - before.x).toBeCloseTo(15.875, 6)
    expect(after.y).toBeCloseTo(before.y, 6)
    expect(after.mmPerPixel).toBeCloseTo(1.27, 6)
    await page.getByLabel(/Opacity/).fill('80')
    await page.getByLabel(/Opacity/).dispatchEvent('change')
    await expect.poll(async () => (await (await page.request.get(`${base}/api/designs/${designId}/reference`)).json())?.opacity, { timeout: 20_000 }).toBeCloseTo(0.8, 6)

    // Kept with the design: still there after a reload, and no revision was made.
    await page.reload()
    await img.waitFor()
    expect(Number(await img.evaluate(e => getComputedStyle(e).opacity))).toBeCloseTo(0.8, 2)
    const revisions = await (await page.request.get(`${base}/api/designs/${designId}/revisions`)).json()
    expect(revisions).toHaveLength(1)
    await page.screenshot({ path: `${shots}/reference-turned.png` })
    await page.close()
  })
})

describe('the register of units, in Chromium', () => {
  it('a builder records a unit, moves it through two stages, lends it and takes it back', async () => {
    const base = inject('baseUrl')
    const { page } = await signedIn('builder@rootplate.test')
    await page.getByRole('link', { name: 'Units' }).click()
    await page.waitForURL(`${base}/units`)
    await page.getByTestId('new-unit').click()
    await page.getByLabel('Label (written on it)').fill(`OAK-${stamp}`)
    await page.getByLabel('Design', { exact: true }).selectOption({ index: 1 })
    await page.getByLabel('Location').fill('Bay 2')
    await page.getByRole('button', { name: 'Record it' }).click()
    await page.waitForURL(/\/units\/[0-9a-f-]{36}$/)
    await expect(page.getByTestId('unit-label').textContent()).resolves.toBe(`OAK-${stamp}`)
    await expect.poll(() => page.locator('h1 + [data-testid="unit-status"]').textContent(), { timeout: 20_000 }).toBe('Cut')

    await page.getByTestId('next-stage').click()
    await expect.poll(() => page.locator('h1 + [data-testid="unit-status"]').textContent(), { timeout: 20_000 }).toBe('Laminated')
    await page.getByTestId('next-stage').click()
    await expect.poll(() => page.locator('h1 + [data-testid="unit-status"]').textContent(), { timeout: 20_000 }).toBe('Hardware fitted')

    const due = new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10)
    await page.getByLabel('Borrower').fill('Millbrook High drama')
    await page.getByLabel('Due back').fill(due)
    await page.getByRole('button', { name: 'Lend it' }).click()
    await expect.poll(() => page.locator('h1 + [data-testid="unit-status"]').textContent(), { timeout: 20_000 }).toBe('On loan')
    await expect(page.getByTestId('loan-box').getByText('Millbrook High drama').first().isVisible()).resolves.toBe(true)
    await page.screenshot({ path: `${shots}/unit-on-loan.png`, fullPage: true })
    await page.getByRole('button', { name: 'Record the return' }).click()
    await expect.poll(() => page.locator('h1 + [data-testid="unit-status"]').textContent(), { timeout: 20_000 }).toBe('In stock')
    await expect.poll(() => page.getByTestId('unit-history').locator('li').count(), { timeout: 20_000 }).toBe(5)
    await page.screenshot({ path: `${shots}/unit-returned.png`, fullPage: true })

    await page.goto(`${base}/units?q=${stamp}`)
    await page.getByTestId('unit-table').waitFor()
    expect(await page.getByTestId('unit-table').locator('tbody tr').count()).toBe(1)
    await page.screenshot({ path: `${shots}/units-list.png` })
    await page.close()
  })

  it('the home page lists a loan past its due date', async () => {
    const base = inject('baseUrl')
    const { page } = await signedIn('lead@rootplate.test')
    const made = await page.request.post(`${base}/api/units`, { data: { kind: 'pattern', label: `LATE-${stamp}` } })
    const id = (await made.json()).id
    const day = (d: number) => new Date(Date.now() + d * 86_400_000).toISOString().slice(0, 10)
    expect((await page.request.post(`${base}/api/units/${id}/loans`, { data: { borrower: 'Riverside Players', outOn: day(-30), dueOn: day(-3) } })).status()).toBe(201)
    await page.goto(`${base}/`)
    const box = page.getByTestId('overdue-loans')
    await box.waitFor()
    await expect(box.getByText(`LATE-${stamp}`).isVisible()).resolves.toBe(true)
    await page.screenshot({ path: `${shots}/home-overdue.png` })
    await page.close()
  })
})

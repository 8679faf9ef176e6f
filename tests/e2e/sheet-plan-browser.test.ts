// The sheet plan page in Chromium: open it from a show, plan 2 + 2 + 2 of the
// three designs of this test's own shop, see the layouts, change a count and see the answer follow,
// download the PDF and a sheet's DXF and read them back (pdf-lib,
// dxf-parser). Any console error, page error, failed request or error answer fails the test. Screenshots
// go to test-results/e2e/plan-*.png.
import { mkdirSync, readFileSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser } from 'playwright-core'
import { PDFDocument } from 'pdf-lib'
import DxfParser from 'dxf-parser'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { planShop } from './support/plan'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser
let shop: Awaited<ReturnType<typeof planShop>>

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  shop = await planShop('Millbrook Stage Crew (sheet plan page)')
  browser = await launchChromium()
})
afterAll(() => browser?.close())
// Console errors, uncaught exceptions, failed requests and error answers fail the test (tests/e2e/support/browser.ts).
afterEach(() => { expect(takePageProblems()).toEqual([]) })

describe('the sheet plan page', () => {
  it('plans 2 + 2 + 2, follows a changed count, and downloads the PDF and a sheet\'s DXF', async () => {
    const base = inject('baseUrl')
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 }, acceptDownloads: true })
    const page = watchPage(await context.newPage())

    await signInThroughForm(page, shop.email, shop.password)
    await page.getByRole('link', { name: 'Sheet plan' }).click()
    await page.waitForURL(`${base}/plan`)
    await expect.poll(() => page.getByText('Give a count for at least one design').isVisible()).toBe(true)

    // Opened from the show: its three designs start at one plate each, the design outside it at none.
    await page.goto(`${base}/plan?show=${shop.showId}`)
    await expect.poll(() => page.getByLabel('Plates of Boulder small').inputValue()).toBe('1')
    expect(await page.getByLabel('Plates of Boulder large').inputValue()).toBe('1')
    expect(await page.getByLabel('Plates of Lone stump').count()).toBe(0)
    await expect.poll(() => page.getByTestId('plan-plates').textContent(), { timeout: 30_000 }).toBe('3')

    for (const size of ['small', 'medium', 'large']) await page.getByLabel(`Plates of Boulder ${size}`).fill('2')
    await page.getByTestId('plan-busy').waitFor({ state: 'visible' }).catch(() => {})
    await expect.poll(() => page.getByTestId('plan-plates').textContent(), { timeout: 30_000 }).toBe('6')
    await expect.poll(() => page.getByTestId('plan-busy').count(), { timeout: 30_000 }).toBe(0)
    expect(await page.getByTestId('plan-part').count()).toBe(6)
    const buy = Number(await page.getByTestId('plan-sheets-to-buy').textContent())
    const panels = Number(await page.getByTestId('plan-panels').textContent())
    // Glued first: each panel is two sheets (two-layer plates).
    expect(buy).toBe(panels * 2)
    expect(await page.getByTestId('plan-figures').textContent()).toContain('267 ft² per gallon')
    await page.screenshot({ path: `${shots}/plan-2-2-2.png`, fullPage: true })

    // One more large: seven plates, seven parts drawn.
    await page.getByLabel('Plates of Boulder large').fill('3')
    await expect.poll(() => page.getByTestId('plan-plates').textContent(), { timeout: 30_000 }).toBe('7')
    await expect.poll(() => page.getByTestId('plan-busy').count(), { timeout: 30_000 }).toBe(0)
    expect(await page.getByTestId('plan-part').count()).toBe(7)

    // Cut first: every layer of every plate is a part.
    await page.getByLabel(/Cut first/).check()
    await expect.poll(() => page.getByTestId('plan-parts').textContent(), { timeout: 30_000 }).toBe('14')
    await expect.poll(() => page.getByTestId('plan-busy').count(), { timeout: 30_000 }).toBe(0)
    expect(await page.getByTestId('plan-part').count()).toBe(14)
    await page.screenshot({ path: `${shots}/plan-cut-first.png`, fullPage: true })
    const sheets = await page.locator('[data-testid^="plan-sheet-"]').count()

    const [pdfDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('plan-pdf').click()])
    expect(pdfDownload.suggestedFilename()).toBe('sheet-plan-layers.pdf')
    const pdf = await PDFDocument.load(readFileSync((await pdfDownload.path())!))
    expect(pdf.getPageCount()).toBe(sheets)

    const [dxfDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('plan-dxf-0').click()])
    expect(dxfDownload.suggestedFilename()).toBe('sheet-plan-layers-1.dxf')
    const dxf = new DxfParser().parseSync(readFileSync((await dxfDownload.path())!, 'utf8'))!
    const outsides = dxf.entities.filter((e: any) => e.layer === 'RP-OUTSIDE-CUT')
    expect(outsides.length).toBe(await page.getByTestId('plan-sheet-0').getByTestId('plan-part').count())

    await context.close()
  })
})

// Shows and size families in Chromium, as a technical director works: make a
// medium and a large from a small, change the small, look at the preview and
// bring the sizes up to date, put a design in a show, archive a design and find
// it again. Its shop, lead and designs are its own. Screenshots go to
// test-results/e2e/ (looked at while writing this test).
import { mkdirSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, freshAddress, signIn } from './support/api'
import { createOwnShop } from './support/fixtures'
import { hasher } from '../../scripts/seed'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
const INCH = 25.4
let browser: Browser
let lead = { email: '', password: '' }
let cookie = ''
const tag = crypto.randomUUID().slice(0, 6)
// A small rooted trunk on a 14 in tube (our own numbers): five lobes, three casters.
const small = { tubeDiameter: 14 * INCH, casterCount: 3, casterOffset: 109.5, rotation: 0, lobes: { count: 5, reach: 110, width: 120, roundness: 0.5, irregularity: 0.3, seed: 77, valley: 18 } }

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  const own = await createOwnShop(inject('databaseUrl'), p => hasher.make(p), ['lead'])
  lead = own.lead
  cookie = await signIn(lead.email, lead.password)
})
afterAll(() => browser?.close())
afterEach(() => { expect(takePageProblems()).toEqual([]) })

async function signedIn(): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 }, extraHTTPHeaders: { 'x-forwarded-for': freshAddress() } })
  const page = watchPage(await context.newPage())
  await signInThroughForm(page, lead.email, lead.password)
  return page
}

describe('a size family in the browser', () => {
  it('makes a medium and a large from a small, brings them up to date after the preview, and finds an archived one again', async () => {
    const base = inject('baseUrl')
    const created = await api('/api/designs', { method: 'POST', cookie, body: { name: `Hollow oak ${tag}`, sizeLabel: 'Small', params: small } })
    expect(created.status).toBe(201)
    const smallId = created.body.id as string
    const page = await signedIn()

    // From the small's page: make two sizes.
    await page.goto(`${base}/designs/${smallId}`)
    await page.getByTestId('family-panel').getByTestId('make-sizes').click()
    await page.waitForURL(/\/families\/.*make=1/)
    await page.getByTestId('size-label-0').fill('Medium')
    await page.getByTestId('size-tube-0').fill('18')
    await page.getByTestId('size-label-1').fill('Large')
    await page.getByTestId('size-tube-1').fill('24')
    await page.getByTestId('size-label-2').fill('')
    await page.getByTestId('make-sizes-submit').click()
    const grid = page.getByTestId('family-grid')
    await grid.locator('article').nth(2).waitFor()
    expect(await grid.locator('article').count()).toBe(3)
    await expect.poll(() => grid.locator('article').nth(1).textContent()).toContain('Medium')
    expect(await grid.locator('article').nth(2).textContent()).toContain('Large')
    await page.screenshot({ path: `${shots}/family-view.png`, fullPage: true })

    // The sizes are designs of their own with their hardware kept (read back from the server).
    const family = (await api(`/api/designs/${smallId}/family`, { cookie })).body
    const [medium, large] = family.sizes as { id: string; latest: { params: { tubeDiameter: number; pocketDiameter: number } } }[]
    expect(medium!.latest.params.tubeDiameter).toBeCloseTo(18 * INCH, 3)
    expect(large!.latest.params.tubeDiameter).toBeCloseTo(24 * INCH, 3)
    expect(large!.latest.params.pocketDiameter).toBe(family.parent.latest.params.pocketDiameter)

    // Change the small (a seventh root), as its designer would from the editor.
    const changed = { ...family.parent.latest.params, lobes: { ...family.parent.latest.params.lobes, count: 7 } }
    expect((await api(`/api/designs/${smallId}/revisions`, { method: 'POST', cookie, body: { params: changed, note: 'seven roots', basedOn: 1 } })).status).toBe(201)
    await page.goto(`${base}/designs/${smallId}`)
    await expect.poll(() => page.getByTestId('sizes-behind').textContent()).toContain('2 sizes follow an older revision')
    await page.screenshot({ path: `${shots}/design-sizes-behind.png`, fullPage: true })

    // The preview: each size as saved (dashed) over what it becomes, both accepted.
    await page.getByTestId('bring-up-to-date').click()
    const preview = page.getByTestId('update-preview')
    await preview.waitFor()
    expect(await preview.locator('article').count()).toBe(2)
    expect(await preview.getByTestId('sketch-ghost').count()).toBe(2)
    expect(await preview.getByRole('checkbox', { name: 'Save this size' }).evaluateAll(els => els.map(e => (e as HTMLInputElement).checked))).toEqual([true, true])
    await preview.screenshot({ path: `${shots}/family-update-preview.png` })
    await page.getByTestId('save-updates').click()
    await expect.poll(() => page.getByTestId('update-saved').textContent()).toContain('2 sizes were brought up to date with r2')
    expect(await page.getByTestId('size-behind').count()).toBe(0)
    for (const s of [medium!, large!]) {
      const got = (await api(`/api/designs/${s.id}`, { cookie })).body
      expect(got.latest.number).toBe(2)
      expect(got.latest.note).toBe(`Brought up to date with Hollow oak ${tag} r2`)
      expect(got.latest.params.lobes.count).toBe(7)
      expect(got.latest.params.tubeDiameter).toBe(s.latest.params.tubeDiameter)
    }

    // A show for the family, and the large put in it from its page.
    await page.goto(`${base}/shows`)
    await page.getByTestId('new-show').click()
    await page.getByTestId('show-name').fill(`Wood at Night ${tag}`)
    await page.getByTestId('show-save').click()
    await page.getByRole('link', { name: `Wood at Night ${tag}` }).waitFor()
    await page.goto(`${base}/designs/${large!.id}`)
    const details = page.getByTestId('design-details')
    await details.getByTestId('dd-edit').click()
    await details.getByTestId('dd-name').fill(`Hollow oak ${tag} big`)
    await details.getByTestId('dd-show').selectOption({ label: `Wood at Night ${tag}` })
    await details.getByTestId('dd-save').click()
    await expect.poll(() => page.getByTestId('design-name').textContent()).toBe(`Hollow oak ${tag} big`)
    // The size shown is the label and the tube of the latest revision.
    expect(await page.getByTestId('design-size').textContent()).toMatch(/Large · 24(")? tube|Large · 24 in tube/)
    await details.getByRole('link', { name: `Wood at Night ${tag}` }).click()
    await page.getByTestId('show-title').waitFor()
    expect(await page.getByTestId('total-plates').textContent()).toContain('1 plate')
    await page.getByTestId(`quantity-${large!.id}`).fill('2')
    await page.getByTestId(`quantity-${large!.id}`).press('Enter')
    await expect.poll(() => page.getByTestId('total-plates').textContent()).toContain('2 plates')
    // Sheets and glue follow the count: glued into panels first, a two-layer plate takes one
    // sheet per layer of every panel (sheets = panels x 2, by the workflow's own definition).
    const sheets = page.getByTestId('show-sheets')
    await sheets.getByTestId('plan-panels').waitFor()
    await expect.poll(() => sheets.getByTestId('show-sheets-summary').textContent()).not.toContain('updating')
    const panels = Number(await sheets.getByTestId('plan-panels').textContent())
    expect(panels).toBeGreaterThanOrEqual(1)
    expect(Number(await sheets.getByTestId('plan-sheets-to-buy').textContent())).toBe(panels * 2)
    await page.waitForLoadState('networkidle')
    await page.screenshot({ path: `${shots}/show-page.png`, fullPage: true })

    // Archive the medium from its page; it leaves the list and is found again among the archived.
    await page.goto(`${base}/designs/${medium!.id}`)
    await page.getByTestId('dd-archive').click()
    await page.getByTestId('dd-archived').waitFor()
    await page.goto(`${base}/`)
    await page.getByTestId('design-search').fill(`oak ${tag}`)
    await page.waitForURL(/q=oak/)
    await expect.poll(() => page.locator('tbody tr').count()).toBe(2)
    expect(await page.getByTestId(`design-row-${medium!.id}`).count()).toBe(0)
    await page.getByTestId('design-archived-filter').check()
    await page.getByTestId(`design-row-${medium!.id}`).waitFor()
    expect(await page.locator('tbody tr').count()).toBe(1)
    await page.screenshot({ path: `${shots}/archived-designs.png`, fullPage: true })
    await page.getByTestId(`design-row-${medium!.id}`).getByRole('button', { name: 'Restore' }).click()
    await page.getByTestId('no-match').waitFor()
    await page.getByTestId('design-archived-filter').uncheck()
    await page.getByTestId(`design-row-${medium!.id}`).waitFor()
    await page.context().close()
  }, 120_000)
})

// Problems in view and in the reader's units, in Chromium, on a plate of this
// file's own: six casters at a 4 in offset, so the pockets run into each other.
// A designer and a builder of a shop of its own; any console error, failed
// request or page error fails the test.
//
// Hand figures (1 in = 25.4 mm, NIST SP 811): pockets 4-1/4 in with 1/2 in
// rabbets are 5-1/4 in across; six on a 4 in radius stand 2 x 4 x sin 30 deg =
// 4 in apart, so they overlap by 1-1/4 in, and clear the 3/4 in minimum wood
// from a 6 in offset on.
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import DxfParser from 'dxf-parser'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, freshAddress, signIn } from './support/api'
import { createOwnShop } from './support/fixtures'
import { hasher } from '../../scripts/seed'
import { signInThroughForm } from './support/sign-in'

const IN = 25.4
const shots = 'test-results/e2e'
let browser: Browser
let people: Record<'designer' | 'builder', { email: string; password: string }>
let designId = ''
let revisionId = ''

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  people = await createOwnShop(inject('databaseUrl'), p => hasher.make(p), ['designer', 'builder'])
  const cookie = await signIn(people.designer.email, people.designer.password)
  const created = await api('/api/designs', { method: 'POST', cookie, body: { name: 'Crowded pockets stump', params: { casterCount: 6, casterOffset: 4 * IN } } })
  expect(created.status).toBe(201)
  designId = created.body.id
  revisionId = created.body.revision.id
})
afterAll(() => browser?.close())
afterEach(() => { expect(takePageProblems()).toEqual([]) })

async function open(who: 'designer' | 'builder', units: 'in' | 'mm', viewport = { width: 1440, height: 900 }): Promise<{ context: BrowserContext; page: Page }> {
  const cookie = await signIn(people[who].email, people[who].password)
  expect((await api('/api/me/preferences', { method: 'PATCH', cookie, body: { units } })).status).toBe(200)
  const context = await browser.newContext({ viewport, extraHTTPHeaders: { 'x-forwarded-for': freshAddress() } })
  const page = await context.newPage()
  watchPage(page)
  const base = inject('baseUrl')
  await signInThroughForm(page, people[who].email, people[who].password)
  await page.goto(`${base}/designs/${designId}`)
  await page.getByTestId('problems-summary').waitFor()
  return { context, page }
}

/** The Checks card's list (the summary's pop-over holds a copy). */
const checksList = (page: Page) => page.getByRole('heading', { name: 'Checks', exact: true }).locator('xpath=..').getByTestId('findings')

async function inView(page: Page, testId: string): Promise<boolean> {
  return page.getByTestId(testId).evaluate((el) => {
    const r = el.getBoundingClientRect()
    return r.height > 0 && r.top >= 0 && r.bottom <= window.innerHeight
  })
}

describe('problems in view (issue 18 item 1)', () => {
  it('the summary beside Save counts the rows the list shows, stays in view, and picks a problem on the drawing', async () => {
    const { context, page } = await open('designer', 'in')
    const count = page.getByTestId('problems-count')
    const errors = Number(await count.getAttribute('data-errors'))
    const warnings = Number(await count.getAttribute('data-warnings'))
    const list = checksList(page)
    // The same rows: errors and checks named apart, as many of each as the list has.
    expect(errors).toBe(await list.locator('li[data-severity="error"]').count())
    expect(warnings).toBe(await list.locator('li[data-severity="warning"]').count())
    expect(errors).toBeGreaterThan(0)
    await expect(count.textContent()).resolves.toContain(`${errors} error${errors === 1 ? '' : 's'}`)
    // One row for the six pockets, not six pair rows.
    await expect(list.locator('li[data-code="holes-overlap"]').count()).resolves.toBeLessThanOrEqual(2)
    await page.screenshot({ path: `${shots}/problems-editor-1440.png` })

    // In view at the top, and still in view with the page scrolled to its foot.
    expect(await inView(page, 'problems-summary')).toBe(true)
    await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight))
    await page.waitForTimeout(100)
    expect(await inView(page, 'problems-summary')).toBe(true)

    // Picking a problem from the summary marks it picked in the list and brings the drawing into view.
    await count.click()
    const pop = page.locator('#problems-popover')
    await pop.getByRole('button').first().click()
    await expect.poll(() => list.getByRole('button', { pressed: true }).count()).toBe(1)
    expect(await page.getByRole('region', { name: 'Plate', exact: true }).evaluate((el) => {
      const r = el.getBoundingClientRect()
      return r.top < window.innerHeight && r.bottom > 0
    })).toBe(true)

    // Save says the same number of errors the summary shows.
    await page.getByLabel('Caster offset', { exact: true }).fill('4-1/16"')
    await page.getByLabel('Caster offset', { exact: true }).press('Enter')
    await page.getByTestId('save').click()
    const errorsNow = Number(await count.getAttribute('data-errors'))
    await expect(page.getByRole('form', { name: 'Save a revision' }).getByRole('alert').textContent()).resolves.toContain(`${errorsNow} error${errorsNow === 1 ? '' : 's'} remain`)
    // Closing while a chunk still loads would abort it (and rightly fail the watcher).
    await page.waitForLoadState('networkidle')
    await context.close()
  })

  it('stays in view on a tablet and a phone', async () => {
    for (const viewport of [{ width: 1024, height: 768 }, { width: 390, height: 844 }]) {
      const { context, page } = await open('designer', 'in', viewport)
      await page.screenshot({ path: `${shots}/problems-editor-${viewport.width}.png` })
      await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight))
      await page.waitForTimeout(100)
      expect(await inView(page, 'problems-summary')).toBe(true)
      // Closing while a chunk still loads would abort it (and rightly fail the watcher).
    await page.waitForLoadState('networkidle')
    await context.close()
    }
  })
})

describe('checks and field messages in the reader units (issue 18 item 2)', () => {
  it('with inches chosen nothing says mm; with millimetres chosen they do', async () => {
    const { context, page } = await open('designer', 'in')
    const list = checksList(page)
    // The value each row suggests arrives once the plate is still.
    await expect.poll(() => list.getByTestId('finding-fix').first().textContent()).toMatch(/"$/)
    const text = await list.textContent()
    expect(text).not.toMatch(/mm/)
    // The overlap by hand: 1-1/4 in; the fix: a 6 in offset.
    expect(text).toContain('1-1/4"')
    expect(text).toContain('Caster offset: use at least 6"')
    // A field message: an offset too small for the pocket to clear the centre hole (least 3-1/2 in by hand).
    const field = page.getByLabel('Caster offset', { exact: true })
    await field.fill('2"')
    await field.press('Enter')
    const message = page.locator('#param-casterOffset-msg')
    await expect(message.textContent()).resolves.toContain('3-1/2"')
    const panelMessages = await page.getByTestId('param-panel').locator('.field-error, [role="alert"]').allTextContents()
    expect(panelMessages.length).toBeGreaterThan(0)
    for (const m of panelMessages) expect(m).not.toMatch(/mm/)
    await page.screenshot({ path: `${shots}/problems-units-in.png` })

    // Millimetres: the same messages in mm (3-1/2 in = 88.9 mm, shown to the half millimetre).
    await page.getByRole('group', { name: 'Units' }).getByRole('button', { name: 'mm' }).click()
    await expect.poll(() => message.textContent()).toContain('89 mm')
    await page.getByLabel('Caster offset', { exact: true }).fill('101.6')
    await page.getByLabel('Caster offset', { exact: true }).press('Enter')
    await expect.poll(() => list.textContent()).toMatch(/32 mm/)
    expect(await list.textContent()).not.toContain('"')
    // Closing while a chunk still loads would abort it (and rightly fail the watcher).
    await page.waitForLoadState('networkidle')
    await context.close()
  })
})

describe('a revision saved with errors, as the builder sees it (issue 18 item 5)', () => {
  it('the export panel says so, and so do the template cover, the build sheet and the cut file notes', async () => {
    const { context, page } = await open('builder', 'in')
    const banner = page.getByTestId('export-saved-errors')
    await banner.waitFor()
    await expect(banner.textContent()).resolves.toMatch(/r1 was saved with \d+ errors?/)
    await banner.scrollIntoViewIfNeeded()
    await page.screenshot({ path: `${shots}/problems-export-panel.png` })
    // Closing while a chunk still loads would abort it (and rightly fail the watcher).
    await page.waitForLoadState('networkidle')
    await context.close()

    const cookie = await signIn(people.builder.email, people.builder.password)
    const base = inject('baseUrl')
    const get = async (path: string) => {
      const res = await fetch(`${base}${path}`, { headers: { cookie } })
      expect(res.status).toBe(200)
      return new Uint8Array(await res.arrayBuffer())
    }
    const pdfText = (bytes: Uint8Array, name: string) => {
      const file = `${shots}/${name}`
      writeFileSync(file, bytes)
      return execFileSync('/usr/bin/pdftotext', ['-f', '1', '-l', '1', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
    }
    expect(pdfText(await get(`/api/revisions/${revisionId}/template.pdf?paper=letter`), 'problems-template.pdf')).toContain('SAVED WITH ERRORS')
    expect(pdfText(await get(`/api/revisions/${revisionId}/build-sheet.pdf`), 'problems-build-sheet.pdf')).toContain('SAVED WITH ERRORS')
    const dxf = new DxfParser().parseSync(new TextDecoder().decode(await get(`/api/revisions/${revisionId}/cut.dxf?units=in`)))!
    const notes = dxf.entities.filter((e) => e.layer === 'RP-NOTES').map((e) => (e as unknown as { text: string }).text)
    expect(notes[0]).toMatch(/^SAVED WITH ERRORS/)
    expect(notes.join(' ')).toContain('Crowded pockets stump')
    expect(notes.join(' ')).toContain('revision 1')
  })
})

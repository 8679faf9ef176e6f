// In Chromium (issue 18 item 17): a builder opens a design, sees the files
// and a comment box first and no editing controls, leaves a comment on the
// revision; the designer opens the same design and reads it in the history.
// Fails on console errors. Screenshots go to test-results/e2e/ to be looked at.
import { mkdirSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, demo, signIn } from './support/api'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser
let designId = ''

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  const designer = await signIn(demo.designer)
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Comment browser linden', params: { tubeDiameter: 320 } } })
  expect(created.status).toBe(201)
  designId = created.body.id
})
afterAll(() => browser?.close())

async function openAs(email: string): Promise<Page> {
  const base = inject('baseUrl')
  const page = watchPage(await browser.newPage({ viewport: { width: 1440, height: 900 } }))
  await signInThroughForm(page, email)
  await page.goto(`${base}/designs/${designId}`)
  await page.getByTestId('design-name').waitFor()
  return page
}

describe('revision comments in Chromium', () => {
  it('a builder leaves a comment from the build card; the designer reads it in the history', async () => {
    const note = 'Pocket 3 lands on a knot in our sheet: can it move 1/2 in clockwise?'
    const builder = await openAs(demo.builder)
    // The seeded builder is Sam Lindqvist (server/database/seed/demo.ts).
    // What a builder needs, and none of the editing controls they cannot use.
    const card = builder.getByTestId('build-card')
    await card.waitFor()
    await expect(builder.getByRole('button', { name: 'Undo' }).count()).resolves.toBe(0)
    await expect(builder.getByTestId('read-only-note').isVisible()).resolves.toBe(true)
    await expect(builder.getByRole('heading', { name: 'Templates and cut files' }).isVisible()).resolves.toBe(true)
    // The build card and the files come first in the side column.
    const firstHeadings = await builder.locator('[data-testid="build-card"] ~ .card h2, [data-testid="build-card"] h2').allTextContents()
    expect(firstHeadings[0]).toMatch(/Building r1/)
    await card.getByLabel('Comment on r1').fill(note)
    await card.getByRole('button', { name: 'Post comment' }).click()
    await card.getByTestId('comment').filter({ hasText: note }).waitFor()
    await expect(card.getByLabel('Comment on r1').inputValue()).resolves.toBe('')
    await builder.screenshot({ path: `${shots}/comments-builder.png` })
    await builder.waitForLoadState('networkidle')
    await builder.close()

    const designer = await openAs(demo.designer)
    // The designer has no build card; the latest revision's comments are open in the history.
    await expect(designer.getByTestId('build-card').count()).resolves.toBe(0)
    const thread = designer.getByTestId('comments-r1')
    await thread.getByTestId('comment').filter({ hasText: note }).waitFor()
    await expect(thread.getByTestId('comment').filter({ hasText: note }).textContent()).resolves.toMatch(/Sam Lindqvist/)
    await thread.scrollIntoViewIfNeeded()
    await designer.screenshot({ path: `${shots}/comments-designer.png` })
    // The designer answers; both stay in order.
    await thread.getByLabel('Comment on r1').fill('Yes: moved in r2, look again.')
    await thread.getByRole('button', { name: 'Post comment' }).click()
    await thread.getByTestId('comment').nth(1).filter({ hasText: 'moved in r2' }).waitFor()
    await designer.waitForLoadState('networkidle')
    await designer.close()
    expect(takePageProblems()).toEqual([])
  })
})

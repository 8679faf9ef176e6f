// In Chromium (issue 25): the invitation page without a session offers both
// ways and says nothing of whether the address has an account; signed in as
// someone else it asks and changes nothing until the person signs out; signed
// in as the invited account it adds the shop. The lead's Mail page lists only
// what that lead sent, a page at a time. Screenshots at 1440 and 390 px go to
// test-results/e2e/ (join-*.png, mail-paged-*.png) to be looked at.
import { mkdirSync } from 'node:fs'
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api } from './support/api'
import { makeShop, signInAs, uniqueEmail } from './support/crew'
import { waitForMail } from './support/mail'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
})
afterAll(() => browser?.close())
afterEach(() => expect(takePageProblems()).toEqual([]))

async function pageAt(width: number, allow: RegExp[] = []): Promise<Page> {
  const context = await browser.newContext({ viewport: { width, height: 900 } })
  return watchPage(await context.newPage(), allow)
}

async function inviteLink(leadCookie: string, email: string, shop: string): Promise<string> {
  expect((await api('/api/shop/invitations', { method: 'POST', cookie: leadCookie, body: { email, role: 'designer' } })).status).toBe(201)
  return (await waitForMail(email, new RegExp(`Join ${shop}`))).link
}

describe('the invitation page', () => {
  it('asks before anything changes when someone else is signed in, and joins from the invited account\'s own session', async () => {
    const base = inject('baseUrl')
    const shop = 'Lantern Row Players'
    const { people: [lead] } = await makeShop(shop, [{ role: 'lead', name: 'Lia Lantern' }])
    const { people: [invited, stranger] } = await makeShop('Lantern Home', [{ role: 'viewer', name: 'Ivo Invited' }, { role: 'viewer', name: 'Sta Stranger' }])
    const leadCookie = await signInAs(lead!.email, lead!.password)
    const link = await inviteLink(leadCookie, invited!.email, shop)
    expect(link.startsWith(`${base}/join/`)).toBe(true)

    for (const width of [1440, 390]) {
      // Signed out: both ways, nothing said about the address.
      const guest = await pageAt(width)
      await guest.goto(link)
      await guest.getByRole('heading', { name: `Join ${shop}` }).waitFor()
      await guest.getByRole('link', { name: 'Sign in first' }).waitFor()
      expect(await guest.getByText(/already has a Rootplate account/).count()).toBe(0)
      await guest.screenshot({ path: `${shots}/join-signed-out-${width}.png`, fullPage: true })
      await guest.context().close()

      // Signed in as someone else: the page asks; the session stays until they choose.
      const other = await pageAt(width)
      await signInThroughForm(other, stranger!.email, stranger!.password)
      await other.goto(link)
      await other.getByTestId('join-other-account').waitFor()
      await expect(other.getByTestId('join-other-account').textContent()).resolves.toContain(stranger!.email)
      await other.screenshot({ path: `${shots}/join-other-account-${width}.png`, fullPage: true })
      await other.getByRole('link', { name: 'Keep my session' }).click()
      await other.waitForURL(`${base}/`)
      await other.waitForLoadState('networkidle')
      await expect(other.getByText('Sta Stranger').first().isVisible()).resolves.toBe(true)
      await other.context().close()
    }

    // Signed in as the invited account: one button adds the shop.
    const own = await pageAt(1440)
    await signInThroughForm(own, invited!.email, invited!.password)
    await own.goto(link)
    await own.getByTestId('join-signed-in').waitFor()
    await own.screenshot({ path: `${shots}/join-signed-in-1440.png`, fullPage: true })
    await own.getByRole('button', { name: `Join ${shop}` }).click()
    await own.waitForURL(`${base}/`)
    await own.waitForLoadState('networkidle')
    await expect(own.getByTestId('role').textContent()).resolves.toBe('Designer')
    await own.context().close()
  }, 120_000)
})

describe('the Mail page', () => {
  it('shows the lead\'s own messages, 20 a page, with older ones a click away', async () => {
    const base = inject('baseUrl')
    const shop = 'Postbox Players'
    const { people: [lead] } = await makeShop(shop, [{ role: 'lead', name: 'Pos Postbox' }])
    const cookie = await signInAs(lead!.email, lead!.password)
    const sent: string[] = []
    for (let i = 0; i < 21; i++) {
      const email = uniqueEmail(`postbox-${i}`)
      expect((await api('/api/shop/invitations', { method: 'POST', cookie, body: { email, role: 'viewer' } })).status).toBe(201)
      sent.push(email)
    }
    for (const email of sent) await waitForMail(email, /Join Postbox Players/)
    for (const width of [1440, 390]) {
      const page = await pageAt(width)
      await signInThroughForm(page, lead!.email, lead!.password)
      await page.goto(`${base}/dev/mail`)
      const list = page.getByTestId('mail-list')
      await list.getByText(`to ${sent[20]}`).waitFor()
      expect(await list.getByText(`to ${sent[0]}`).count()).toBe(0)
      await page.screenshot({ path: `${shots}/mail-paged-${width}.png`, fullPage: true })
      await page.getByRole('button', { name: 'Older' }).click()
      await list.getByText(`to ${sent[0]}`).waitFor()
      await expect(page.getByText('Page 2').isVisible()).resolves.toBe(true)
      await page.context().close()
    }
  }, 120_000)
})

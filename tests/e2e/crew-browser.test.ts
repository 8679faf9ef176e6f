// In Chromium: the lead invites someone, the e-mail lands in the mail fake's
// folder (read with mailparser), the newcomer follows the link, chooses a name
// and password and signs in with the invited role; a share link downloads a
// DXF without a session (read with dxf-parser) and stops once withdrawn.
// Screenshots of the crew, mail, invitation, share and activity pages go to
// test-results/e2e/ to be looked at.
import { mkdirSync, readFileSync } from 'node:fs'
import DxfParser from 'dxf-parser'
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, demo, signIn } from './support/api'
import { makeShop, uniqueEmail } from './support/crew'
import { waitForMail } from './support/mail'
import { signInThroughForm } from './support/sign-in'

const shots = 'test-results/e2e'
let browser: Browser

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
})
afterAll(() => browser?.close())
// Console errors, uncaught exceptions, failed requests and error answers fail the test (tests/e2e/support/browser.ts).
afterEach(() => { expect(takePageProblems()).toEqual([]) })

async function freshPage(allow: RegExp[] = []): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 860 } })
  const page = watchPage(await context.newPage(), allow)
  return { context, page }
}

// The withdrawn link answers 404 on purpose: its page's data request and the dead download.
const withdrawnLink = [/answer 404: GET \S+\/api\/shared\/[\w-]{43}$/, /answer 404: GET \S+\/s\/[\w-]{43}$/, /answer 404: GET \S+\/s\/[\w-]{43}\/template\.pdf/, /console error: Failed to load resource: the server responded with a status of 404/]

describe('crew and sharing in Chromium', () => {
  it('the lead invites an address; the newcomer follows the e-mailed link, sets name and password, and signs in as a designer', async () => {
    const base = inject('baseUrl')
    const newcomer = uniqueEmail('browser-newcomer')
    // A shop of this test's own, so the demo crew stays as seeded.
    const { people: [owner] } = await makeShop('Willowbrook Players', [{ role: 'lead', name: 'Lane Willow' }])
    const lead = await freshPage()
    await signInThroughForm(lead.page, owner!.email, owner!.password)
    await lead.page.getByRole('link', { name: 'Crew' }).click()
    await lead.page.waitForURL(`${base}/shop/members`)
    await lead.page.getByTestId('members').waitFor()
    await lead.page.getByLabel('E-mail').fill(newcomer)
    await lead.page.getByLabel('Role', { exact: true }).selectOption('designer')
    await lead.page.getByRole('button', { name: 'Send invitation' }).click()
    await lead.page.getByText(`Invitation sent to ${newcomer}.`).waitFor()
    await lead.page.getByTestId('pending-invitations').getByText(newcomer).waitFor()
    await lead.page.screenshot({ path: `${shots}/crew-page.png`, fullPage: true })

    // The message, read from the fake's folder with mailparser.
    const mail = await waitForMail(newcomer, /Join Willowbrook Players/)
    expect(mail.text).toContain('Willowbrook Players')
    expect(mail.html).toContain(mail.link)

    // The lead's development mail page shows it too.
    await lead.page.getByRole('link', { name: 'Mail' }).click()
    await lead.page.waitForURL(`${base}/dev/mail`)
    await lead.page.getByTestId('mail-list').getByText(`to ${newcomer}`).click()
    await expect(lead.page.getByTestId('mail-message').getByRole('heading').textContent()).resolves.toBe('Join Willowbrook Players on Rootplate')
    await lead.page.screenshot({ path: `${shots}/mail-page.png`, fullPage: true })
    await lead.context.close()

    // A browser without any session follows the link.
    const guest = await freshPage()
    await guest.page.goto(mail.link)
    await guest.page.getByRole('heading', { name: 'Join Willowbrook Players' }).waitFor()
    await expect(guest.page.getByText(newcomer).isVisible()).resolves.toBe(true)
    await guest.page.getByLabel('Your name').fill('Wren Newcomer')
    await guest.page.getByLabel('Password', { exact: true }).fill('sawdust-and-glue')
    await guest.page.getByLabel('Password again').fill('sawdust-and-glue')
    await guest.page.screenshot({ path: `${shots}/invitation-page.png`, fullPage: true })
    await guest.page.getByRole('button', { name: 'Join Willowbrook Players' }).click()
    await guest.page.waitForURL(`${base}/`)
    await expect(guest.page.getByTestId('role').textContent()).resolves.toBe('Designer')
    await guest.page.getByRole('button', { name: 'Sign out' }).click()
    await guest.page.waitForURL(/\/login/)

    // The new member signs in with what they chose and has the invited role.
    await signInThroughForm(guest.page, newcomer, 'sawdust-and-glue')
    await expect(guest.page.getByTestId('role').textContent()).resolves.toBe('Designer')
    await expect(guest.page.getByText('Wren Newcomer').isVisible()).resolves.toBe(true)
    // The used link now says so instead of offering the form again.
    await guest.page.goto(mail.link)
    await guest.page.getByText(/already been used/).waitFor()
    await guest.context.close()
  })

  it('a share link made on the design page downloads a DXF without a session and stops once withdrawn', async () => {
    const base = inject('baseUrl')
    const designer = await signIn(demo.designer)
    const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Browser share alder', sizeLabel: '14 in tube', params: {} } })
    expect(created.status).toBe(201)

    const maker = await freshPage()
    await signInThroughForm(maker.page, demo.designer, 'rootplate-demo')
    await maker.page.goto(`${base}/designs/${created.body.id}`)
    const panel = maker.page.getByTestId('share-panel')
    await panel.waitFor()
    await panel.getByLabel('Works for').selectOption('7')
    await panel.getByLabel('Note for the shop').fill('Two from one glued panel of 3/4 in birch ply, please.')
    await panel.getByRole('button', { name: 'Make a link' }).click()
    const url = await panel.getByTestId('share-url').inputValue()
    expect(url).toMatch(new RegExp(`^${base}/s/[\\w-]{43}$`))
    await panel.getByText('open', { exact: true }).waitFor()
    await maker.context.close()

    // An outside shop with no account opens it and downloads the DXF.
    const outside = await freshPage(withdrawnLink)
    await outside.page.goto(url)
    await expect(outside.page.getByTestId('shared-design').textContent()).resolves.toMatch(/Browser share alder/)
    await expect(outside.page.getByTestId('shared-note').textContent()).resolves.toMatch(/3\/4 in birch ply/)
    await outside.page.screenshot({ path: `${shots}/share-page.png`, fullPage: true })
    const [download] = await Promise.all([
      outside.page.waitForEvent('download'),
      outside.page.getByRole('link', { name: 'Both plywood layers, inches', exact: true }).click(),
    ])
    const dxfText = readFileSync((await download.path())!, 'utf8')
    const dxf = new DxfParser().parseSync(dxfText)!
    expect(dxf.header.$INSUNITS).toBe(1) // inches (DXF Reference, HEADER section)
    expect(dxf.entities.some(e => e.type === 'LWPOLYLINE')).toBe(true)
    expect((await outside.context.cookies()).some(c => c.name === 'nuxt-session')).toBe(false)

    // The lead withdraws it; the same page and download now answer that it is gone.
    const leadCookie = await signIn(demo.lead)
    const links = await api(`/api/revisions/${created.body.revision.id}/shares`, { cookie: leadCookie })
    expect((await api(`/api/shares/${links.body[0].id}`, { method: 'DELETE', cookie: leadCookie })).status).toBe(204)
    // The share page and a dead download link each show a short page with the
    // 404 (pages of their own: Chromium logs every 404 document, which is the point here).
    const withdrawn = watchPage(await outside.context.newPage(), withdrawnLink)
    expect((await withdrawn.goto(url))?.status()).toBe(404)
    await withdrawn.getByRole('heading', { name: 'This link does not open anything' }).waitFor()
    expect((await outside.page.request.get(`${url}/cut.dxf?units=in`)).status()).toBe(404)
    const dead = watchPage(await outside.context.newPage(), withdrawnLink)
    const answer = await dead.goto(`${url}/template.pdf?paper=letter`)
    expect(answer?.status()).toBe(404)
    await dead.getByRole('heading', { name: 'This link does not open anything' }).waitFor()
    await outside.context.close()

    // The lead's activity page shows the download through the link, newest first.
    const lead = await freshPage()
    await signInThroughForm(lead.page, demo.lead, 'rootplate-demo')
    await lead.page.getByRole('link', { name: 'Activity' }).click()
    await lead.page.waitForURL(`${base}/shop/activity`)
    await lead.page.getByTestId('activity').waitFor()
    await lead.page.getByLabel('Design').selectOption({ label: 'Browser share alder (14 in tube)' })
    // The list reloads for the chosen design; until then it still shows the whole shop's entries.
    const actions = () => lead.page.locator('[data-testid="activity"] li').evaluateAll(els => els.map(e => e.getAttribute('data-action')))
    await expect.poll(actions, { timeout: 15_000 }).toEqual(['share.withdrawn', 'share.download', 'share.created', 'design.created'])
    await lead.page.screenshot({ path: `${shots}/activity-page.png`, fullPage: true })
    await lead.context.close()
  })
})

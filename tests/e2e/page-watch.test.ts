// The browser-test harness itself (tests/e2e/support/browser.ts): a cancelled
// request counts as a failure unless the page explains it. Pages here are
// served by Playwright's request routing on the test server's origin, so each
// case sets up exactly one cause (or none) and nothing else runs in the page.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, Page, Route } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'

let browser: Browser
beforeAll(async () => { browser = await launchChromium() })
afterAll(() => browser?.close())

const html = (body: string) => (route: Route) => route.fulfill({ status: 200, contentType: 'text/html', body: `<!doctype html><html><body>${body}</body></html>` })
/** A request that stays open until the test lets it go (never, in these cases). */
const hang = () => () => new Promise<void>(() => {})

async function page(): Promise<{ page: Page; base: string }> {
  const p = watchPage(await browser.newPage())
  return { page: p, base: `${inject('baseUrl')}/__watch-test` }
}
/** One round trip to the page, so every report it sent before is in (as it is by a test's end). */
const settle = (p: Page) => p.evaluate(() => 0)
/** Waits until the watcher has seen the request end, one way or the other. */
const failed = (p: Page, part: string) => p.waitForEvent('requestfailed', { predicate: r => r.url().includes(part), timeout: 15_000 })

describe('cancelled requests the page did not cause are failures', () => {
  it('a script the page is still using, cancelled from outside', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/chunk.js`, r => r.abort('aborted'))
    await p.route(`${base}/a`, html(`<script src="${base}/chunk.js"></script>`))
    await p.goto(`${base}/a`)
    await settle(p)
    const problems = takePageProblems()
    expect(problems).toHaveLength(1)
    expect(problems[0]).toMatch(/request failed: GET \S+\/chunk\.js net::ERR_ABORTED/)
    await p.close()
  })

  it('a fetch the app did not abort (the old harness let every cancelled fetch pass)', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/data.json`, r => r.abort('aborted'))
    await p.route(`${base}/b`, html(`<script>fetch('${base}/data.json').catch(() => {})</script>`))
    const gone = failed(p, 'data.json')
    await p.goto(`${base}/b`)
    await gone
    await settle(p)
    const problems = takePageProblems()
    expect(problems.join('\n')).toMatch(/request failed: GET \S+\/data\.json net::ERR_ABORTED/)
    await p.close()
  })
})

describe('cancelled requests the page explains are not', () => {
  it('a fetch the app aborted itself (AbortController)', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/slow.json`, hang())
    await p.route(`${base}/c`, html(`<script>
      const c = new AbortController(); fetch('${base}/slow.json', { signal: c.signal }).catch(() => {}); setTimeout(() => c.abort(), 50)
    </script>`))
    const gone = failed(p, 'slow.json')
    await p.goto(`${base}/c`)
    await gone
    await settle(p)
    expect(takePageProblems()).toEqual([])
    await p.close()
  })

  it('a frame the page removed while it loaded', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/inner`, hang())
    await p.route(`${base}/d`, html(`<iframe id="box" src="${base}/inner"></iframe><script>setTimeout(() => document.getElementById('box').remove(), 50)</script>`))
    const gone = failed(p, '/inner')
    await p.goto(`${base}/d`, { waitUntil: 'domcontentloaded' })
    await gone
    await settle(p)
    expect(takePageProblems()).toEqual([])
    await p.close()
  })

  it('a script still loading when the test moved the page to another address', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/late.js`, hang())
    await p.route(`${base}/e`, html(`<script async src="${base}/late.js"></script>`))
    await p.route(`${base}/f`, html('next page'))
    await p.goto(`${base}/e`, { waitUntil: 'domcontentloaded' })
    const gone = failed(p, 'late.js')
    await p.goto(`${base}/f`)
    await gone
    await settle(p)
    expect(takePageProblems()).toEqual([])
    await p.close()
  })

  it('a request still open when the test closed the page', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/open.json`, hang())
    await p.route(`${base}/g`, html(`<script>fetch('${base}/open.json').catch(() => {})</script>`))
    await p.goto(`${base}/g`, { waitUntil: 'domcontentloaded' })
    await p.close()
    expect(takePageProblems()).toEqual([])
  })

  it('but a history push is no new document: a fetch cancelled after it still counts', async () => {
    const { page: p, base } = await page()
    await p.route(`${base}/after-push.json`, r => r.abort('aborted'))
    await p.route(`${base}/h`, html(`<script>history.pushState({}, '', '${base}/h2'); fetch('${base}/after-push.json').catch(() => {})</script>`))
    const gone = failed(p, 'after-push.json')
    await p.goto(`${base}/h`)
    await gone
    await settle(p)
    expect(takePageProblems().join('\n')).toMatch(/after-push\.json net::ERR_ABORTED/)
    await p.close()
  })
})

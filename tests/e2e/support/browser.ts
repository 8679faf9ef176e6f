import { chromium, type Browser, type BrowserContext, type Page, type Request } from 'playwright-core'

/** Debian's Chromium, headless, with every background connection turned off (this machine has no outside network). */
export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
      '--disable-extensions', '--disable-default-apps', '--no-pings', '--disable-domain-reliability',
      '--disable-breakpad', '--password-store=basic',
      '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE localhost, EXCLUDE 127.0.0.1',
    ],
  })
}

interface Watched { problems: string[]; allow: RegExp[]; closing: boolean; navigation: number }
const watched = new Map<Page, Watched>()
const closingContexts = new WeakSet<BrowserContext>()

/**
 * Records everything that went wrong in a page: console errors (a hydration
 * mismatch among them), uncaught exceptions, requests that failed and answers
 * of 400 or more. A test names the failures it provokes on purpose in `allow`
 * (matched against the recorded line); `expectCleanPages` fails on the rest.
 */
export function watchPage(page: Page, allow: RegExp[] = []): Page {
  const w: Watched = { problems: [], allow, closing: false, navigation: 0 }
  watched.set(page, w)
  // A request the browser cancels because its page is closing, because the
  // page moved on to another address before it finished (a link's code fetched
  // ahead, a list still loading), or because the app itself dropped a fetch a
  // newer one replaces (AbortController), is not a failure of the app.
  // Everything else is: a refused connection, a reset, an empty or cut-off
  // answer, a DNS error, any answer of 400 or more, and a page's own script or
  // document cancelled while the page stays open.
  const close = page.close.bind(page)
  page.close = (options) => { w.closing = true; return close(options) }
  const context = page.context()
  if (!closingContexts.has(context)) {
    closingContexts.add(context)
    const closeContext = context.close.bind(context)
    context.close = (options) => {
      for (const p of context.pages()) { const pw = watched.get(p); if (pw) pw.closing = true }
      return closeContext(options)
    }
  }
  const issuedAt = new WeakMap<Request, number>()
  page.on('request', (r) => {
    if (r.isNavigationRequest() && r.frame() === page.mainFrame()) w.navigation++
    issuedAt.set(r, w.navigation)
  })
  page.on('console', (m) => {
    if (m.type() === 'error' || /hydration/i.test(m.text())) w.problems.push(`console ${m.type()}: ${m.text()}`)
  })
  page.on('pageerror', e => w.problems.push(`uncaught: ${e.message}`))
  page.on('requestfailed', (r) => {
    // A download the browser hands to its own handler ends as aborted by design, not as a failure.
    const why = r.failure()?.errorText ?? ''
    if (why.includes('ERR_ABORTED') && r.resourceType() === 'other') return
    if (why.includes('ERR_ABORTED') && (w.closing || (issuedAt.get(r) ?? w.navigation) < w.navigation || ['fetch', 'xhr'].includes(r.resourceType()))) return
    w.problems.push(`request failed: ${r.method()} ${r.url()} ${why}`)
  })
  page.on('response', (r) => {
    if (r.status() >= 400) w.problems.push(`answer ${r.status()}: ${r.request().method()} ${r.url()}`)
  })
  return page
}

/** The problems of every watched page not allowed by its test; forgets the pages. */
export function takePageProblems(): string[] {
  const out: string[] = []
  for (const [page, w] of watched) {
    for (const p of w.problems) if (!w.allow.some(re => re.test(p))) out.push(`${page.url()}: ${p}`)
  }
  watched.clear()
  return out
}

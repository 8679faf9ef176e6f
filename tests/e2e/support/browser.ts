import { chromium, type Browser, type Page } from 'playwright-core'

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

interface Watched { problems: string[]; allow: RegExp[] }
const watched = new Map<Page, Watched>()

/**
 * Records everything that went wrong in a page: console errors (a hydration
 * mismatch among them), uncaught exceptions, requests that failed and answers
 * of 400 or more. A test names the failures it provokes on purpose in `allow`
 * (matched against the recorded line); `expectCleanPages` fails on the rest.
 */
export function watchPage(page: Page, allow: RegExp[] = []): Page {
  const w: Watched = { problems: [], allow }
  watched.set(page, w)
  page.on('console', (m) => {
    if (m.type() === 'error' || /hydration/i.test(m.text())) w.problems.push(`console ${m.type()}: ${m.text()}`)
  })
  page.on('pageerror', e => w.problems.push(`uncaught: ${e.message}`))
  page.on('requestfailed', (r) => {
    // A download the browser hands to its own handler ends as aborted by design, not as a failure.
    const why = r.failure()?.errorText ?? ''
    if (why.includes('ERR_ABORTED') && r.resourceType() === 'other') return
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

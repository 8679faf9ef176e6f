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

interface Aborted { line: string; url: string }
interface Watched {
  problems: string[]; allow: RegExp[]; closing: boolean
  /** Main-frame navigations started, and documents they committed (a history push is no new document). */
  navStarts: number; commits: number; pendingNav: boolean
  /** Cancelled requests no navigation or close explains yet: judged at the end by what the page reported. */
  aborted: Aborted[]
  /** Addresses the page itself let go: fetches it aborted, elements that loaded something and were removed or re-pointed. */
  dropped: Set<string>
  downloads: Set<string>
}
const watched = new Map<Page, Watched>()
const closingContexts = new WeakSet<BrowserContext>()

// Runs first in every document of a watched page and reports, through the
// binding, each address the page itself abandons: a fetch whose AbortSignal
// fires (a newer fetch replaced it, a component went away), an XHR aborted,
// and a loading element (script, link, img, source, iframe) removed from the
// document or pointed elsewhere while it loaded.
const reportDropped = `(() => {
  const report = (url) => { try { window.__rootplateDropped(new URL(url, location.href).href) } catch {} }
  const fetch0 = window.fetch
  window.fetch = function (input, init) {
    const signal = (init && init.signal) || (input instanceof Request ? input.signal : undefined)
    const url = input instanceof Request ? input.url : String(input)
    if (signal && !signal.aborted) signal.addEventListener('abort', () => report(url), { once: true })
    return fetch0.apply(this, arguments)
  }
  const open0 = XMLHttpRequest.prototype.open
  const abort0 = XMLHttpRequest.prototype.abort
  XMLHttpRequest.prototype.open = function (method, url) { this.__rootplateUrl = String(url); return open0.apply(this, arguments) }
  XMLHttpRequest.prototype.abort = function () { if (this.__rootplateUrl) report(this.__rootplateUrl); return abort0.apply(this, arguments) }
  const loading = 'script[src],link[href],img[src],source[src],iframe[src]'
  new MutationObserver((records) => {
    for (const r of records) {
      if (r.type === 'attributes') { if (r.oldValue && r.target.matches && r.target.matches(loading)) report(r.oldValue); continue }
      for (const n of r.removedNodes) {
        if (n.nodeType !== 1) continue
        for (const el of [n, ...n.querySelectorAll(loading)]) {
          const u = el.matches(loading) ? (el.getAttribute('src') || el.getAttribute('href')) : null
          if (u) report(u)
        }
      }
    }
  }).observe(document, { subtree: true, childList: true, attributes: true, attributeFilter: ['src', 'href'], attributeOldValue: true })
})()`

/**
 * Records everything that went wrong in a page: console errors (a hydration
 * mismatch among them), uncaught exceptions, requests that failed and answers
 * of 400 or more. A test names the failures it provokes on purpose in `allow`
 * (matched against the recorded line); `takePageProblems` returns the rest.
 *
 * A cancelled request (ERR_ABORTED) is forgiven only when the page itself
 * explains it: the page was being closed by the test; a new document
 * replaced the one that asked (a navigation started before the request
 * failed, or committed after the request was made); the page's own code
 * aborted that fetch or XHR, or removed or re-pointed the element loading
 * it; or the browser took the answer as a download. Every other failure
 * counts: a refused connection, a reset, an empty or cut-off answer, a DNS
 * error, and a script chunk or fetch cancelled with no such cause.
 */
export function watchPage(page: Page, allow: RegExp[] = []): Page {
  const w: Watched = { problems: [], allow, closing: false, navStarts: 0, commits: 0, pendingNav: false, aborted: [], dropped: new Set(), downloads: new Set() }
  watched.set(page, w)
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
  // The page's own reports; the first navigation waits until they are in place.
  const ready = Promise.all([
    page.exposeBinding('__rootplateDropped', (_source, url: string) => { w.dropped.add(url) }),
    page.addInitScript(reportDropped),
  ]).catch((e: Error) => { w.problems.push(`watcher not installed: ${e.message}`) })
  const goto = page.goto.bind(page)
  page.goto = async (url, options) => { await ready; return goto(url, options) }

  interface Issued { commits: number; navStarts: number }
  const issued = new WeakMap<Request, Issued>()
  const isMainNavigation = (r: Request) => r.isNavigationRequest() && r.frame() === page.mainFrame()
  page.on('request', (r) => {
    issued.set(r, { commits: w.commits, navStarts: w.navStarts })
    if (isMainNavigation(r)) { w.navStarts++; w.pendingNav = true }
  })
  page.on('framenavigated', (f) => {
    // Only a navigation that sent a document request makes a new document; a history push does not.
    if (f === page.mainFrame() && w.pendingNav) { w.commits++; w.pendingNav = false }
  })
  page.on('download', d => w.downloads.add(d.url()))
  page.on('console', (m) => {
    // The watcher's own init script (addInitScript) runs in every frame; in a sandboxed frame without scripts
    // (the Mail page shows each message so) Chromium blocks it and says so. That block is the sandbox working.
    if (/^Blocked script execution in 'about:srcdoc' because the document's frame is sandboxed/.test(m.text())) return
    if (m.type() === 'error' || /hydration/i.test(m.text())) w.problems.push(`console ${m.type()}: ${m.text()}`)
  })
  page.on('pageerror', e => w.problems.push(`uncaught: ${e.message}`))
  page.on('requestfailed', (r) => {
    const why = r.failure()?.errorText ?? ''
    const line = `request failed: ${r.method()} ${r.url()} ${why}`
    if (!why.includes('ERR_ABORTED')) { w.problems.push(line); return }
    if (w.closing) return
    const at = issued.get(r) ?? { commits: w.commits, navStarts: w.navStarts }
    if (isMainNavigation(r)) {
      // A document request is cancelled by the navigation that replaced it.
      if (w.navStarts > at.navStarts + 1) return
    }
    // Its document was replaced (committed since), or is being replaced now.
    else if (w.commits > at.commits || w.pendingNav) return
    w.aborted.push({ line, url: r.url() })
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
    const unexplained = w.aborted.filter(a => !w.dropped.has(a.url) && !w.downloads.has(a.url)).map(a => a.line)
    for (const p of [...w.problems, ...unexplained]) if (!w.allow.some(re => re.test(p))) out.push(`${page.url()}: ${p}`)
  }
  watched.clear()
  return out
}

import type { H3Event } from 'h3'
import { openShare, type OpenShare } from '../services/shares'
import { limit, RATE_LIMITS, takeLimits } from '../services/rate-limits'

/** The share named by the route's token: 404 when unknown or withdrawn, 410 once expired. It reaches one revision and nothing else. */
export async function sharedOnly(event: H3Event): Promise<OpenShare> {
  const token = getRouterParam(event, 'token')
  const found = linkToken.safeParse(token).success ? await openShare(useDb(), token as string) : { state: 'missing' as const }
  if (found.state === 'expired') throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This link has expired. Ask the shop that sent it for a new one.' })
  if (found.state !== 'open') throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This link is not known or was withdrawn by the shop.' })
  return found.share
}

/**
 * The share of a download route, counted against the link (however many
 * people use it) and the client's address (however many links it holds):
 * 429 with Retry-After past either.
 */
export async function sharedForDownload(event: H3Event): Promise<OpenShare> {
  const share = await sharedOnly(event)
  refuseOverLimit(event, await takeLimits(useDb(), [
    limit(`share-download:${share.id}`, RATE_LIMITS.downloadsPerShare),
    limit(`share-download-from:${clientAddress(event)}`, RATE_LIMITS.downloadsPerAddress),
  ]), 'Many downloads through this link in a short time')
  return share
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

// The framework's own rule for a JSON error (its error page would otherwise
// render the app, whose sign-in redirect hides the status from a browser).
function wantsPage(event: H3Event): boolean {
  const header = (name: string) => (getRequestHeader(event, name) ?? '').toLowerCase()
  if (header('accept').includes('text/html')) return true
  const json = header('accept').includes('application/json') || header('sec-fetch-mode') === 'cors' || /^(curl|httpie)\//.test(header('user-agent'))
  return !json
}

/**
 * Runs a share download. A browser that follows a dead link gets a short page
 * with the real status (404/410/422) rather than the app's sign-in page; a
 * program (curl, a CNC shop's script) gets the usual JSON error.
 */
export async function shareDownload<T>(event: H3Event, make: () => Promise<T>): Promise<T | string> {
  try {
    return await make()
  }
  catch (err: unknown) {
    if (!isError(err) || !wantsPage(event)) throw err
    setResponseStatus(event, err.statusCode)
    setResponseHeaders(event, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' })
    const fields = (err.data as { fields?: Record<string, string> } | undefined)?.fields
    const detail = fields ? `<ul>${Object.entries(fields).map(([k, v]) => `<li>${escapeHtml(k)}: ${escapeHtml(v)}</li>`).join('')}</ul>` : ''
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="robots" content="noindex"><title>Rootplate</title></head>`
      + `<body style="font-family:system-ui,sans-serif;max-width:36rem;margin:3rem auto;padding:0 1rem;color:#23281f">`
      + `<h1 style="font-size:1.25rem">${err.statusCode === 410 ? 'This link has expired' : err.statusCode === 404 ? 'This link does not open anything' : 'This file could not be made'}</h1>`
      + `<p>${escapeHtml(err.message)}</p>${detail}</body></html>`
  }
}

import type { H3Event } from 'h3'
import { bodyRule, bodyTimeoutMs, readBodyWithin } from '../utils/request-limits'
import { jsonDepthOver, MAX_JSON_DEPTH } from '../utils/validation'

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

function refuse(statusCode: number, statusMessage: string, message: string, code: string): never {
  throw createError({ statusCode, statusMessage, message, data: { code } })
}

function trustProxy(): boolean {
  return trustedProxyHops() > 0
}

/**
 * Cross-site requests: a browser names where a request comes from in
 * Sec-Fetch-Site (and Origin); anything but this site itself is refused.
 * Requests without either header do not come from a browser page, so they
 * cannot carry a member's cookie on someone else's behalf.
 */
function checkSameOrigin(event: H3Event) {
  const site = getRequestHeader(event, 'sec-fetch-site')
  if (site && site !== 'same-origin' && site !== 'none') {
    refuse(403, 'Forbidden', 'Requests from other sites are refused; use Rootplate itself', 'cross-site')
  }
  const origin = getRequestHeader(event, 'origin')
  if (origin) {
    let host: string
    try { host = new URL(origin).host }
    catch { refuse(403, 'Forbidden', 'Requests from other sites are refused; use Rootplate itself', 'cross-site') }
    const own = getRequestHost(event, { xForwardedHost: trustProxy() })
    if (host !== own) refuse(403, 'Forbidden', 'Requests from other sites are refused; use Rootplate itself', 'cross-site')
  }
}

function tooLarge(limit: number) {
  const size = limit >= 1024 * 1024 ? `${Math.round(limit / 1024 / 1024)} MB` : `${Math.round(limit / 1024)} kB`
  return createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `The request is larger than this route takes (${size})`, data: { code: 'too-large', limit } })
}

/**
 * One guard in front of every API route, before any body is read:
 * no caching of answers; for changes, same-origin only, JSON only (multipart
 * where files are taken), and a body limit per route, checked on the
 * declared length and again on the bytes that actually arrive; a JSON body
 * must arrive within a deadline and nest at most MAX_JSON_DEPTH levels.
 */
export default defineEventHandler(async (event) => {
  const path = event.path
  if (!path.startsWith('/api/')) {
    // Pages show shop data once signed in: never kept by a browser or proxy.
    if (!path.startsWith('/_nuxt/') && !/\.[a-z0-9]+(\?|$)/i.test(path)) setResponseHeader(event, 'cache-control', 'no-store')
    return
  }
  setResponseHeader(event, 'cache-control', 'no-store')
  if (SAFE_METHODS.has(event.method)) return

  checkSameOrigin(event)

  const pathname = path.split('?')[0]!
  const rule = bodyRule(pathname)
  const declared = getRequestHeader(event, 'content-length')
  const chunked = !!getRequestHeader(event, 'transfer-encoding')
  const length = declared === undefined ? NaN : Number(declared)
  if (Number.isFinite(length) && length > rule.limit) throw tooLarge(rule.limit)
  const hasBody = chunked || (Number.isFinite(length) && length > 0)
  if (!hasBody) return

  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  const json = type === 'application/json' || (type.startsWith('application/') && type.endsWith('+json'))
  if (!json && !(rule.multipart && type === 'multipart/form-data')) {
    refuse(415, 'Unsupported Media Type', rule.multipart ? 'Send the file as multipart/form-data' : 'Send the request body as JSON (Content-Type: application/json)', 'unsupported-type')
  }
  // A file route streams its own body through its own limit (server/utils/upload.ts):
  // reading it here as well would leave that reader waiting on a stream already ended.
  if (rule.multipart && type === 'multipart/form-data') return
  // Read once, here, within the limit; h3's body readers take it from _requestBody.
  // A sender that trickles its body is answered 408 once the deadline passes.
  const body = await readBodyWithin(event, rule.limit, () => tooLarge(rule.limit), bodyTimeoutMs())
  // Nesting is counted on the raw text before anything parses or walks it, so a
  // body of 4,000 nested arrays costs one linear pass, not a deep recursion.
  if (jsonDepthOver(body)) refuse(400, 'Bad Request', `The request body nests deeper than ${MAX_JSON_DEPTH} levels`, 'too-deep')
  ;(event as unknown as { _requestBody?: Buffer })._requestBody = body
})

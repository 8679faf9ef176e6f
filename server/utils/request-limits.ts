import { createError, type H3Event } from 'h3'

/** Body limits in bytes, by route, checked before anything is parsed. */
export const BODY_LIMITS = {
  /** Sign-in, sign-out, invitations, password forms. */
  auth: 8 * 1024,
  preferences: 8 * 1024,
  /** A design or revision: the params of even a many-lobed plate are a few kB. */
  design: 256 * 1024,
  /** Uploads check their own 15 MB limit; this lets a 15 MB file and its multipart framing through. */
  attachment: 16 * 1024 * 1024,
  other: 64 * 1024,
} as const

/** Routes that take a file: a design's attachments and a unit's photos. */
const ATTACHMENTS = /^\/api\/(designs\/[^/]+\/attachments|units\/[^/]+\/photos)\/?$/

export interface RouteBodyRule { limit: number; multipart: boolean }

/**
 * The longest a JSON body may take to arrive, ms (REQUEST_BODY_TIMEOUT_MS).
 * Our own choice: the largest JSON body we take is 256 kB, which even a slow
 * 1 Mbit/s link sends in about 2 s; a sender trickling bytes is answered 408
 * and its connection closed instead of holding a request open for minutes.
 */
export function bodyTimeoutMs(): number {
  const n = Number(process.env.REQUEST_BODY_TIMEOUT_MS)
  return Number.isFinite(n) && n > 0 ? n : 10_000
}

/** The 408 for a body that did not arrive in time; the connection is closed with it. */
export function bodyTimeout(ms: number) {
  return createError({ statusCode: 408, statusMessage: 'Request Timeout', message: `The request body did not arrive within ${Math.round(ms / 1000)} s`, data: { code: 'body-timeout' } })
}

/** The body limit of a route and whether it may take multipart bodies. */
export function bodyRule(pathname: string): RouteBodyRule {
  if (ATTACHMENTS.test(pathname)) return { limit: BODY_LIMITS.attachment, multipart: true }
  if (pathname.startsWith('/api/auth/') || pathname.startsWith('/api/_auth/') || pathname.startsWith('/api/invitations')) return { limit: BODY_LIMITS.auth, multipart: false }
  if (pathname === '/api/me/preferences') return { limit: BODY_LIMITS.preferences, multipart: false }
  if (pathname.startsWith('/api/designs')) return { limit: BODY_LIMITS.design, multipart: false }
  return { limit: BODY_LIMITS.other, multipart: false }
}

/**
 * Reads a request body, stopping at `limit` bytes: a larger body is refused
 * with `tooLarge()` as soon as it passes the limit, never buffered whole. A
 * body the request guard already read is taken from there; a sender that
 * goes away mid-body ends the wait with a 400. With `timeoutMs`, a body
 * that has not all arrived by then is a 408, and the connection is closed.
 */
export function readBodyWithin(event: H3Event, limit: number, tooLarge: () => Error, timeoutMs?: number): Promise<Buffer> {
  const earlier = (event as unknown as { _requestBody?: unknown })._requestBody
  if (Buffer.isBuffer(earlier)) {
    return earlier.length > limit ? Promise.reject(tooLarge()) : Promise.resolve(earlier)
  }
  const req = event.node.req
  return new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    let ended = false
    const timer = timeoutMs
      ? setTimeout(() => {
          req.off('data', onData)
          // Nothing more is read from this sender: the answer goes out with Connection: close.
          event.node.res.shouldKeepAlive = false
          event.node.res.setHeader('connection', 'close')
          reject(bodyTimeout(timeoutMs))
        }, timeoutMs)
      : undefined
    timer?.unref()
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size > limit) {
        clearTimeout(timer)
        req.off('data', onData)
        // Drain the rest unread so the connection can carry the 413 answer.
        req.resume()
        reject(tooLarge())
        return
      }
      chunks.push(chunk)
    }
    req.on('data', onData)
    req.once('end', () => {
      ended = true
      clearTimeout(timer)
      resolve(Buffer.concat(chunks))
    })
    req.once('error', reject)
    req.once('close', () => {
      clearTimeout(timer)
      if (!ended) reject(createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The request body was cut off' }))
    })
  })
}

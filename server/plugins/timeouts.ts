import type { Server } from 'node:http'

/**
 * Time limits on slow senders. Node's HTTP server answers 408 and closes a
 * connection whose headers have not all arrived within `headersTimeout`, or
 * whose whole request has not within `requestTimeout`, checking every
 * `connectionsCheckingInterval` (Node's documentation, http.Server). Its
 * defaults (60 s, 300 s, checked every 30 s) let a sender trickling one byte a
 * second hold a request for minutes. JSON bodies have a shorter deadline of
 * their own (the request guard, REQUEST_BODY_TIMEOUT_MS); the request limit
 * here is for uploads, and lets a 15 MB file through a 1 Mbit/s link.
 *
 * Nitro creates its server after the plugins run, so the limits are set on
 * it when the first request shows which server it is.
 */
export const HEADERS_TIMEOUT_MS = 10_000
export const REQUEST_TIMEOUT_MS = 180_000
export const CHECK_INTERVAL_MS = 1_000

function configure(server: Server): void {
  const headers = Number(process.env.REQUEST_HEADERS_TIMEOUT_MS) || HEADERS_TIMEOUT_MS
  server.headersTimeout = headers
  server.requestTimeout = Math.max(headers, Number(process.env.REQUEST_TIMEOUT_MS) || REQUEST_TIMEOUT_MS)
  // The check interval is read when the server starts listening; Node restarts
  // its checker from this 'listening' handler, so it is run again with ours.
  ;(server as Server & { connectionsCheckingInterval: number }).connectionsCheckingInterval = CHECK_INTERVAL_MS
  const restart = server.listeners('listening').find(f => f.name === 'setupConnectionsTracking')
  if (restart) (restart as (this: Server) => void).call(server)
}

export default defineNitroPlugin((nitroApp) => {
  let done = false
  nitroApp.hooks.hook('request', (event) => {
    if (done) return
    const server = (event.node.req.socket as unknown as { server?: Server } | undefined)?.server
    if (!server || typeof server.listeners !== 'function') return
    done = true
    configure(server)
  })
})

import { knownHosts, requestHost } from '../utils/links'

let hosts: Set<string> | undefined
let trustProxy: boolean | undefined

/**
 * Requests must name this server as configured (APP_URL, or its loopback
 * address): a page or answer served under a stranger's host name (DNS
 * rebinding, a forged Host) is refused with 400 before anything else runs.
 */
export default defineEventHandler((event) => {
  hosts ??= knownHosts()
  trustProxy ??= trustedProxyHops() > 0
  const host = requestHost(event, trustProxy)
  // No host at all: the server's own calls during page rendering (they carry no Host), or an
  // HTTP/1.0 client; neither names a stranger's host, and no link is built from it anyway.
  if (!host || hosts.has(host)) return
  throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'This server does not answer to that host name. Set APP_URL to the address people use to reach it.', data: { code: 'unknown-host' } })
})

import type { H3Event } from 'h3'

/** The port `npm start` and the built server listen on when none is given. */
const listenPort = () => process.env.PORT || process.env.NITRO_PORT || '3000'

/**
 * The address people outside use to reach this server, for every link we hand
 * out (reset and invitation e-mails, share links, QR labels): APP_URL when
 * set, else the address `npm start` prints (http://localhost:PORT). Never the
 * request's Host: anyone can write that header, and a reset link on the
 * sender's host would hand the sender the token.
 */
export function appOrigin(): string {
  const configured = process.env.APP_URL?.trim()
  if (configured) return configured.replace(/\/+$/, '')
  return `http://localhost:${listenPort()}`
}

/** The hosts (name:port, lower case) a request may name: APP_URL's, and this machine's loopback names on the listening port. */
export function knownHosts(): Set<string> {
  const port = listenPort()
  const hosts = new Set([`localhost:${port}`, `127.0.0.1:${port}`, `[::1]:${port}`])
  const configured = process.env.APP_URL?.trim()
  if (configured) {
    try {
      const url = new URL(configured)
      hosts.add(url.host.toLowerCase())
      // A browser leaves the scheme's default port out of Host.
      if (!url.port) hosts.add(`${url.hostname.toLowerCase()}:${url.protocol === 'https:' ? 443 : 80}`)
    }
    catch {
      throw new Error(`APP_URL is not an address: ${configured}`)
    }
  }
  return hosts
}

/**
 * The host the request names: Host, or X-Forwarded-Host when the operator
 * trusts a proxy in front (NUXT_TRUST_PROXY); lower case, with the port.
 */
export function requestHost(event: H3Event, trustProxy: boolean): string {
  const forwarded = trustProxy ? getRequestHeader(event, 'x-forwarded-host')?.split(',')[0]?.trim() : undefined
  return (forwarded || getRequestHeader(event, 'host') || '').toLowerCase()
}

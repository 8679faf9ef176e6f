import type { H3Event } from 'h3'

let proxyHops: number | undefined
/**
 * How many reverse proxies in front of the server the operator vouches for
 * (NUXT_TRUST_PROXY: a count; `true` means one). 0 by default: then
 * X-Forwarded-* headers are ignored, since any client can send them.
 */
export function trustedProxyHops(): number {
  if (proxyHops === undefined) {
    const raw = String(useRuntimeConfig().trustProxy ?? '').trim().toLowerCase()
    const n = raw === 'true' ? 1 : Number(raw)
    proxyHops = Number.isInteger(n) && n > 0 ? Math.min(n, 16) : 0
  }
  return proxyHops
}

/**
 * The client's address from X-Forwarded-For. Each proxy appends the address
 * it received the request from, so with `hops` trusted proxies the client is
 * the hops-th entry from the right; anything further left was written by the
 * client itself and is ignored.
 */
export function forwardedClient(header: string | string[] | undefined, direct: string, hops: number): string {
  if (hops <= 0) return direct
  const list = (Array.isArray(header) ? header.join(',') : header ?? '').split(',').map(s => s.trim()).filter(Boolean)
  if (!list.length) return direct
  // Fewer entries than proxies: the request skipped a proxy, so the leftmost entry is as far as we can see.
  return list[Math.max(0, list.length - hops)]!
}

/** The address of the request's client (see forwardedClient and NUXT_TRUST_PROXY). */
export function clientAddress(event: H3Event, hops = trustedProxyHops()): string {
  const req = event.node.req
  return forwardedClient(req.headers['x-forwarded-for'], req.socket?.remoteAddress ?? 'unknown', hops)
}

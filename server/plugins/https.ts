import type { H3Event } from 'h3'

/** Whether the browser reached us over HTTPS: directly, or through a proxy the operator trusts. */
function overHttps(event: H3Event, trustProxy: boolean): boolean {
  const socket = event.node.req.socket as { encrypted?: boolean }
  if (socket.encrypted) return true
  return trustProxy && getRequestHeader(event, 'x-forwarded-proto')?.split(',')[0]?.trim() === 'https'
}

/**
 * Over HTTPS, cookies get `Secure` and pages get HSTS; over plain HTTP (a
 * shop's LAN address) neither, or the browser would drop the session cookie
 * and refuse the next plain-HTTP visit.
 */
export default defineNitroPlugin((nitroApp) => {
  // Read once: useRuntimeConfig(event) copies the whole config and re-reads the environment on every request.
  const trustProxy = trustedProxyHops() > 0
  nitroApp.hooks.hook('beforeResponse', (event) => {
    if (!overHttps(event, trustProxy)) return
    const res = event.node.res
    if (res.headersSent) return
    const cookies = res.getHeader('set-cookie')
    if (cookies) {
      const list = Array.isArray(cookies) ? cookies : [String(cookies)]
      res.setHeader('set-cookie', list.map(c => (/;\s*secure/i.test(c) ? c : `${c}; Secure`)))
    }
    res.setHeader('strict-transport-security', 'max-age=15552000; includeSubDomains')
  })
})

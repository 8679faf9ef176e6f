import type { H3Event } from 'h3'

/**
 * The address people outside use to reach this server, for links in e-mails
 * and share links: APP_URL when set (behind a proxy or a public name), else
 * the address this request came in on.
 */
export function appOrigin(event: H3Event): string {
  const configured = process.env.APP_URL
  if (configured) return configured.replace(/\/+$/, '')
  return getRequestURL(event).origin
}

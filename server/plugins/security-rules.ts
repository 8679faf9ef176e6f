import type { H3Event } from 'h3'

/**
 * nuxt-security works out its rules for every request anew: it deep-clones
 * its options and builds route matchers each time (its rate limiter does so
 * even while switched off), about a twentieth of an API request's CPU under
 * load. Every /api/ path matches the same rules (only the catch-all pattern
 * applies there), so the rules and route of the first API answer are kept and
 * handed to the later ones before nuxt-security looks.
 * API answers are JSON, never HTML, so they need no CSP nonce either.
 * nuxt-security reads these rules and never changes them.
 */
export default defineNitroPlugin((nitroApp) => {
  const patterns = Object.keys((useRuntimeConfig().nitro as { routeRules?: Record<string, unknown> } | undefined)?.routeRules ?? {})
  // Any pattern other than the catch-all that could match an /api/ path would make the rules differ by path.
  const apiPathsAlike = patterns.every(p => p === '/**' || !/^\/(?:api|\*|:|$)/.test(p))
  if (!apiPathsAlike) return

  let apiRules: Record<string, unknown> | undefined
  let apiRoute: string | undefined
  nitroApp.hooks.beforeEach((call) => {
    if (call.name !== 'request' || !apiRules) return
    // hookable passes the hook's name ahead of its arguments here: find the event among them.
    const event = call.args.find(a => typeof a === 'object' && a !== null && 'context' in a) as H3Event | undefined
    if (event?.path?.startsWith('/api/')) event.context.security = { rules: apiRules, route: apiRoute }
  })
  nitroApp.hooks.hook('afterResponse', (event) => {
    if (apiRules || !event.path.startsWith('/api/')) return
    const { rules, route } = (event.context.security ?? {}) as { rules?: Record<string, unknown>; route?: string }
    if (rules && route !== undefined) {
      apiRoute = route
      apiRules = { ...rules, nonce: false }
    }
  })
})

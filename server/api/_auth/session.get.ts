// Replaces nuxt-auth-utils' own route (removed in nuxt.config.ts), which
// unsealed the cookie and started a session for every anonymous visitor.
export default defineEventHandler(event => sessionView(event))

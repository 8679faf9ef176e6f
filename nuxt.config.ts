// Rootplate: Nuxt 4 with the repository root as the source folder.
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { bundleExportWorker } from './scripts/export-worker-build'

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', 'nuxt-security'],
  css: [
    '@fontsource/ibm-plex-sans/400.css',
    '@fontsource/ibm-plex-sans/500.css',
    '@fontsource/ibm-plex-sans/600.css',
    '@fontsource/ibm-plex-mono/400.css',
    '~/assets/css/main.css',
  ],
  tailwindcss: { viewer: false, cssPath: false },
  typescript: { strict: true },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Rootplate',
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/logo.svg' }],
      meta: [{ name: 'viewport', content: 'width=device-width, initial-scale=1' }],
    },
  },
  runtimeConfig: {
    // Set NUXT_TRUST_PROXY=1 when a reverse proxy in front sets X-Forwarded-For.
    trustProxy: false as boolean | string,
    public: {
      // NUXT_PUBLIC_MAIL_PAGE=1 (set by the start script while the local mail fake is the mail server) shows the lead the Mail page.
      mailPage: false as boolean | string | number,
    },
    // The session cookie: HttpOnly, SameSite=Lax, two weeks. `Secure` is added
    // per request by server/plugins/https.ts when the request came over HTTPS,
    // so the app still signs in over plain HTTP on a shop's LAN address.
    session: {
      maxAge: 60 * 60 * 24 * 14,
      cookie: { httpOnly: true, sameSite: 'lax', secure: false, path: '/' },
    },
  },
  // Headers only; bodies, origins and content types are checked by
  // server/middleware/01.request-guard.ts, which knows each route's limits.
  security: {
    strict: false,
    headers: {
      contentSecurityPolicy: {
        'default-src': ["'self'"],
        'base-uri': ["'none'"],
        'connect-src': ["'self'"],
        'font-src': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'none'"],
        'frame-src': ["'self'", 'blob:'],
        'img-src': ["'self'", 'data:', 'blob:'],
        'object-src': ["'none'"],
        'script-src': ["'self'", "'strict-dynamic'", "'nonce-{{nonce}}'"],
        'script-src-attr': ["'none'"],
        // Vue binds inline style attributes (canvas handles): nonces cannot cover those.
        'style-src': ["'self'", "'unsafe-inline'"],
        'worker-src': ["'self'", 'blob:'],
        // Plain HTTP on a LAN address must keep working; HTTPS deployments get HSTS from server/plugins/https.ts.
        'upgrade-insecure-requests': false,
      },
      strictTransportSecurity: false,
      xFrameOptions: 'DENY',
      referrerPolicy: 'same-origin',
      xContentTypeOptions: 'nosniff',
      crossOriginEmbedderPolicy: false,
    },
    rateLimiter: false,
    xssValidator: false,
    requestSizeLimiter: false,
    corsHandler: false,
    removeLoggers: false,
    sri: true,
    nonce: true,
  },
  hooks: {
    // The session routes of nuxt-auth-utils read h3's sealed session (and
    // make one for every anonymous request); ours in server/api/_auth/ read
    // the plain token cookie. The module stays for useUserSession() and
    // password hashing.
    'nitro:config'(config) {
      config.handlers = (config.handlers ?? []).filter(h => h?.route !== '/api/_auth/session')
    },
    // Export files are written on worker threads (server/services/export-pool.ts):
    // their entry is bundled beside the server's once Nitro has built it. In
    // `nuxt dev` there is none and the files are made in the server's thread.
    'nitro:init'(nitro) {
      if (nitro.options.dev) return
      nitro.hooks.hook('compiled', () => bundleExportWorker(join(nitro.options.output.serverDir, 'export-worker.mjs')))
    },
  },
  nitro: {
    externals: { external: ['paper'] },
    // The template font travels inside the server build (read with useStorage('assets:fonts')).
    serverAssets: [{
      baseName: 'fonts',
      dir: fileURLToPath(new URL('./node_modules/@fontsource/ibm-plex-sans/files', import.meta.url)),
      pattern: 'ibm-plex-sans-latin-400-normal.woff',
    }],
  },
})

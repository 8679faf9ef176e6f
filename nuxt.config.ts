// Rootplate: Nuxt 4 with the repository root as the source folder.
import { fileURLToPath } from 'node:url'

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils'],
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

import { readFileSync } from 'node:fs'
import { SHEET_FONT_FILES } from './server/records/sheetFonts'

const { version } = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as { version: string }

export default defineNuxtConfig({
  compatibilityDate: '2025-07-15',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', '@sidebase/nuxt-auth', 'nuxt-security'],
  // Response headers (CSP with a per-response nonce, no framing, nosniff, no referrer) and no
  // x-powered-by come from nuxt-security. Its request-size limiter skips PATCH and chunked bodies,
  // its rate limiter counts per process and its XSS filter rewrites input, so those three are off:
  // server/middleware/requestGuard.ts limits bodies and the database-backed sign-in limits count.
  security: {
    headers: {
      contentSecurityPolicy: {
        'base-uri': ['\'none\''],
        'default-src': ['\'self\''],
        'connect-src': ['\'self\''],
        'font-src': ['\'self\''],
        'form-action': ['\'self\''],
        'frame-ancestors': ['\'none\''],
        'img-src': ['\'self\'', 'data:'],
        'object-src': ['\'none\''],
        'script-src-attr': ['\'none\''],
        'style-src': ['\'self\'', '\'unsafe-inline\''],
        'script-src': ['\'self\'', '\'strict-dynamic\'', '\'nonce-{{nonce}}\''],
        // Shops serve Slakewise over plain HTTP on loopback or their LAN as well as behind TLS.
        'upgrade-insecure-requests': false,
      },
      xFrameOptions: 'DENY',
      referrerPolicy: 'same-origin',
      // HSTS is the TLS proxy's to send: on plain HTTP it would lock browsers out of the LAN address.
      strictTransportSecurity: false,
      crossOriginEmbedderPolicy: false,
    },
    corsHandler: false,
    requestSizeLimiter: false,
    rateLimiter: false,
    xssValidator: false,
    removeLoggers: false,
  },
  css: [
    '@fontsource/ibm-plex-sans/latin-400.css',
    '@fontsource/ibm-plex-sans/latin-500.css',
    '@fontsource/ibm-plex-sans/latin-600.css',
    '~/assets/css/main.css',
  ],
  app: {
    head: {
      title: 'Slakewise',
      htmlAttrs: { lang: 'en' },
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Soak, quench-to-handling and cooldown records for heat-treatment shops.' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  auth: {
    baseURL: '/api/auth',
    originEnvKey: 'AUTH_ORIGIN',
    provider: { type: 'authjs', trustHost: false, defaultProvider: 'credentials', addDefaultCallbackUrl: true },
    // Pages are guarded by our own global middleware (middleware/auth.global.ts), which also checks roles.
    globalAppMiddleware: false,
    sessionRefresh: { enablePeriodically: false, enableOnWindowFocus: false },
  },
  runtimeConfig: {
    authSecret: '', // NUXT_AUTH_SECRET
    recordSealKey: '', // NUXT_RECORD_SEAL_KEY: seals cooldown records and sign-offs (HMAC-SHA-256)
    shopName: 'Slakewise', // NUXT_SHOP_NAME: printed on hold-time sheets
    loadPrefix: 'SW', // NUXT_LOAD_PREFIX: load numbers start with it (the shop's initials)
    siteOrigin: '', // NUXT_SITE_ORIGIN: where links in mail point (default: AUTH_ORIGIN without /api/auth)
    databaseUrl: '', // NUXT_DATABASE_URL (DATABASE_URL is read too)
    engineWorkers: 0, // NUXT_ENGINE_WORKERS: engine worker threads per server process (0: one per core but one)
    engineJobSeconds: 8, // NUXT_ENGINE_JOB_SECONDS: longest one engine job may run before it is stopped with a 422
    public: { appVersion: version },
  },
  // Index checks stay off: the numerical core indexes typed arrays in tight loops,
  // where `noUncheckedIndexedAccess` would add noise, not safety.
  typescript: {
    strict: true,
    tsConfig: { compilerOptions: { noUncheckedIndexedAccess: false } },
    sharedTsConfig: { compilerOptions: { noUncheckedIndexedAccess: false } },
    nodeTsConfig: { compilerOptions: { noUncheckedIndexedAccess: false } },
  },
  nitro: {
    // Bundles and fonts are served pre-compressed (gzip and brotli) when the browser accepts it.
    compressPublicAssets: { gzip: true, brotli: true },
    typescript: { tsConfig: { compilerOptions: { noUncheckedIndexedAccess: false } } },
    // The PDF sheet reads Plex's font files at run time; listed, the build copies them beside the server.
    externals: { traceInclude: SHEET_FONT_FILES },
  },
})

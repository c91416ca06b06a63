// Densitas: Nuxt 4 with the flat layout (no app/ folder), so the project root is the source dir.
import { API_POLICY, BASE_PAGE_POLICY } from './server/utils/security-headers'

// Uploaded log files, relative to the working directory (server/utils/uploads.ts).
const UPLOADS_DIR = './data/uploads'

export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint'],
  // Production pages also get a content security policy (the dev server's inline scripts would not pass it).
  $production: {
    routeRules: {
      '/**': { headers: { 'content-security-policy': BASE_PAGE_POLICY } },
      '/api/**': { headers: { 'content-security-policy': API_POLICY } },
    },
  },
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Densitas',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Charge-air temperature and heat-soak analysis for tuning and fabrication workshops.' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  // Defaults only: each key is overridden at run time by its NUXT_* variable
  // (DATABASE_URL and UPLOADS_DIR are also honoured, see server/utils/config.ts).
  runtimeConfig: {
    databaseUrl: './data/densitas.sqlite',
    // Where uploaded logs are kept (README, "Where uploads are kept"): `dir` on this machine holds
    // files being received and, with the fs driver, the stored logs (NUXT_UPLOADS_DIR). Another
    // unstorage driver by name (NUXT_UPLOADS_DRIVER=s3) takes its options as JSON (NUXT_UPLOADS_OPTIONS).
    uploads: {
      dir: UPLOADS_DIR,
      driver: 'fs',
      options: {},
    },
    migrationsDir: './db/migrations',
    seedDemo: true,
    // Behind a reverse proxy (NUXT_TRUST_PROXY=true), take the client address from X-Forwarded-For
    // and the public host and scheme from X-Forwarded-Host/-Proto. Otherwise those headers are ignored.
    trustProxy: false,
    // Log import and analysis run in worker threads: `threads` at once (0: one less than the
    // cores, at least one), `queue` more waiting; past that an upload is answered 503 "busy".
    analysis: {
      threads: 0,
      queue: 4,
      // Set by modules/analysis-worker.ts in development; empty means beside the built server.
      workerPath: '',
    },
    // Failed sign-ins: free tries per address and client before the wait starts doubling (up to
    // maxDelaySeconds); failures per client before it waits out the window. See server/utils/login-limit.ts.
    loginLimit: {
      perEmail: 5,
      perIp: 30,
      windowMinutes: 15,
      maxDelaySeconds: 900,
    },
    // nuxt-auth-utils: the sealed cookie expires 14 days after it was issued (NUXT_SESSION_MAX_AGE,
    // seconds); the server also refuses a sign-in older than that, however often it was refreshed.
    session: {
      maxAge: 14 * 24 * 60 * 60,
    },
    // E-mail (see server/utils/mail-config.ts): SMTP_URL, MAIL_FROM and MAIL_RETRY_DELAYS win.
    mail: {
      smtpUrl: '',
      from: 'Densitas <no-reply@densitas.invalid>',
      retryDelays: '10s,1m,5m,30m',
      sweepSeconds: 5,
    },
    public: {
      appUrl: 'http://localhost:3000',
    },
  },
  srcDir: '.',
  // Headers for every response, static files and errors included (pages get their own script
  // hashes on top, server/plugins/security-headers.ts). The shared report sends no referrer, so a
  // link clicked on it does not carry the report's address; private JSON is never cached.
  routeRules: {
    '/**': {
      headers: {
        'x-frame-options': 'DENY',
        'x-content-type-options': 'nosniff',
        'referrer-policy': 'same-origin',
      },
    },
    '/shared/**': { headers: { 'referrer-policy': 'no-referrer' } },
    '/api/**': { headers: { 'cache-control': 'no-store' } },
    '/api/health': { headers: { 'cache-control': 'no-cache' } },
  },
  compatibilityDate: '2026-11-01',
  nitro: {
    experimental: { tasks: false },
    // The default uploads mount; mounted again at start-up from runtime config above.
    storage: {
      uploads: { driver: 'fs', base: UPLOADS_DIR },
    },
    // The shipped font, bundled into the server for quote PDFs (nothing is read from node_modules
    // at run time). Paths are relative to server/.
    serverAssets: [{ baseName: 'fonts', dir: '../node_modules/@fontsource/roboto-flex/files', pattern: 'roboto-flex-latin-400-normal.woff' }],
  },
  typescript: {
    strict: true,
  },
  telemetry: false,
  eslint: {
    config: { stylistic: true },
  },
  // Our stylesheet carries the @tailwind layers, the font and the base element styles.
  tailwindcss: {
    cssPath: '~/assets/css/main.css',
  },
})

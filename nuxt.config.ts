// Densitas: Nuxt 4 with the flat layout (no app/ folder), so the project root is the source dir.
export default defineNuxtConfig({
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint'],
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
    uploadsDir: './data/uploads',
    migrationsDir: './db/migrations',
    seedDemo: true,
    // Behind a reverse proxy, take the client address from X-Forwarded-For (for the sign-in limits).
    trustProxy: false,
    // Log import and analysis run in worker threads: `threads` at once (0: one less than the
    // cores, at least one), `queue` more waiting; past that an upload is answered 503 "busy".
    analysis: {
      threads: 0,
      queue: 4,
      // Set by modules/analysis-worker.ts in development; empty means beside the built server.
      workerPath: '',
    },
    loginLimit: {
      perEmail: 5,
      perIp: 30,
      windowMinutes: 15,
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
  compatibilityDate: '2026-11-01',
  nitro: {
    experimental: { tasks: false },
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

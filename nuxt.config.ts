// Densitas: Nuxt 4 with the flat layout (no app/ folder), so the project root is the source dir.
export default defineNuxtConfig({
  srcDir: '.',
  compatibilityDate: '2026-11-01',
  telemetry: false,
  devtools: { enabled: false },
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint'],
  eslint: {
    config: { stylistic: true },
  },
})

import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

// Four tiers, one command: `vitest run` runs them all; `--project NAME` runs one.
// api and e2e share one built server each (tests/setup/server.ts); their files run one at a time
// because they share that server's database.
export default defineConfig({
  test: {
    projects: [
      {
        // Pure helpers under utils/ import the shared catalogues as Nuxt spells them (#shared/…):
        // a relative import from app code into shared/ breaks the server build.
        resolve: { alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      await defineVitestProject({
        test: {
          name: 'nuxt',
          include: ['tests/nuxt/**/*.test.ts'],
          environment: 'nuxt',
          // Starting the Nuxt environment takes over 10 s on a loaded 2-core machine.
          hookTimeout: 60_000,
        },
      }),
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/server.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/server.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
})

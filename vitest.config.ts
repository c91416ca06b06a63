import { defineConfig } from 'vitest/config'

// Four tiers, one command: `vitest run` runs them all; `--project NAME` runs one.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
    ],
  },
})

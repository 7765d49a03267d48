import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url))

export default defineConfig({
  // The aliases Nuxt sets up, so tests can import shared/ and server/ code the way the app does.
  resolve: {
    alias: {
      '#shared': here('./shared'),
      '~~': here('.'),
      '@@': here('.'),
      '~': here('.'),
      '@': here('.'),
    },
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
          // The files share one database, the app and the fake inbox.
          fileParallelism: false,
        },
      },
    ],
  },
})

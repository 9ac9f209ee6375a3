import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

// Three projects: pure domain code, the built server over HTTP, and real Chromium.
// The server and browser projects start the built app (.output) against cuspline_test.
export default defineConfig({
  test: {
    reporters: ['default', './tests/helpers/summary-reporter.ts'],
    projects: [
      {
        // Composables under test import pure code through Nuxt's #shared alias.
        resolve: { alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
        test: {
          name: 'unit',
          environment: 'node',
          include: ['tests/unit/**/*.test.ts'],
          // Property tests run hundreds of cases; on a loaded 2-core machine 5 s is too tight to mean anything.
          testTimeout: 30_000,
        },
      },
      {
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-server.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'browser',
          environment: 'node',
          include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/helpers/global-server.ts'],
          testTimeout: 90_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
})

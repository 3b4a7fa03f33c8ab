import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

// The plain-node layers resolve Nuxt's `#shared` and `#server` aliases and our `#domain` themselves.
const alias = {
  '#shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '#server': fileURLToPath(new URL('./server', import.meta.url)),
  '#domain': fileURLToPath(new URL('./server/domain', import.meta.url)),
}

// Four layers, mirroring the source tree. e2e and browser share one built server and one set
// of service fakes, started by scripts/test.ts against the throwaway database `npm test`
// prepared and handed on by tests/support/global-server.ts.
export default defineConfig({
  test: {
    projects: [
      {
        resolve: { alias },
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
          setupFiles: ['tests/nuxt/setup.ts'],
        },
      }),
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          // The health test stops PostgreSQL for a moment: no browser test may run meanwhile.
          sequence: { groupOrder: 1 },
          globalSetup: ['tests/support/global-server.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          sequence: { groupOrder: 2 },
          globalSetup: ['tests/support/global-server.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
})

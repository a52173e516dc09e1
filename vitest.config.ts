import { defineConfig } from 'vitest/config'
import { fileURLToPath } from 'node:url'

const root = fileURLToPath(new URL('.', import.meta.url))
const alias = { '#shared': `${root}shared`, '~~': root, '@@': root }

/**
 * Test projects:
 * - unit: pure code (engine, schemas, helpers), node environment, no services; property tests
 *   from a fixed seed (tests/support/fast-check-seed.ts).
 * - db: real PostgreSQL, throw-away databases (see tests/db/setup.ts).
 * - api: HTTP end-to-end against the built server (.output), one server per file.
 * - browser: Debian's Chromium through playwright-core against the built server.
 */
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: 'unit', environment: 'node', include: ['tests/unit/**/*.test.ts'], setupFiles: ['tests/support/fast-check-seed.ts'] },
      },
      {
        resolve: { alias },
        test: {
          name: 'db', environment: 'node', include: ['tests/db/**/*.test.ts'],
          globalSetup: ['tests/support/global-services.ts'], testTimeout: 30_000, hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api', environment: 'node', include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/support/global-services.ts'], testTimeout: 30_000, hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'browser', environment: 'node', include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/support/global-services.ts'], testTimeout: 60_000, hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
})

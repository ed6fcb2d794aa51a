import { defineConfig } from 'vitest/config'

// Three tiers: `unit` needs nothing running; `api` and `e2e` share a global setup
// that brings up MariaDB, the mail catcher and the built server (tests/setup/).
// groupOrder runs the tiers one after another: the api tier stops and restarts the
// test database, which must not happen under a browser test.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          sequence: { groupOrder: 0 },
          environment: 'node',
          include: ['tests/unit/**/*.test.ts'],
        },
      },
      {
        test: {
          name: 'api',
          sequence: { groupOrder: 1 },
          environment: 'node',
          include: ['tests/api/**/*.test.ts'],
          globalSetup: ['tests/setup/stack.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          sequence: { groupOrder: 2 },
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/setup/stack.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
})

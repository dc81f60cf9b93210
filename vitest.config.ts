import { defineConfig } from 'vitest/config'

// Five projects. Unit tests are pure and start nothing; the stand-ins' tests start only the stand-in. Integration tests (real PostgreSQL) and
// end-to-end tests (the built client in Chromium) share a throwaway PostgreSQL cluster from the global
// setup, started once for the run and removed afterwards.
//
// Time limits are a safety net for a hung test, not a measure: tests wait on states (an element, a
// row, a mail), so they are generous enough for a machine with every core busy.
const withDatabase = { globalSetup: ['tests/setup/global-setup.ts'] }

export default defineConfig({
  test: {
    environment: 'node',
    maxWorkers: 2,
    reporters: ['default'],
    projects: [
      { extends: true, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], testTimeout: 30_000 } },
      // The local stand-ins of Stripe and Meilisearch, tested through the official SDKs on their own.
      { extends: true, test: { name: 'standins', include: ['tests/standins/**/*.test.ts'], testTimeout: 60_000 } },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          ...withDatabase,
          testTimeout: 60_000,
          hookTimeout: 120_000,
          // expect.poll waits on a state; the ceiling is for a busy machine (Vitest's own default is 1 s).
          expect: { poll: { timeout: 30_000 } },
        },
      },
      // PostgreSQL, the search engine and the mail catcher stopped and started under load; its own cluster.
      { extends: true, test: { name: 'outage', include: ['tests/outage/**/*.test.ts'], testTimeout: 400_000, hookTimeout: 180_000 } },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          ...withDatabase,
          setupFiles: ['tests/setup/e2e-failures.ts'],
          testTimeout: 180_000,
          hookTimeout: 180_000,
          expect: { poll: { timeout: 60_000 } },
        },
      },
    ],
  },
})

import { defineConfig } from 'vitest/config'

// One config for every test: unit tests are pure; integration and end-to-end tests get a throwaway
// PostgreSQL cluster from the global setup (started once for the whole run, removed afterwards).
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/setup/global-setup.ts'],
    maxWorkers: 2,
    testTimeout: 20_000,
    hookTimeout: 60_000,
    reporters: ['default'],
  },
})

import { defineConfig } from 'vitest/config';

/**
 * Server tests: supertest on createApp() against the real PostgreSQL of `npm test` (TEST_PG_URL).
 * Each test file gets its own database copied from a migrated template (test/support/).
 */
export default defineConfig({
  test: {
    environment: 'node',
    include: ['test/server/**/*.test.ts'],
    globalSetup: ['test/support/server-global-setup.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    maxWorkers: 2,
  },
});

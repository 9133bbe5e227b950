import { defineConfig } from 'vitest/config';

/**
 * Browser tests: Debian's Chromium driven by playwright-core against the built app, served by one
 * real Shelfmatch server on the `npm test` database cluster (see test/support/browser-server.ts).
 */
export default defineConfig({
  test: {
    environment: 'node',
    include: ['test/browser/**/*.test.ts'],
    globalSetup: ['test/support/browser-global-setup.ts'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    // One browser at a time: two cores, and the journeys share the demo database.
    fileParallelism: false,
  },
});

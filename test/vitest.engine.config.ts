import { defineConfig } from 'vitest/config';

/** Engine tests: pure TypeScript from shared/, no database, no browser. */
export default defineConfig({
  test: {
    environment: 'node',
    include: ['test/engine/**/*.test.ts'],
    testTimeout: 60_000,
  },
});

/**
 * Extra vitest settings for the Angular unit tests (`ng test`, angular.json "runnerConfig"). The
 * component tests drive Material harnesses through real change detection; on a shared two-core
 * machine running other suites at once a test can pass 5 s, vitest's default limit, without being
 * wrong, so the limit is raised. Timings belong in `npm run bench`, not here.
 */
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    testTimeout: 20_000,
  },
});

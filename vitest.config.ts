import { configDefaults, defineConfig } from 'vitest/config';

// Unit tests: every *.test.ts under test/ that runs in Node (core, and web/db with fake-indexeddb).
// Browser tests have their own config (test/browser/vitest.config.ts); helpers live in test/support.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: [...configDefaults.exclude, 'test/browser/**', 'test/support/**'],
    environment: 'node',
    // Property tests: one seed a run, fixed in CI, printed at the start (test/support/property-seed.ts).
    globalSetup: ['test/support/property-seed.ts'],
    setupFiles: ['test/support/property-seed-setup.ts'],
    pool: 'threads',
    testTimeout: 30_000,
  },
});

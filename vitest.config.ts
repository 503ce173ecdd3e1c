import { configDefaults, defineConfig } from 'vitest/config';

// Unit tests: every *.test.ts under test/ that runs in Node (core, and web/db with fake-indexeddb).
// Browser tests have their own config (test/browser/vitest.config.ts); helpers live in test/support.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: [...configDefaults.exclude, 'test/browser/**', 'test/support/**'],
    environment: 'node',
    pool: 'threads',
    testTimeout: 30_000,
  },
});

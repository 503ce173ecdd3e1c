import { defineConfig } from 'vitest/config';

// Unit tests: core in Node, web/db in Node with fake-indexeddb. Browser tests have their own config.
export default defineConfig({
  test: {
    include: ['test/core/**/*.test.ts', 'test/db/**/*.test.ts', 'test/web/**/*.test.ts', 'test/tools/**/*.test.ts', 'test/office/**/*.test.ts'],
    environment: 'node',
    pool: 'threads',
    testTimeout: 30_000,
  },
});

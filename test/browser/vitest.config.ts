import { defineConfig } from 'vitest/config';

// Browser tests drive Debian Chromium through playwright-core against the built app.
// One file at a time: each starts its own preview server and browser, and this machine has 2 cores.
export default defineConfig({
  test: {
    include: ['test/browser/**/*.test.ts'],
    globalSetup: ['test/support/browser/global-setup.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});

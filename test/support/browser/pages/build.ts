// Builds the storage test page (test/support/browser/pages) into dist-test-pages/ for the browser test and benchmark.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { ROOT } from '../harness';

/** Folder (relative to the repo root) the storage test page is built into. */
export const DB_PAGES_DIR = 'dist-test-pages';

/** Builds the storage test page with its own Vite config; throws when the build fails. */
export function buildDbPages(): void {
  const r = spawnSync(process.execPath, [join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '-c', 'test/support/browser/pages/vite.config.ts'], {
    cwd: ROOT,
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  if (r.status !== 0) throw new Error('vite build of test/support/browser/pages failed');
}

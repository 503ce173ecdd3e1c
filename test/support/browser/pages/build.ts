// Builds the storage test page (test/support/browser/pages) into dist-test-pages/ for the browser test and benchmark.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { launchBrowser, ROOT, startPreview } from '../harness';

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

/**
 * Builds the test pages, serves them on 127.0.0.1:`port`, launches Chromium and opens `name` (db.html,
 * logger.html, plot.html) once the page says it is ready. `close` closes the browser and stops the server.
 */
export async function openTestPage(port: number, name: string): Promise<{ page: Page; close: () => Promise<void> }> {
  buildDbPages();
  const server = await startPreview(port, DB_PAGES_DIR);
  const browser = await launchBrowser().catch(async (e: unknown) => {
    await server.stop();
    throw e;
  });
  const close = async (): Promise<void> => {
    await browser.close();
    await server.stop();
  };
  try {
    const page = await browser.context.newPage();
    await page.goto(`${server.url}${name}`);
    await page.waitForFunction(() => document.body.dataset.ready === 'true');
    return { page, close };
  } catch (e) {
    await close();
    throw e;
  }
}

// The update flow: build A is visited, then build B (another version string) is served. The page shows
// that an update is ready and is not reloaded; accepting starts B; a second tab that did not ask is
// never reloaded.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_SITE_ID } from '../../core';
import { ARTIFACTS, launchBrowser, ROOT, startPreview, type Browser, type Preview } from '../support/browser/harness';

const PORT = 4182;
let server: Preview | undefined;
let browser: Browser;

function build(version: string, outDir: string): void {
  const r = spawnSync(process.execPath, [join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: ROOT,
    env: { ...process.env, FRESHET_VERSION: version, FRESHET_OUT_DIR: outDir },
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`build ${version} failed:\n${r.stderr}`);
}

/** Marks the page's JavaScript realm: the mark is gone if the page reloads. */
async function mark(page: Page, name: string): Promise<void> {
  await page.evaluate((n) => ((window as unknown as Record<string, string>).__mark = n), name);
}
async function markOf(page: Page): Promise<string | undefined> {
  return page.evaluate(() => (window as unknown as Record<string, string | undefined>).__mark);
}
async function versionShown(page: Page): Promise<string | null> {
  await page.goto(page.url().replace(/#.*$/, '') + '#/about');
  return page.locator('[data-testid="app-version"]').textContent();
}

beforeAll(() => {
  build('0.0.1-test-a', 'dist-update-a');
  build('0.0.2-test-b', 'dist-update-b');
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

it('offers build B, keeps pages that did not ask, saves the open form, and starts B when accepted', async () => {
  server = await startPreview(PORT, 'dist-update-a');
  browser = await launchBrowser();
  const page = await browser.context.newPage();
  // Hold back the reading form's own draft timer (300 ms) in this page, so that only the
  // save-before-update step can keep what is typed just before the update is accepted.
  await page.addInitScript(() => {
    const realSetTimeout = window.setTimeout;
    window.setTimeout = ((fn: TimerHandler, delay?: number, ...args: unknown[]) =>
      delay === 300 ? realSetTimeout(() => undefined, 2 ** 31 - 1) : realSetTimeout(fn, delay, ...args)) as typeof window.setTimeout;
  });
  await page.goto(server.url + '#/about');
  await page.waitForFunction(() => !!navigator.serviceWorker.controller);
  expect(await versionShown(page)).toBe('0.0.1-test-a');
  const other = await browser.context.newPage();
  await other.goto(server.url + '#/about');
  await other.waitForFunction(() => !!navigator.serviceWorker.controller);

  // A technician is part-way through a reading when the new version arrives.
  await page.goto(server.url + '#/sites');
  await page.getByRole('button', { name: 'Load the demo site' }).click();
  await page.waitForURL(new RegExp(`#/sites/${DEMO_SITE_ID}$`), { timeout: 60_000 });
  await page.goto(server.url + `#/record/${DEMO_SITE_ID}`);
  await page.locator('#stage').waitFor();

  await server.stop();
  server = await startPreview(PORT, 'dist-update-b');
  await mark(page, 'before-update');
  await mark(other, 'other-tab');
  // The app checks on its own when it returns to the foreground; here the check is asked for directly.
  await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
  const notice = page.locator('[data-testid="update-notice"]');
  await notice.waitFor({ timeout: 20_000 });
  await page.screenshot({ path: join(ARTIFACTS, 'update-ready.png') });
  // Shown, not applied: same page, same version, the new worker waiting.
  expect(await markOf(page)).toBe('before-update');
  const waiting = await page.evaluate(async () => !!(await navigator.serviceWorker.getRegistration())?.waiting);
  expect(waiting).toBe(true);

  await page.locator('#stage').fill('0.61');
  await page.locator('#note').fill('typed just before the update');
  const reloaded = page.waitForEvent('load');
  await notice.getByRole('button', { name: 'Start new version' }).click();
  await reloaded;
  expect(await markOf(page)).toBeUndefined();
  await page.locator('#stage').waitFor();
  await expect(page.locator('#stage').inputValue()).resolves.toBe('0.61');
  await expect(page.locator('#note').inputValue()).resolves.toBe('typed just before the update');
  expect(await versionShown(page)).toBe('0.0.2-test-b');

  // The other tab was not reloaded: it keeps its state and is told a newer version runs elsewhere.
  await other.getByText('A newer version started in another tab').waitFor({ timeout: 10_000 });
  expect(await markOf(other)).toBe('other-tab');
  expect(await other.locator('[data-testid="app-version"]').textContent()).toBe('0.0.1-test-a');
});

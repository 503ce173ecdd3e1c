// Storage in Chromium (real IndexedDB): a saved record survives a reload, and a 100,000-reading logger
// import completes with progress events, every reading stored and the series holding exactly those readings.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { buildDbPages, DB_PAGES_DIR } from '../support/browser/pages/build';

let server: Preview;
let browser: Browser;
let page: Page;

async function openPage(p: Page): Promise<void> {
  await p.goto(`${server.url}db.html`);
  await p.waitForFunction(() => document.body.dataset.ready === 'true');
}

beforeAll(async () => {
  buildDbPages();
  server = await startPreview(4311, DB_PAGES_DIR);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await openPage(page);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('web/db in Chromium', () => {
  it('keeps a saved site across a page reload', async () => {
    const id = await page.evaluate(() => window.freshetDbTest.saveSite());
    await page.reload();
    await page.waitForFunction(() => document.body.dataset.ready === 'true');
    expect(await page.evaluate((siteId) => window.freshetDbTest.siteName(siteId), id)).toBe('Birchwater Brook at Mill Lane');
  });

  it('imports 100,000 logger readings in one call with a progress event per batch', async () => {
    const result = await page.evaluate(() => window.freshetDbTest.importSample(100_000, 10_000));
    expect(result.imported).toBe(100_000);
    expect(result.stored).toBe(100_000);
    // exact: ten batches of 10,000.
    expect(result.progress).toEqual([10_000, 20_000, 30_000, 40_000, 50_000, 60_000, 70_000, 80_000, 90_000, 100_000]);
    // The series holds exactly the imported readings, position by position (time, stage, source), as the
    // readings store lists them too.
    expect(result.seriesLength).toBe(100_000);
    expect(result.seriesMismatches).toBe(0);
    // exact: 100,000 quarter hours from midnight UTC fill 1,041 whole UTC days and 64 readings of one more.
    expect(result.seriesChunks).toBe(1_042);
  }, 300_000); // about a minute on a busy 2-core machine; the speed itself is the benchmark's business

  it('answers the storage state with a usage estimate', async () => {
    const state = await page.evaluate(() => window.freshetDbTest.storageState());
    expect(typeof state.persisted).toBe('boolean');
    expect(state.usage_bytes).toBeGreaterThan(0);
    expect(state.quota_bytes).toBeGreaterThan(state.usage_bytes ?? 0);
  });
});

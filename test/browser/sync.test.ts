// Sync in Chromium against the built app and a real bundle endpoint on another origin (127.0.0.1, another
// port, CORS with preflights, test/support/browser/test-endpoint.ts). Connectivity is asserted through what
// the endpoint received, never through navigator.onLine (Debian's Chromium reports it wrongly after an
// offline reload from the service worker).
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { formatRev, makeBundle, type SyncRecord } from '../../core';
import { launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { goByHash, until } from '../support/browser/app';
import { seriousViolations } from '../support/browser/axe';
import { startTestEndpoint, type TestEndpoint } from '../support/browser/test-endpoint';

const APP_PORT = 4490;
const ENDPOINT_PORT = 4491;
let server: Preview;
let endpoint: TestEndpoint;
let phoneA: Browser;
let phoneB: Browser;
let a: Page;
let b: Page;
let siteId = '';

async function open(browser: Browser): Promise<Page> {
  const page = await browser.context.newPage();
  await page.goto(server.url);
  await page.waitForFunction(() => !!navigator.serviceWorker.controller, undefined, { timeout: 15_000 });
  return page;
}

const go = goByHash;

async function setEndpoint(page: Page, token: string): Promise<void> {
  await go(page, '#/sync');
  await page.locator('#sync-base').fill(endpoint.base);
  await page.locator('#sync-token').fill(token);
  await page.getByRole('button', { name: 'Save endpoint' }).click();
  await page.getByText('Saved.').waitFor();
}

async function recordReading(page: Page, stage: string): Promise<void> {
  await go(page, `#/record/${siteId}`);
  await page.locator('#stage').fill(stage);
  await page.getByRole('button', { name: 'Save reading' }).click();
  await page.locator('[data-testid="saved"]').waitFor();
}

async function waitingText(page: Page): Promise<string> {
  await go(page, '#/sync');
  return (await page.locator('[data-testid="waiting"]').textContent()) ?? '';
}

/** Every synced record on the page's device as "kind id rev", sorted (the test may look into IndexedDB). */
function storedVersions(page: Page): Promise<string[]> {
  return page.evaluate(
    () =>
      new Promise<string[]>((resolve, reject) => {
        const req = indexedDB.open('freshet');
        req.onerror = () => reject(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const stores = ['sites', 'readings', 'gaugings', 'ratings', 'analyses'];
          const tx = db.transaction(stores);
          const out: string[] = [];
          for (const s of stores) {
            const all = tx.objectStore(s).getAll();
            all.onsuccess = () => out.push(...(all.result as { id: string; rev: string }[]).map((r) => `${s} ${r.id} ${r.rev}`));
          }
          tx.oncomplete = () => {
            db.close();
            resolve(out.sort());
          };
        };
      }),
  );
}

/** Each record version the endpoint stored, as "kind id rev"; duplicates would show twice. */
const received = () => endpoint.records().map((r) => `${r.kind} ${r.id} ${r.rev}`);
const receivedOnce = () => new Set(received()).size === received().length;

beforeAll(async () => {
  server = await startPreview(APP_PORT);
  endpoint = await startTestEndpoint(ENDPOINT_PORT, server.url, { 'tok-a': 'phone-a', 'tok-b': 'phone-b' });
  phoneA = await launchBrowser();
  a = await open(phoneA);
  a.on('pageerror', (e) => console.log('page error:', e.message));
});

afterAll(async () => {
  await phoneA?.close();
  await phoneB?.close();
  await endpoint?.stop();
  await server?.stop();
});

describe('push to an office endpoint on another origin', () => {
  it('sends readings recorded offline exactly once when the network returns', async () => {
    await setEndpoint(a, 'tok-a');
    await a.getByTestId('last-success').filter({ hasNotText: 'not yet' }).waitFor();
    expect(endpoint.preflights).toBeGreaterThan(0);
    await phoneA.context.setOffline(true);
    await go(a, '#/sites/new');
    await a.locator('#site-code').fill('SB-3');
    await a.locator('#site-name').fill('Sedge Beck at stone bridge');
    await a.locator('#site-jumpLimit').fill('0.3');
    await a.getByRole('button', { name: 'Save site' }).click();
    await a.getByRole('heading', { name: 'Sedge Beck at stone bridge' }).waitFor();
    siteId = decodeURIComponent((await a.evaluate(() => location.hash)).split('/')[2]);
    await recordReading(a, '0.41');
    await recordReading(a, '0.43');
    // The push attempt after the change fails for want of a network: shown, and the records wait.
    await go(a, '#/sync');
    await a.getByTestId('problem').filter({ hasText: 'No connection to the office' }).waitFor({ timeout: 20_000 });
    expect(await waitingText(a)).toBe('3 records');
    expect(endpoint.records()).toEqual([]);
    await phoneA.context.setOffline(false);
    await until('the endpoint holds the site and both readings', () => endpoint.records().length >= 3);
    expect(receivedOnce()).toBe(true);
    expect(endpoint.records().map((r) => r.kind).sort()).toEqual(['reading', 'reading', 'site']);
    await until('the phone shows nothing waiting', async () => (await waitingText(a)) === 'nothing');
    expect(await seriousViolations(a)).toEqual([]);
  });

  it('keeps the records through a 503 and sends them once when the endpoint recovers', async () => {
    endpoint.queue.push('busy');
    const before = endpoint.pushes.length;
    await recordReading(a, '0.45');
    await until('the retry after Retry-After: 1 was stored', () => endpoint.records().length === 4);
    const attempts = endpoint.pushes.slice(before);
    expect(attempts.map((p) => p.status)).toEqual([503, 201]);
    expect(attempts[0].key).toBe(attempts[1].key);
    expect(receivedOnce()).toBe(true);
  });

  it('shows a 401 as a token problem and keeps the records waiting', async () => {
    await setEndpoint(a, 'tok-wrong');
    await recordReading(a, '0.47');
    await a.evaluate(() => (location.hash = '#/sync'));
    await a.getByTestId('problem').filter({ hasText: 'did not accept the token' }).waitFor({ timeout: 20_000 });
    expect(await a.getByTestId('problem').textContent()).toMatch(/^Needs your attention/);
    expect(await waitingText(a)).toBe('1 record');
    expect(endpoint.records()).toHaveLength(4);
    await setEndpoint(a, 'tok-a');
    await until('the fixed token delivers the reading', () => endpoint.records().length === 5);
    expect(receivedOnce()).toBe(true);
  });

  it('does not take a captive-portal page answered with 200 as delivered', async () => {
    endpoint.queue.push('portal');
    await recordReading(a, '0.49');
    await a.evaluate(() => (location.hash = '#/sync'));
    await a.getByTestId('problem').filter({ hasText: 'Something other than the office answered' }).waitFor({ timeout: 20_000 });
    expect(await waitingText(a)).toBe('1 record');
    expect(endpoint.records()).toHaveLength(5);
    await a.getByRole('button', { name: 'Send and receive now' }).click();
    await until('the reading arrives on the next attempt', () => endpoint.records().length === 6);
    expect(receivedOnce()).toBe(true);
  });

  it('retries a push whose answer was lost after the endpoint stored it, without doubling it', async () => {
    endpoint.queue.push('drop-after-store');
    const before = endpoint.pushes.length;
    await recordReading(a, '0.51');
    await until('the endpoint stored the bundle and dropped the connection', () => endpoint.pushes.length > before);
    // The app (or Chromium itself, which may resend a request whose reused connection died before any
    // answer) sends the same bundle again; "Send and receive now" stands in for the wait before a retry.
    await go(a, '#/sync');
    if ((await waitingText(a)) !== 'nothing') await a.getByRole('button', { name: 'Send and receive now' }).click();
    await until('the phone has nothing waiting', async () => (await waitingText(a)) === 'nothing');
    const attempts = endpoint.pushes.slice(before);
    expect(attempts.map((p) => p.status)).toEqual(['dropped', 200]);
    expect(endpoint.records()).toHaveLength(7);
    expect(receivedOnce()).toBe(true);
  });
});

describe('pull', () => {
  it('brings a new rating from the office and the discharges follow', async () => {
    await go(a, `#/sites/${siteId}`);
    await a.locator('.reading-row').first().waitFor();
    expect(await a.locator('.reading-row .hint').first().textContent()).toMatch(/^no rating/);
    const now = Date.now();
    // Invented rating Q = 10·(h − 0.2)², gauged 0.3–1.5 m: at 0.51 m, Q = 10 · 0.31² = 0.961 m³/s (exact).
    const rating = {
      kind: 'rating', id: '7d3b9a40-5c1e-4f2a-8b6d-00000000c001', rev: formatRev({ wall_ms: now - 1000, counter: 0, deviceId: 'office' }),
      body: {
        siteId, validFrom_ms: now - 30 * 86_400_000, segments: [{ fromStage_m: 0.2, coefficient: 10, offset_m: 0.2, exponent: 2 }],
        gaugedRange_m: [0.3, 1.5], shifts: [], fittedFrom: [], note: 'Office rating 1', updated_ms: now - 1000,
      },
    } as SyncRecord;
    endpoint.addFromOffice(makeBundle({ id: '7d3b9a40-5c1e-4f2a-8b6d-00000000b001', device: 'office', created_ms: now, records: [rating] }));
    await go(a, '#/sync');
    await a.getByRole('button', { name: 'Send and receive now' }).click();
    await go(a, `#/sites/${siteId}`);
    await a.getByText('0.961 m³/s').waitFor({ timeout: 20_000 });
    // Q = 10·(h − 0.2)² at each stage recorded (exact analytic values, rounded to 3 significant figures).
    const main = (await a.locator('main').textContent()) ?? '';
    for (const q of ['0.441', '0.529', '0.625', '0.729', '0.841', '0.961']) expect(main).toContain(`${q} m³/s`);
    expect(await a.locator('.reading-row .hint', { hasText: /^no rating/ }).count()).toBe(0);
  });

  it('brings two browser profiles to the same records', async () => {
    phoneB = await launchBrowser({ width: 1280, height: 800, touch: false });
    b = await open(phoneB);
    await setEndpoint(b, 'tok-b');
    await until('phone B pulled everything', async () => (await storedVersions(b)).length === 8);
    await recordReading(b, '0.62');
    await until('phone B’s reading reached the endpoint', () => endpoint.records().length === 9);
    await go(a, '#/sync');
    await a.getByRole('button', { name: 'Send and receive now' }).click();
    await until('both profiles hold the same versions', async () => JSON.stringify(await storedVersions(a)) === JSON.stringify(await storedVersions(b)));
    expect(await storedVersions(a)).toHaveLength(9);
    // The desktop-width layout has no sideways scroll.
    await go(b, '#/sync');
    expect(await b.evaluate(() => document.documentElement.scrollWidth <= innerWidth)).toBe(true);
    expect(await seriousViolations(b)).toEqual([]);
  });
});

describe('bundle files', () => {
  it('refuses a corrupt bundle file, says why, and changes nothing', async () => {
    await go(a, '#/sync');
    const [download] = await Promise.all([a.waitForEvent('download'), a.getByRole('button', { name: 'File of every record' }).click()]);
    const name = download.suggestedFilename();
    // What this Chromium's share sheet takes (printed for the record: headless Linux builds have none).
    console.log('share sheet:', await a.evaluate(() => typeof navigator.canShare !== 'function' ? 'none' : ['application/json', 'text/plain'].map((type) => `${type} ${navigator.canShare({ files: [new File(['{}'], type === 'text/plain' ? 'x.json.txt' : 'x.json', { type })] })}`).join(', ')));
    expect(name).toMatch(/^freshet-[\w-]{1,8}-\d{8}-\d{4}\.json$/);
    const text = readFileSync((await download.path()) as string, 'utf8');
    const good = JSON.parse(text) as { records: SyncRecord[] };
    expect(good.records).toHaveLength(9);
    const before = await storedVersions(a);
    const corrupt = text.replace('"stage_m":0.41', '"stage_m":0.14');
    expect(corrupt).not.toBe(text);
    await a.locator('#bundle-open').setInputFiles({ name: 'damaged.json', mimeType: 'application/json', buffer: Buffer.from(corrupt) });
    await a.getByTestId('files-status').filter({ hasText: 'do not match its checksum' }).waitFor();
    expect(await a.getByTestId('files-status').textContent()).toContain('Nothing was changed.');
    await a.locator('#bundle-open').setInputFiles({ name: 'newer.json', mimeType: 'application/json', buffer: Buffer.from(text.replace('"version":1', '"version":2')) });
    await a.getByTestId('files-status').filter({ hasText: 'newer version of Freshet' }).waitFor();
    expect(await storedVersions(a)).toEqual(before);
    // The good file shows what it would change before anything is added: here nothing is new.
    await a.locator('#bundle-open').setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(text) });
    await a.getByTestId('import-summary').filter({ hasText: '0 new, 0 updated, 0 to review, 9 already here or older' }).waitFor();
  });
});

describe('start', () => {
  it('sends records left waiting when the app was closed, on the next start', async () => {
    await phoneA.context.setOffline(true);
    await recordReading(a, '0.55');
    const count = endpoint.records().length;
    await a.close();
    await phoneA.context.setOffline(false);
    a = await phoneA.context.newPage();
    await a.goto(server.url);
    await until('the waiting reading arrives', () => endpoint.records().length === count + 1);
    expect(receivedOnce()).toBe(true);
  });
});

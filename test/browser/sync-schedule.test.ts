// When the phone talks to the office, in Chromium against the built app and the test endpoint on another
// origin: counted requests, not timings of this machine. The phone pulls when it opens, when the network
// returns, after a push and on request, otherwise at most every 15 minutes while visible, never from a
// hidden tab (issue 23). Time is run forward with Playwright's clock (it drives the app's own timers);
// connectivity is read from what the endpoint received and what the top bar says, never navigator.onLine
// (Debian's Chromium reports it wrongly after an offline reload from the service worker).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { goByHash, until as waitUntil } from '../support/browser/app';
import { startTestEndpoint, type TestEndpoint } from '../support/browser/test-endpoint';

const APP_PORT = 4494;
const ENDPOINT_PORT = 4495;
const MINUTE = 60_000;
let server: Preview;
let endpoint: TestEndpoint;
let phone: Browser;
/** The last good exchange the phone had stored when the page of the first test closed. */
let lastExchange = 0;

/** The shared until, polling every 100 ms as this file always has. */
const until = (what: string, check: () => boolean | Promise<boolean>, timeout_ms = 30_000) => waitUntil(what, check, timeout_ms, 100);

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Every request the office endpoint saw from this test's one phone: pulls, pushes and CORS preflights. */
const officeRequests = () => endpoint.pulls.length + endpoint.pushes.length + endpoint.preflights;

const go = goByHash;

/** The time of the last good exchange the phone stored (0 before any), read from IndexedDB. */
function lastSuccess(page: Page): Promise<number> {
  return page.evaluate(
    () =>
      new Promise<number>((resolve, reject) => {
        const req = indexedDB.open('freshet');
        req.onerror = () => reject(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const get = db.transaction('sync').objectStore('sync').get('status');
          get.onsuccess = () => {
            db.close();
            resolve((get.result as { lastSuccess_ms?: number } | undefined)?.lastSuccess_ms ?? 0);
          };
          get.onerror = () => reject(get.error);
        };
      }),
  );
}

/** Shows or hides the page as a phone does when the app goes to the background: visibilityState and its event. */
function setHidden(page: Page, hidden: boolean): Promise<void> {
  // Headless Chromium keeps every page visible, so the page's own document reports the state the app reads.
  return page.evaluate((h) => {
    Object.defineProperty(document, 'visibilityState', { configurable: true, get: () => (h ? 'hidden' : 'visible') });
    Object.defineProperty(document, 'hidden', { configurable: true, get: () => h });
    document.dispatchEvent(new Event('visibilitychange'));
  }, hidden);
}

/** Requests the page has started and not yet seen answered or failed. */
const inFlight = new WeakMap<Page, Set<unknown>>();

function trackRequests(page: Page): void {
  const open = new Set<unknown>();
  inFlight.set(page, open);
  page.on('request', (r) => void open.add(r));
  page.on('requestfinished', (r) => void open.delete(r));
  page.on('requestfailed', (r) => void open.delete(r));
}

/**
 * Runs the page's clock forward by `ms` the way time passes for an app left open: in steps shorter than
 * the app's 10 s network-check timeout, each followed by real time until every request the page started
 * has its answer. One long jump would fire that timeout before any answer could arrive, and the app
 * would rightly take the network for gone and then back (and pull on its return).
 */
async function idle(page: Page, ms: number, step_ms = 9000): Promise<void> {
  const open = inFlight.get(page)!;
  for (let done = 0; done < ms; done += step_ms) {
    await page.clock.runFor(Math.min(step_ms, ms - done));
    await until('the page’s requests are answered', async () => {
      await pause(20);
      return open.size === 0;
    }, 10_000);
  }
}

const netWord = (page: Page) => page.locator('.topbar .net').textContent();

beforeAll(async () => {
  server = await startPreview(APP_PORT);
  endpoint = await startTestEndpoint(ENDPOINT_PORT, server.url, { 'tok-c': 'phone-c' });
  phone = await launchBrowser();
});

afterAll(async () => {
  await phone?.close();
  await endpoint?.stop();
  await server?.stop();
});

describe('the network comes back', () => {
  it('sends what waited and shows Online soon after the network returns to a page started offline', async () => {
    const page = await phone.context.newPage();
    page.on('pageerror', (e) => console.log('page error:', e.message));
    await page.goto(server.url);
    await page.waitForFunction(() => !!navigator.serviceWorker.controller, undefined, { timeout: 15_000 });
    await go(page, '#/sync');
    expect(await page.getByTestId('pull-rule').textContent()).toContain('at most every 15 minutes while the app is on screen, never while it is in the background');
    await page.locator('#sync-base').fill(endpoint.base);
    await page.locator('#sync-token').fill('tok-c');
    await page.getByRole('button', { name: 'Save endpoint' }).click();
    await until('the first exchange is done', async () => (await lastSuccess(page)) > 0);
    // Offline, and the page reloaded from the service worker: Chromium then reports navigator.onLine
    // as true and sends no `online` event when the network returns, as phones in the field have shown.
    await phone.context.setOffline(true);
    const reload = await page.reload();
    expect(reload?.fromServiceWorker()).toBe(true);
    await until('the top bar says Offline', async () => (await netWord(page)) === 'Offline', 15_000);
    await go(page, '#/sites/new');
    await page.locator('#site-code').fill('CB-1');
    await page.locator('#site-name').fill('Cold Burn at the ford');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Cold Burn at the ford' }).waitFor();
    await go(page, '#/sync');
    await page.getByTestId('problem').filter({ hasText: 'No connection to the office' }).waitFor({ timeout: 20_000 });
    expect(endpoint.records()).toEqual([]);
    const back = Date.now();
    await phone.context.setOffline(false);
    let online_ms = 0;
    let delivered_ms = 0;
    await until('the site reached the office and the top bar says Online', async () => {
      if (!online_ms && (await netWord(page)) === 'Online') online_ms = Date.now() - back;
      if (!delivered_ms && endpoint.records().length === 1) delivered_ms = Date.now() - back;
      return online_ms > 0 && delivered_ms > 0;
    }, 30_000);
    console.log(`network back: top bar Online after ${online_ms} ms, site delivered after ${delivered_ms} ms`);
    // Issue 23: the top bar follows within 2 s and the first push starts within 5 s (the app probes once a
    // second while offline and runs a sync when a probe is answered). Before, it took about 25 s and 65 s.
    // Slack for a loaded shared machine: 2 s on the top bar, 3 s on the delivery (which also waits for
    // the CORS preflight and the office's answer).
    expect(online_ms).toBeLessThanOrEqual(2000 + 2000);
    expect(delivered_ms).toBeLessThanOrEqual(5000 + 3000);
    await until('the exchange after the push is finished', async () => (await lastSuccess(page)) > back);
    lastExchange = await lastSuccess(page);
    await page.close();
  });
});

describe('idle, visible and hidden', () => {
  let page: Page;

  it('pulls once on opening and not again over two idle minutes; the next pull comes at 15 minutes', async () => {
    // The clock is the context's: installed after the real-time test above, before this page opens.
    await phone.context.clock.install();
    page = await phone.context.newPage();
    page.on('pageerror', (e) => console.log('page error:', e.message));
    trackRequests(page);
    const pulls = endpoint.pulls.length;
    await page.goto(server.url);
    await until('the pull on opening', () => endpoint.pulls.length === pulls + 1);
    await until('that exchange is finished', async () => (await lastSuccess(page)) > lastExchange);
    await pause(500);
    const before = officeRequests();
    await idle(page, 2 * MINUTE);
    await pause(1500);
    expect(officeRequests() - before, 'office requests over two idle minutes').toBe(0);
    // Still none at 14 minutes; one pull (no push: nothing waits) once 15 minutes have passed.
    await idle(page, 12 * MINUTE);
    await pause(1500);
    expect(endpoint.pulls.length).toBe(pulls + 1);
    await idle(page, 1 * MINUTE + 5000);
    await until('the pull at 15 minutes', () => endpoint.pulls.length === pulls + 2, 10_000);
    await pause(1500);
    expect(endpoint.pulls.length).toBe(pulls + 2);
    expect(endpoint.pushes.length).toBe(1);
  });

  it('never pulls from a hidden tab, and pulls once when it comes back after 15 minutes', async () => {
    const pulls = endpoint.pulls.length;
    await setHidden(page, true);
    await idle(page, 20 * MINUTE, MINUTE);
    // The browser says the network is back while the tab is hidden: a hidden tab may send, never pull.
    await page.evaluate(() => dispatchEvent(new Event('online')));
    await pause(1500);
    await idle(page, 20 * MINUTE, MINUTE);
    await pause(1500);
    expect(endpoint.pulls.length, 'pulls from the hidden tab over 40 minutes').toBe(pulls);
    await setHidden(page, false);
    await until('the pull on coming back', () => endpoint.pulls.length === pulls + 1, 10_000);
    await pause(1500);
    expect(endpoint.pulls.length).toBe(pulls + 1);
    // Back and forth within 15 minutes of that pull: no more.
    await setHidden(page, true);
    await idle(page, 2 * MINUTE, MINUTE);
    await setHidden(page, false);
    await pause(1500);
    expect(endpoint.pulls.length).toBe(pulls + 1);
  });
});

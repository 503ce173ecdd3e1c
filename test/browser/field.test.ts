// The field screens in Chromium at 360×640, as a technician uses them: the demo site, a new site,
// recording readings with the discharge core computes, warnings, drafts, delete and undo, offline.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_SITE_ID, demoRating, demoScenario, dischargeAt } from '../../core';
import { significant } from '../../web/format';
import { ARTIFACTS, type Browser, type Preview } from '../support/browser/harness';
import { goTo, openApp, type AppSession } from '../support/browser/app';
import { seriousViolations } from '../support/browser/axe';

let server: Preview;
let browser: Browser;
let page: Page;
let app: AppSession | undefined;

async function shot(name: string): Promise<void> {
  await page.screenshot({ path: join(ARTIFACTS, `field-${name}.png`) });
}
async function noSeriousViolations(where: string): Promise<void> {
  expect(await seriousViolations(page), where).toEqual([]);
}
/** Counts stored readings of a site straight from IndexedDB (the test may look; screens may not). */
async function storedReadings(siteId: string): Promise<{ all: number; live: number }> {
  return page.evaluate(
    (id) =>
      new Promise<{ all: number; live: number }>((resolve, reject) => {
        const open = indexedDB.open('freshet');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const tx = open.result.transaction('readings');
          const req = tx.objectStore('readings').getAll();
          req.onsuccess = () => {
            const mine = (req.result as { siteId: string; deleted?: boolean }[]).filter((r) => r.siteId === id);
            resolve({ all: mine.length, live: mine.filter((r) => !r.deleted).length });
            open.result.close();
          };
        };
      }),
    siteId,
  );
}
const go = (hash: string): Promise<void> => goTo(page, server.url, hash);
async function typeStage(text: string): Promise<void> {
  await page.locator('#stage').fill(text);
}

beforeAll(async () => {
  app = await openApp(4183);
  ({ server, browser, page } = app);
});

afterAll(async () => {
  await app?.close();
});

describe('demo site', () => {
  it('loads from the empty state with one tap, with every reading', async () => {
    await go('#/sites');
    await page.getByText('No sites on this phone yet.').waitFor();
    await shot('sites-empty');
    await noSeriousViolations('empty sites');
    await page.getByRole('button', { name: 'Load the demo site' }).click();
    await page.waitForURL(new RegExp(`#/sites/${DEMO_SITE_ID}$`), { timeout: 60_000 });
    await page.getByRole('heading', { name: /Pellow Burn/ }).waitFor();
    const expected = demoScenario(Date.now()).readings.length;
    expect(await storedReadings(DEMO_SITE_ID)).toEqual({ all: expected, live: expected });
    await page.locator('.hydrograph canvas').first().waitFor();
    await shot('site-readings');
    await noSeriousViolations('site readings');
  });

  it('does not duplicate anything when loaded again', async () => {
    const before = await storedReadings(DEMO_SITE_ID);
    // Delete the site (a tombstone) so the empty state offers the demo again, then load it again.
    await go(`#/sites/${DEMO_SITE_ID}/edit`);
    await page.getByRole('button', { name: 'Delete site…' }).click();
    await page.getByRole('button', { name: 'Yes, delete' }).click();
    await page.getByText('No sites on this phone yet.').waitFor();
    await page.getByRole('button', { name: 'Load the demo site' }).click();
    await page.waitForURL(new RegExp(`#/sites/${DEMO_SITE_ID}$`), { timeout: 60_000 });
    expect(await storedReadings(DEMO_SITE_ID)).toEqual(before);
    await go('#/sites');
    await page.locator('ul[aria-label="Sites"] > li').first().waitFor();
    await expect(page.locator('ul[aria-label="Sites"] > li').count()).resolves.toBe(1);
    await shot('sites');
    await noSeriousViolations('sites list');
  });
});

describe('recording a reading', () => {
  it('shows the discharge core computes for the typed stage, and saves it', async () => {
    await go(`#/record/${DEMO_SITE_ID}`);
    await typeStage('0,734'); // a comma decimal mark from a phone keypad
    const expected = `${significant(dischargeAt(demoRating(), 0.734))} m³/s`;
    await expect(page.locator('[data-testid="discharge"]').textContent()).resolves.toBe(expected);
    await page.getByText('Within the gauged range of the rating.').waitFor();
    await page.locator('[data-warning="jump"]').waitFor(); // ~0.35 m an instant ago, limit 0.3 m
    await page.locator('#observer').fill('R. Quill');
    await page.locator('#note').fill('Staff read twice, clear water.');
    await shot('record');
    await noSeriousViolations('record');
    await page.getByRole('button', { name: 'Save reading' }).click();
    await expect(page.locator('[data-testid="saved"]').textContent()).resolves.toMatch(/^Saved: 0\.734 m at .*, \d/);
    // The form is ready for the next reading and remembers the observer.
    await expect(page.locator('#stage').inputValue()).resolves.toBe('');
    await expect(page.locator('#observer').inputValue()).resolves.toBe('R. Quill');
  });

  it('still has the reading after a reload with no network', async () => {
    await browser.context.setOffline(true);
    try {
      const res = await page.goto(server.url + `#/sites/${DEMO_SITE_ID}`);
      await page.reload();
      expect(res?.fromServiceWorker() ?? true).toBe(true);
      const first = page.locator('ul[aria-label^="Readings of"] > li').first();
      await first.waitFor();
      await expect(first.textContent()).resolves.toContain('0.734 m');
      await expect(first.textContent()).resolves.toContain(`${significant(dischargeAt(demoRating(), 0.734))} m³/s`);
      await expect(first.textContent()).resolves.toContain('1 warning');
    } finally {
      await browser.context.setOffline(false);
    }
  });

  it('shows each warning for its case', async () => {
    await go(`#/record/${DEMO_SITE_ID}`);
    const warnings = async () => page.locator('[data-warning]').evaluateAll((els) => els.map((e) => e.getAttribute('data-warning')));
    await typeStage('0.05'); // below the zero-flow stage of 0.12 m
    await page.locator('[data-warning="below-zero-flow"]').waitFor();
    await expect(page.locator('[data-testid="discharge"]').textContent()).resolves.toBe('0 m³/s');
    await typeStage('2.5'); // above the gauged range (to 1.42 m)
    await page.locator('[data-warning="extrapolated"]').waitFor();
    expect(await warnings()).toContain('jump');
    await shot('record-warnings');
    await typeStage('0.72'); // within range, and near the 0.734 m saved above: no warning at all
    await page.waitForFunction(() => !document.querySelector('[data-warning]'));
    const tomorrow = await page.locator('#time').inputValue();
    const later = tomorrow.replace(/^(\d{4})-(\d{2})-(\d{2})/, (_m, y: string, mo: string, d: string) => {
      const t = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d) + 2));
      return t.toISOString().slice(0, 10);
    });
    await page.locator('#time').fill(later);
    await page.locator('[data-warning="future"]').waitFor();
    expect(await warnings()).toEqual(['future']);
    // Two days ahead is most likely a slip in the date: Save asks first and stores nothing yet.
    const before = await storedReadings(DEMO_SITE_ID);
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByRole('button', { name: 'Keep this time' }).waitFor();
    await expect(page.locator('.savebar [role="alert"]').textContent()).resolves.toMatch(/more than a day ahead of this phone's clock/);
    expect(await storedReadings(DEMO_SITE_ID)).toEqual(before);
    await page.getByRole('button', { name: 'Now' }).click();
    await page.waitForFunction(() => !document.querySelector('[data-warning]'));
  });

  it('gives a new site without a rating the no-rating warning and saves anyway', async () => {
    await go('#/sites/new');
    await page.locator('#site-code').fill('TK-7');
    await page.locator('#site-name').fill('Tarn Knott outflow');
    await page.locator('#site-jumpLimit').fill('abc');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByText('The jump limit: "abc" is not a number. Type digits with a point or a comma for the decimals, like 12.5 or 12,5.').waitFor();
    await page.locator('#site-jumpLimit').fill('0.25');
    await page.locator('#site-area').fill('3.2');
    await shot('site-form');
    await noSeriousViolations('site form');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Tarn Knott outflow' }).waitFor();
    await page.getByRole('link', { name: 'Record a reading' }).click();
    await typeStage('0.41');
    await page.locator('[data-warning="no-rating"]').waitFor();
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.locator('[data-testid="saved"]').waitFor();
    await expect(page.locator('[data-testid="saved"]').textContent()).resolves.toContain('no discharge (no rating)');
  });
});

describe('location', () => {
  it('sorts sites nearest first and stores a location fix with its accuracy', async () => {
    await browser.context.grantPermissions(['geolocation'], { origin: server.url.replace(/\/$/, '') });
    // 0.01° of latitude south of the demo gauge: 6371.0088 km × π/180 × 0.01 = 1.112 km (mean Earth radius, IUGG).
    await browser.context.setGeolocation({ latitude: -41.2971, longitude: 174.6302, accuracy: 12 });
    await go('#/record');
    await page.getByRole('button', { name: 'Nearest first' }).click();
    const first = page.locator('ul[aria-label="Sites"] > li').first();
    await page.getByText('1.1 km').waitFor();
    await expect(first.textContent()).resolves.toContain('Pellow Burn');
    await expect(page.locator('ul[aria-label="Sites"] > li').last().textContent()).resolves.toContain('Tarn Knott');
    await first.locator('a').click();
    await typeStage('0.37');
    await page.getByRole('button', { name: 'Add location' }).click();
    await expect(page.locator('[data-testid="gps"]').textContent()).resolves.toMatch(/^Location -41\.29710, 174\.63020 \(± 12 m\)/);
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.locator('[data-testid="saved"]').waitFor();
    const gps = await page.evaluate(
      () =>
        new Promise<unknown>((resolve) => {
          const open = indexedDB.open('freshet');
          open.onsuccess = () => {
            const req = open.result.transaction('readings').objectStore('readings').getAll();
            req.onsuccess = () => {
              const r = (req.result as { stage_m: number; source: string; gps?: unknown }[]).find((x) => x.stage_m === 0.37 && x.source === 'staff');
              open.result.close();
              resolve(r?.gps);
            };
          };
        }),
    );
    expect(gps).toMatchObject({ lat: -41.2971, lon: 174.6302, accuracy_m: 12 });
  });
});

describe('drafts, delete and undo', () => {
  it('keeps a half-filled form across a reload', async () => {
    await go(`#/record/${DEMO_SITE_ID}`);
    await typeStage('0.52');
    await page.locator('#note').fill('Weed on the control');
    await page.waitForTimeout(700); // the draft is written ~300 ms after the last change
    await page.reload();
    await page.locator('#stage').waitFor();
    await expect(page.locator('#stage').inputValue()).resolves.toBe('0.52');
    await expect(page.locator('#note').inputValue()).resolves.toBe('Weed on the control');
    await page.getByText(/Restored the unsaved reading/).waitFor();
    await page.getByRole('button', { name: 'Start over' }).click();
    await expect(page.locator('#stage').inputValue()).resolves.toBe('');
  });

  it('deletes a reading as a tombstone and brings it back with undo', async () => {
    await go(`#/sites/${DEMO_SITE_ID}`);
    const before = await storedReadings(DEMO_SITE_ID);
    const first = page.locator('ul[aria-label^="Readings of"] > li').first();
    const text = await first.locator('.item').textContent();
    await first.locator('summary').click(); // a tap on the row shows its details and actions
    await first.getByRole('button', { name: /^Delete the reading/ }).click();
    await page.getByRole('button', { name: 'Undo' }).waitFor();
    expect(await storedReadings(DEMO_SITE_ID)).toEqual({ all: before.all, live: before.live - 1 });
    await page.waitForFunction((t) => document.querySelector('ul[aria-label^="Readings of"] > li .item')?.textContent !== t, text);
    await page.getByRole('button', { name: 'Undo' }).click();
    await page.waitForFunction((t) => document.querySelector('ul[aria-label^="Readings of"] > li .item')?.textContent === t, text);
    expect(await storedReadings(DEMO_SITE_ID)).toEqual(before);
  });
});

describe('other screens', () => {
  it('has no serious accessibility findings on the data screen and no sideways scroll anywhere', async () => {
    for (const hash of ['#/data', `#/sites/${DEMO_SITE_ID}`, `#/record/${DEMO_SITE_ID}`, '#/record', '#/sites/new']) {
      await go(hash);
      await page.waitForTimeout(300);
      const w = await page.evaluate(() => [document.documentElement.scrollWidth, document.documentElement.clientWidth]);
      expect(w[0], hash).toBeLessThanOrEqual(w[1]);
      await noSeriousViolations(hash);
    }
    await go('#/data');
    await shot('data');
  });
});

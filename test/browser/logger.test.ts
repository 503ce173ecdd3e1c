// Logger import in Chromium at 360×640, as a technician does it: two check readings at the bank (marked
// as checks, with the logger's value typed beside the gauge), then a 100,000-row logger file in local
// standard time read in a worker (progress bar, the page's timer keeps ticking), the drift correction
// table, and the corrected values stored as day records. The file and site are invented; the expected
// corrections are worked by hand from the two checks (staff − logger, prorated linearly in time, held
// outside them: common practice, DOMAIN.md §1).
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { ARTIFACTS, type Preview } from '../support/browser/harness';
import { goTo, openApp, type AppSession } from '../support/browser/app';
import { seriousViolations } from '../support/browser/axe';

let server: Preview;
let page: Page;
let app: AppSession | undefined;
let siteId = '';

const ROWS = 100_000;
const Q_MS = 15 * 60_000;
/** The file's first stamp, 2026-02-20 00:00 in NZ standard time (UTC+12), as UTC ms. */
const FIRST_MS = Date.UTC(2026, 1, 19, 12);
/** Check 1: 2026-03-02 09:00 NZDT (UTC+13) = 2026-03-01 20:00 UTC; staff 0.742, logger 0.730 → +0.012 m. */
const CHECK1_MS = Date.UTC(2026, 2, 1, 20);
/** Check 2: 2026-03-12 09:00 NZDT = 2026-03-11 20:00 UTC (ten days later); staff 0.615, logger 0.640 → −0.025 m. */
const CHECK2_MS = Date.UTC(2026, 2, 11, 20);

/** The invented raw value of row i, m (three decimals as a logger writes them). */
function raw(i: number): number {
  return Math.round((0.7 + 0.1 * Math.sin(i / 96)) * 1000) / 1000;
}

/** The logger file: two header lines, then "YYYY-MM-DD HH:mm:ss,level,temperature" in UTC+12 all year. */
function loggerFile(): string {
  const lines = ['Logger 5120 Larch Rill,serial 0042', 'Date Time (NZST),Level (m),Temp (C)'];
  for (let i = 0; i < ROWS; i++) {
    const wall = new Date(FIRST_MS + i * Q_MS + 12 * 3_600_000).toISOString(); // the stamp as the logger wrote it
    lines.push(`${wall.slice(0, 10)} ${wall.slice(11, 19)},${raw(i).toFixed(3)},11.${i % 10}`);
  }
  return `${lines.join('\r\n')}\r\n`;
}

async function shot(name: string): Promise<void> {
  await page.screenshot({ path: join(ARTIFACTS, `logger-${name}.png`), fullPage: true });
}
const go = (hash: string): Promise<void> => goTo(page, server.url, hash);

beforeAll(async () => {
  app = await openApp(4530);
  ({ server, page } = app);
});

afterAll(async () => {
  await app?.close();
});

describe('check readings at the bank', () => {
  it('adds a site in New Zealand', async () => {
    await go('#/sites/new');
    await page.locator('#site-code').fill('LR-02');
    await page.locator('#site-name').fill('Larch Rill at Ford Farm');
    await page.locator('#site-timeZone').selectOption('Pacific/Auckland');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.waitForURL(/#\/sites\/[0-9a-f-]{36}$/);
    siteId = page.url().split('/').pop()!;
  });

  for (const [time, staff, logger, diff] of [['2026-03-02T09:00', '0.742', '0.730', '-0.012 m'], ['2026-03-12T09:00', '0.615', '0.640', '+0.025 m']]) {
    it(`records a check at ${time}: gauge ${staff}, logger ${logger}, logger − gauge ${diff}`, async () => {
      await go(`#/record/${siteId}`);
      await page.locator('#stage').fill(staff);
      await page.locator('#time').fill(time);
      await page.getByLabel('Check beside the logger').check();
      await page.locator('#logger-value').fill(logger);
      await expect.poll(() => page.getByTestId('logger-difference').textContent()).toBe(`Logger − gauge: ${diff}`);
      if (time.startsWith('2026-03-02')) {
        await shot('check-form');
        expect(await seriousViolations(page)).toEqual([]);
      }
      await page.getByRole('button', { name: 'Save reading' }).click();
      await page.getByTestId('saved').waitFor();
    });
  }

  it('keeps each check as a gauge reading with the logger value beside it', async () => {
    const stored = await page.evaluate(
      (id) => new Promise<{ source: string; stage_m: number; loggerCheck?: { logger_m: number } }[]>((resolve) => {
        const open = indexedDB.open('freshet');
        open.onsuccess = () => {
          const req = open.result.transaction('readings').objectStore('readings').index('by-site-time').getAll(IDBKeyRange.bound([id, 0], [id, Infinity]));
          req.onsuccess = () => {
            resolve(req.result);
            open.result.close();
          };
        };
      }),
      siteId,
    );
    expect(stored.map((r) => [r.source, r.stage_m, r.loggerCheck?.logger_m])).toEqual([['staff', 0.742, 0.73], ['staff', 0.615, 0.64]]);
  });
});

describe('importing a 100,000-row logger file', () => {
  it('maps the file, showing the first rows as they will be stored', async () => {
    await go(`#/data/logger/${siteId}`);
    await page.locator('#logger-file').setInputFiles({ name: 'larch-rill-5120.csv', mimeType: 'text/csv', buffer: Buffer.from(loggerFile()) });
    await page.locator('#clock').waitFor();
    // Nothing is read until the clock of the stamps is chosen: it is asked, never guessed.
    expect(await page.getByRole('button', { name: 'Read the whole file' }).isDisabled()).toBe(true);
    await page.locator('#clock').selectOption('standard');
    expect(await page.locator('#standard-offset').inputValue()).toBe('720');
    // Line 3: 00:00 at UTC+12 is 01:00 New Zealand daylight time, 20 February.
    const line3 = page.locator('ol.preview li[data-line="3"]');
    await expect.poll(() => line3.getByTestId('stored-time').textContent()).toBe('2026-02-20T01:00:00+13:00');
    expect(await line3.getByTestId('stored-stage').textContent()).toBe(`${raw(0).toFixed(4)} m`);
    await shot('mapping');
    const found = await seriousViolations(page);
    expect(found, JSON.stringify(found)).toEqual([]);
  });

  it('stops reading on request, storing nothing', async () => {
    await page.getByRole('button', { name: 'Read the whole file' }).click();
    await page.getByRole('button', { name: 'Stop reading' }).click();
    await page.getByText('Stopped: the file was not read and nothing was stored.').waitFor();
    const stored = await page.evaluate(() => new Promise<number>((resolve) => {
      const open = indexedDB.open('freshet');
      open.onsuccess = () => {
        const req = open.result.transaction('loggerDays').objectStore('loggerDays').count();
        req.onsuccess = () => {
          resolve(req.result);
          open.result.close();
        };
      };
    }));
    expect(stored).toBe(0);
  });

  it('reads the file in a worker with a progress bar while the page keeps ticking', async () => {
    // Watch the page from inside: a 20 ms timer, and every progress value the bar shows.
    await page.evaluate(() => {
      const w = window as unknown as { ticks: number; seen: number[] };
      w.ticks = 0;
      w.seen = [];
      setInterval(() => {
        w.ticks++;
        const bar = document.querySelector<HTMLProgressElement>('[data-testid="read-progress"]');
        if (bar) w.seen.push(bar.value);
      }, 20);
    });
    await page.getByRole('button', { name: 'Read the whole file' }).click();
    await page.getByTestId('values-read').waitFor({ timeout: 60_000 });
    const { ticks, seen } = await page.evaluate(() => {
      const w = window as unknown as { ticks: number; seen: number[] };
      return { ticks: w.ticks, seen: w.seen };
    });
    expect(seen.length).toBeGreaterThan(1); // the bar was on screen across several ticks of the page's own timer
    expect(ticks).toBeGreaterThanOrEqual(seen.length);
    expect(await page.getByTestId('values-read').textContent()).toBe('100,000');
    expect(await page.getByTestId('problem-count').textContent()).toBe('0');
  });

  it('shows the correction table from the two checks and a plot', async () => {
    const rows = page.getByTestId('check-row');
    expect(await rows.count()).toBe(2);
    expect(await page.getByTestId('correction').allTextContents()).toEqual(['0.012 m', '-0.025 m']);
    // Before the first check the correction holds +0.012 m; after the last, −0.025 m.
    expect(await page.getByTestId('correction-span').textContent()).toBe('Correction at the first value 0.012 m, at the last -0.025 m.');
    await page.locator('#drift-heading ~ figure canvas, #drift-heading ~ * canvas').first().waitFor();
    await shot('review');
    expect(await seriousViolations(page)).toEqual([]);
  });

  it('stores the corrected values as day records, raw values and checks kept', async () => {
    await page.getByRole('button', { name: 'Store 100,000 values' }).click();
    await page.getByTestId('store-progress').waitFor({ state: 'attached' });
    await page.getByTestId('import-done').waitFor({ timeout: 60_000 });
    // 100,000 quarter hours from 12:00 UTC on 19 February 2026 end at 03:45 UTC on 27 December 2028: 1,043 UTC days.
    const dayCount = Math.floor((FIRST_MS + (ROWS - 1) * Q_MS) / 86_400_000) - Math.floor(FIRST_MS / 86_400_000) + 1;
    expect(dayCount).toBe(1043);
    expect(await page.getByTestId('import-done').textContent()).toBe('Stored 100,000 values in 1,043 day records.');
    // Worked by hand: half way between the checks (5 days after the first) c = 0.012 + 0.5 × (−0.037) = −0.0065 m.
    const mid = CHECK1_MS + 5 * 86_400_000;
    const probes = [mid, FIRST_MS, FIRST_MS + (ROWS - 1) * Q_MS, CHECK1_MS];
    // Read inside the page; only the figures asked for come back.
    const found = await page.evaluate(
      ({ id, times }) => new Promise<{ values: number; days: number; at: { raw: number; corr: number; checks: number }[] }>((resolve) => {
        const open = indexedDB.open('freshet');
        open.onsuccess = () => {
          const req = open.result.transaction('loggerDays').objectStore('loggerDays').index('by-site-day').getAll(IDBKeyRange.bound([id, 0], [id, Infinity]));
          req.onsuccess = () => {
            const days = req.result as { day: number; offset_ms: number[]; raw_m: number[]; correction_m: number[]; checks: unknown[] }[];
            const at = times.map((t) => {
              const d = days.find((x) => x.day === Math.floor(t / 86_400_000))!;
              const k = d.offset_ms.indexOf(t - d.day * 86_400_000);
              return { raw: d.raw_m[k], corr: d.correction_m[k], checks: d.checks.length };
            });
            resolve({ values: days.reduce((n, d) => n + d.offset_ms.length, 0), days: days.length, at });
            open.result.close();
          };
        };
      }),
      { id: siteId, times: probes },
    );
    expect(found.values).toBe(ROWS);
    expect(found.days).toBe(dayCount);
    const [atMid, atFirst, atLast, atCheck1] = found.at;
    expect(atMid.raw).toBe(raw((mid - FIRST_MS) / Q_MS));
    expect(atMid.corr).toBeCloseTo(-0.0065, 12);
    expect(atFirst.corr).toBeCloseTo(0.012, 12);
    expect(atLast.corr).toBeCloseTo(-0.025, 12);
    expect(atCheck1.corr).toBeCloseTo(0.012, 12);
    expect(atMid.checks).toBe(2);
    await shot('stored');
  });
});

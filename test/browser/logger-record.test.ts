// The continuous record end to end in Chromium at 360×640, offline after the first visit: a new site, a
// rating entered by hand, an invented 15-minute logger file with separate Date and Time columns imported
// with the first guess (only the clock chosen), and a spot reading two days after the record ends. Then
// the readings CSV export holds every logger value (papaparse reads it back) and the storm screen opens the
// logger's storm at its peak. Expected figures: the invented rating Q = 10·(h − 0.2)² evaluated by hand,
// and core's findEventPoints on the same values (the storm core the screen calls).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { findEventPoints, toIsoWithOffset, toLocalInput } from '../../core';
import { formatQuantity } from '../../web/format';
import { ARTIFACTS, type Browser, type Preview } from '../support/browser/harness';
import { goTo, openApp, type AppSession } from '../support/browser/app';

let server: Preview;
let browser: Browser;
let page: Page;
let app: AppSession | undefined;
let siteId = '';

const ZONE = 'Pacific/Auckland';
const Q_MS = 15 * 60_000;
const H = 3_600_000;
const DAY = 86_400_000;
const N = 961; // ten days of 15-minute values, both ends included
/** The record ends three days before now, on a quarter hour (UTC). */
const END_MS = Math.floor((Date.now() - 3 * DAY) / Q_MS) * Q_MS;
const START_MS = END_MS - (N - 1) * Q_MS;
/** A storm: a gamma-shaped rise (shape 3) of 0.9 m starting on day 4, peaking 10 h later (mode of t³e^(−3t/10)). */
function stage(i: number): number {
  const tau = (i * Q_MS) / H - 96;
  return Math.round((0.3 + (tau > 0 ? 0.9 * Math.pow(tau / 10, 3) * Math.exp(3 * (1 - tau / 10)) : 0)) * 1000) / 1000;
}
const discharge = (h: number) => 10 * (h - 0.2) ** 2; // the rating entered below
const iso = (t: number) => new Date(t).toISOString();

/** The logger file: a header, then "YYYY-MM-DD,HH:MM,level" in UTC. */
function loggerFile(): string {
  const lines = ['Date,Time,Level (m)'];
  for (let i = 0; i < N; i++) lines.push(`${iso(START_MS + i * Q_MS).slice(0, 10)},${iso(START_MS + i * Q_MS).slice(11, 16)},${stage(i).toFixed(3)}`);
  return `${lines.join('\r\n')}\r\n`;
}

const go = (hash: string): Promise<void> => goTo(page, server.url, hash);
async function noSidewaysScroll(): Promise<void> {
  expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth + 1)).toBe(true);
}

beforeAll(async () => {
  app = await openApp(4533);
  ({ server, browser, page } = app);
  await browser.context.setOffline(true);
});

afterAll(async () => {
  await app?.close();
});

describe('a logger record from import to export and storm, offline at 360×640', () => {
  it('adds a site and enters a rating by hand', async () => {
    expect(page.viewportSize()).toEqual({ width: 360, height: 640 });
    await go('#/sites/new');
    await page.locator('#site-code').fill('EV-5');
    await page.locator('#site-name').fill('Elder Vale at the mill (invented)');
    await page.locator('#site-area').fill('20');
    await page.locator('#site-timeZone').selectOption(ZONE);
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.waitForURL(/#\/sites\/[0-9a-f-]{36}$/);
    siteId = page.url().split('/').pop()!;
    await go(`#/sites/${siteId}/ratings/new`);
    await page.locator('#validFrom').fill(toLocalInput(START_MS - 30 * DAY, ZONE));
    await page.locator('#seg0-offset').fill('0.2');
    await page.locator('#seg0-coefficient').fill('10');
    await page.locator('#seg0-exponent').fill('2');
    await page.locator('#rangeLow').fill('0.25');
    await page.locator('#rangeHigh').fill('1.5');
    await page.getByRole('button', { name: 'Save rating' }).click();
    await page.locator('[data-testid="rating-table"]').waitFor();
  });

  it('imports the logger file with the first guess, only the clock chosen, the stored times shown stacked', async () => {
    await go(`#/data/logger/${siteId}`);
    await page.locator('#logger-file').setInputFiles({ name: 'ev5-logger.csv', mimeType: 'text/csv', buffer: Buffer.from(loggerFile()) });
    await page.locator('#clock').selectOption('utc');
    // Line 2 is the first value: its stored time in the site's zone and its stage, no sideways scroll.
    const line2 = page.locator('ol.preview li[data-line="2"]');
    await expect.poll(() => line2.getByTestId('stored-time').textContent()).toBe(toIsoWithOffset(START_MS, ZONE));
    expect(await page.locator('ol.preview li[data-line="3"]').getByTestId('stored-time').textContent()).toBe(toIsoWithOffset(START_MS + Q_MS, ZONE));
    expect(await line2.getByTestId('stored-stage').textContent()).toBe(`${stage(0).toFixed(4)} m`);
    await noSidewaysScroll();
    await page.screenshot({ path: join(ARTIFACTS, 'logger-record-mapping.png'), fullPage: true });
    await page.getByRole('button', { name: 'Read the whole file' }).click();
    await page.getByTestId('values-read').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('values-read').textContent()).toBe('961');
    expect(await page.getByTestId('problem-count').textContent()).toBe('0');
    await page.getByRole('button', { name: 'Store 961 values' }).click();
    await page.getByTestId('import-done').waitFor({ timeout: 60_000 });
  });

  it('records a spot reading two days after the record ends', async () => {
    await go(`#/record/${siteId}`);
    await page.locator('#stage').fill('0.31');
    await page.locator('#time').fill(toLocalInput(END_MS + 2 * DAY, ZONE));
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByTestId('saved').waitFor();
  });

  it('shows the logger record in the readings list one day to a row', async () => {
    await go(`#/sites/${siteId}`);
    await page.getByTestId('logger-day').first().waitFor();
    const days = Math.floor(END_MS / DAY) - Math.floor(START_MS / DAY) + 1;
    expect(await page.getByTestId('logger-day').count()).toBe(days);
    await noSidewaysScroll();
  });

  it('exports every logger value in the readings CSV', async () => {
    await go('#/data');
    await page.locator('#export-site').selectOption({ label: 'EV-5 · Elder Vale at the mill (invented)' });
    await page.getByLabel('What').selectOption({ label: 'Readings with discharge (CSV)' });
    const [file] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download' }).click()]);
    const path = join(ARTIFACTS, 'logger-record-readings.csv');
    await file.saveAs(path);
    const rows = Papa.parse<Record<string, string>>(readFileSync(path, 'utf8').replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    expect(rows.errors).toEqual([]);
    const logger = rows.data.filter((r) => r.source === 'logger');
    expect(logger).toHaveLength(N);
    logger.forEach((r, i) => {
      expect(Date.parse(r.time)).toBe(START_MS + i * Q_MS);
      expect(Number(r.logger_raw_m)).toBe(stage(i));
      expect(Number(r.correction_m)).toBe(0);
      expect(r['discharge_m³/s']).toBe(String(Number(discharge(stage(i)).toPrecision(3))));
    });
    expect(rows.data.filter((r) => r.source === 'staff').map((r) => Date.parse(r.time))).toEqual([Math.floor((END_MS + 2 * DAY) / 60_000) * 60_000]);
  });

  it('opens the logger storm with its peak on the storm screen', async () => {
    await go(`#/storm/${siteId}`);
    await page.getByTestId('direct-volume').waitFor({ timeout: 30_000 });
    const series = { time_ms: Array.from({ length: N }, (_, i) => START_MS + i * Q_MS), discharge_m3s: Array.from({ length: N }, (_, i) => discharge(stage(i))) };
    const found = findEventPoints(series, { area_km2: 20 });
    const first = page.getByTestId('storm-list').locator('li').first();
    expect(await first.isVisible()).toBe(true);
    await expect(first.textContent()).resolves.toContain(toLocalInput(found.peak_ms, ZONE).replace('T', ' '));
    expect(await page.getByTestId('storm-list').locator('li').count()).toBe(1); // the spot reading alone is no storm
    const peak = Math.max(...series.discharge_m3s);
    expect((await page.getByTestId('peak').textContent())!).toContain(formatQuantity('discharge', peak, 'metric'));
    await noSidewaysScroll();
    await page.screenshot({ path: join(ARTIFACTS, 'logger-record-storm.png'), fullPage: true });
  });
});

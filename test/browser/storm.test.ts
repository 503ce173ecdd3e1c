// The storm screen in Chromium at 360×640, offline from the service worker, on the demo site: the storm
// found for you, the figures the core computes in Node for the same readings, key points dragged with a
// finger, a mouse and the arrow keys, methods switched and compared side by side, the picture a valid PNG,
// a saved analysis reopened after an offline reload, no internal message, no serious axe-core findings.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import {
  DEMO_SITE_ID,
  demoRating,
  demoLoggerRecord,
  findStorms,
  demoScenario,
  dischargeAt,
  dischargeThrough,
  joinStageRecord,
  seriesFromReadings,
  spotSeriesOf,
  findEventPoints,
  fromLocalInput,
  methodWithDefaults,
  separateBaseflowDetailed,
  SEPARATION_METHOD_KINDS,
  summarizeEvent,
  toLocalInput,
  type EventPoints,
  type SeparationMethod,
} from '../../core';
import { ARTIFACTS, launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { seriousViolations } from '../support/browser/axe';
import { formatQuantity } from '../../web/format';

const ZONE = 'Pacific/Auckland';
let server: Preview;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  server = await startPreview(4240);
  browser = await launchBrowser();
  page = await browser.context.newPage();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** The number in a shown quantity such as "304,793 m³" or "24.6 mm". */
function numberIn(text: string): number {
  const m = /-?[\d,]*\.?\d+/.exec(text);
  if (!m) throw new Error(`no number in "${text}"`);
  return Number(m[0].replace(/,/g, ''));
}

/** A volume as the screen shows one of 1000 m³ or more (web/format.ts): whole m³ with thousands commas. */
const shownVolume = (v: number) => `${Math.round(v).toLocaleString('en')} m³`;

/**
 * The storm in Node: the demo's stage record in the window the screen shows (read from its minute fields),
 * joined by core as the phone joins it (spot readings and logger days, core's joinStageRecord), discharge
 * through the demo rating in force (core's dischargeThrough), one discharge per time (core's
 * seriesFromReadings: the logger wins at a shared time), the core's key points.
 */
async function stormInNode(latest_ms: number) {
  const from_ms = fromLocalInput(await page.locator('#storm-from').inputValue(), ZONE);
  const to_ms = fromLocalInput(await page.locator('#storm-to').inputValue(), ZONE);
  const scenario = demoScenario(latest_ms);
  const record = joinStageRecord(spotSeriesOf(scenario.readings).spots, scenario.loggerDays, from_ms, to_ms);
  const q = dischargeThrough([scenario.rating], record.time_ms, record.stage_m);
  const made = seriesFromReadings({ time_ms: record.time_ms, discharge_m3s: q.discharge_m3s, source: record.source, extrapolated: q.extrapolated });
  if (made.kind !== 'ready') throw new Error(`the demo window made no series in Node (${made.kind})`);
  const series = { time_ms: Array.from(made.series.time_ms), discharge_m3s: Array.from(made.series.discharge_m3s) };
  const area_km2 = scenario.site.area_km2!;
  const found = findEventPoints(series, { area_km2 });
  const figures = (method: SeparationMethod, points: EventPoints = found, rainfall_mm?: number) => {
    const { baseflow, baseflowAtPoints } = separateBaseflowDetailed(series, method, { points, area_km2 });
    return summarizeEvent(series, baseflow, { area_km2, rainfall_mm, from_ms: points.riseStart_ms, to_ms: points.runoffEnd_ms, baseflowAtPoints });
  };
  return { series, found, figures, area_km2 };
}

/** The reading a handle sits on now (its slider value is the reading's index in the window). */
async function handleIndex(handle: Locator): Promise<number> {
  return Number(await handle.getAttribute('aria-valuenow'));
}

async function volumeIs(v: number): Promise<void> {
  await page.waitForFunction((text) => document.querySelector('[data-testid="direct-volume"]')?.textContent === text, shownVolume(v), { timeout: 10_000 });
}

/** A finger drag through Chromium's touch input (CDP): down on from, eight moves, up at to (CSS px). */
async function touchDrag(from: { x: number; y: number }, to: { x: number; y: number }): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  const point = (p: { x: number; y: number }) => [{ x: p.x, y: p.y, id: 1, radiusX: 6, radiusY: 6, force: 1 }];
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: point(from) });
  for (let k = 1; k <= 8; k++) {
    const p = { x: from.x + ((to.x - from.x) * k) / 8, y: from.y + ((to.y - from.y) * k) / 8 };
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: point(p) });
  }
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await cdp.detach();
}

async function centre(l: Locator): Promise<{ x: number; y: number }> {
  const b = (await l.boundingBox())!;
  return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
}

/** Unfolds the method chooser unless it is open already. */
async function openMethods(): Promise<void> {
  if (!(await page.locator('details.storm-method').evaluate((d: HTMLDetailsElement) => d.open))) await page.locator('.storm-method summary').click();
}

/** What must never reach the screen: function or field names, or raw millisecond times. */
const INTERNAL = /separateBaseflow|summarizeEvent|findEventPoints|\w+_ms\b|\d{10,}/;

describe('storm screen on the demo site, offline', () => {
  let latest_ms = 0;
  const end = () => page.locator('[data-handle="runoffEnd_ms"]');

  it('says plainly that there are no sites yet', async () => {
    await page.goto(`${server.url}#/storm`);
    await expect(page.getByTestId('storm-no-sites').locator('a').getAttribute('href')).resolves.toBe('#/sites');
  });

  it('opens the newest storm found in the demo record, offline from the service worker', async () => {
    await page.goto(`${server.url}#/sites`);
    await page.getByRole('button', { name: 'Load the demo site' }).click();
    await page.waitForFunction((id) => location.hash === `#/sites/${id}`, DEMO_SITE_ID, { timeout: 60_000 });
    await page.evaluate(() => navigator.serviceWorker.ready);
    await page.context().setOffline(true);
    await page.goto(`${server.url}#/storm/${DEMO_SITE_ID}`);
    const res = await page.reload();
    expect(res?.fromServiceWorker()).toBe(true);
    await page.getByTestId('direct-volume').waitFor({ timeout: 30_000 });
    // The list says up to when the record was searched: the latest reading, in the site's zone.
    const summary = (await page.locator('.storm-list summary').textContent())!;
    latest_ms = fromLocalInput(/to (\d{4}-\d\d-\d\d \d\d:\d\d)/.exec(summary)![1].replace(' ', 'T'), ZONE);
    expect(latest_ms).toBeGreaterThanOrEqual(fromLocalInput(await page.locator('#storm-to').inputValue(), ZONE));
    const node = await stormInNode(latest_ms);
    // The storm list names the demo storm first, at the core's peak time in the site's zone.
    // Every listed storm is in view (the list is open), and as many as core's findStorms finds on the whole record.
    const first = page.getByTestId('storm-list').locator('li').first();
    expect(await first.isVisible()).toBe(true);
    await expect(first.textContent()).resolves.toContain(toLocalInput(node.found.peak_ms, ZONE).replace('T', ' '));
    const all = demoLoggerRecord(demoScenario(latest_ms));
    const rating = demoRating();
    const whole = { time_ms: all.time_ms, discharge_m3s: Float64Array.from(all.stage_m, (h) => dischargeAt(rating, h)) };
    const storms = findStorms(whole, { area_km2: node.area_km2, method: { kind: 'variable-slope' } });
    await expect(page.getByTestId('storm-list').locator('li').count()).resolves.toBe(storms.length);
    // The depth the list gives the storm it opened is the depth of the analysis on screen.
    const listed = (await first.textContent())!;
    expect(listed).toContain(formatQuantity('depth', node.figures({ kind: 'variable-slope' }).runoffDepth_mm!, 'metric'));
    // The demo storm peaks 13.5 days plus about 8 h into its 21-day record (core/demo/scenario.ts).
    const peakDay = (node.found.peak_ms - (latest_ms - 21 * 86_400_000)) / 86_400_000;
    expect(peakDay).toBeGreaterThan(13.5);
    expect(peakDay).toBeLessThan(14);
  });

  it('shows the volume, depth and range the core computes for the same readings, extrapolation marked', async () => {
    const node = await stormInNode(latest_ms);
    const s = node.figures({ kind: 'variable-slope' });
    await volumeIs(s.directVolume_m3);
    expect(numberIn((await page.getByTestId('runoff-depth').textContent())!)).toBe(Number(s.runoffDepth_mm!.toFixed(1)));
    // The demo peak (7.2 m³/s true) is above the gauged range (to 1.42 m): marked beside the peak and the volume.
    await expect(page.getByTestId('extrapolated-mark').count()).resolves.toBe(2);
    // The range sentence: "about V (low–high)"; the demo rating has no fit, so the stated 10 % applies, said
    // beside the range with the band, the methods and the widening for the extrapolated peak (DOMAIN.md §5).
    const range = (await page.getByTestId('volume-range').textContent())!;
    expect(range).toMatch(/^about [\d,]+ m³ \([\d,]+–[\d,]+\)$/);
    const holds = (await page.getByTestId('range-holds').textContent())!;
    expect(holds).toMatch(/rating ±1 standard error \(about 68 %\), 10 % assumed: the rating has no fit statistics/);
    expect(holds).toMatch(/widened for discharges beyond the gauged range/);
    await page.getByTestId('method-spread-card').locator('summary').click();
    await expect(page.getByTestId('range-sentence').textContent()).resolves.toContain('a standard error of 10 % is assumed');
    await expect(page.getByTestId('range-sentence').textContent()).resolves.toMatch(/Lyne–Hollick filter is left out: Lyne–Hollick's α is set for daily flows/);
  });

  it('lists every method side by side with the volumes the core computes', async () => {
    const node = await stormInNode(latest_ms);
    const rows = page.getByTestId('method-table').locator('tbody tr');
    await expect(rows.count()).resolves.toBe(SEPARATION_METHOD_KINDS.length);
    for (const kind of SEPARATION_METHOD_KINDS) {
      const row = page.locator(`[data-testid="method-table"] tr[data-method="${kind}"]`);
      let expected: number | undefined;
      try {
        expected = node.figures(methodWithDefaults(kind, { area_km2: node.area_km2 })).directVolume_m3;
      } catch (e) {
        expect(e).toBeInstanceOf(RangeError);
      }
      const text = (await row.textContent())!;
      if (expected === undefined) expect(text).toMatch(/days/);
      else expect(await row.getByTestId('spread-volume').textContent(), kind).toBe(shownVolume(expected));
      expect(text).not.toMatch(INTERNAL);
    }
  });

  it('moves the end of runoff with a finger and shows the volume core computes for the new point', async () => {
    const node = await stormInNode(latest_ms);
    const before = await handleIndex(end());
    const at = await centre(end());
    await touchDrag(at, { x: at.x - 30, y: at.y });
    const after = await handleIndex(end());
    expect(after).toBeLessThan(before);
    const points = { ...node.found, runoffEnd_ms: node.series.time_ms[after] };
    await volumeIs(node.figures({ kind: 'variable-slope' }, points).directVolume_m3);
  });

  it('moves it with a mouse and with the arrow keys, one reading a step', async () => {
    const node = await stormInNode(latest_ms);
    const at = await centre(end());
    await page.mouse.move(at.x, at.y);
    await page.mouse.down();
    await page.mouse.move(at.x + 20, at.y, { steps: 5 });
    await page.mouse.move(at.x + 45, at.y, { steps: 5 });
    await page.mouse.up();
    const dragged = await handleIndex(end());
    const points = (i: number) => ({ ...node.found, runoffEnd_ms: node.series.time_ms[i] });
    await volumeIs(node.figures({ kind: 'variable-slope' }, points(dragged)).directVolume_m3);
    await end().focus();
    await page.keyboard.press('ArrowRight');
    await expect(handleIndex(end())).resolves.toBe(dragged + 1);
    await volumeIs(node.figures({ kind: 'variable-slope' }, points(dragged + 1)).directVolume_m3);
    await page.screenshot({ path: join(ARTIFACTS, 'storm-dragged.png') });
  });

  it('stops a point dragged past its neighbour with a plain sentence, never an internal message', async () => {
    const rise = await centre(page.locator('[data-handle="riseStart_ms"]'));
    const at = await centre(end());
    await touchDrag(at, { x: rise.x - 20, y: at.y });
    await expect(page.getByTestId('point-stopped').textContent()).resolves.toBe(
      'The end of runoff cannot come before the inflection: it stops one reading after it.',
    );
    expect(await page.locator('main').innerText()).not.toMatch(INTERNAL);
    await page.getByRole('button', { name: 'Reset key points' }).click();
    const node = await stormInNode(latest_ms);
    await volumeIs(node.figures({ kind: 'variable-slope' }).directVolume_m3);
  });

  it('warns plainly when the runoff coefficient is above 1', async () => {
    const node = await stormInNode(latest_ms);
    await page.getByLabel(/Rain \(mm\)/).fill('5');
    const s = node.figures({ kind: 'variable-slope' }, node.found, 5);
    // Runoff coefficient = runoff depth / rainfall (DOMAIN.md §5): about 24.6 / 5.
    expect(s.runoffCoefficient!).toBeGreaterThan(1);
    await expect(page.getByTestId('coefficient-warning').textContent()).resolves.toContain('More runoff than rain');
    await page.getByLabel(/Rain \(mm\)/).fill('abc');
    await expect(page.getByRole('alert').filter({ hasText: 'Rainfall needs a number' }).count()).resolves.toBe(1);
    await page.getByLabel(/Rain \(mm\)/).fill('38');
    expect(numberIn((await page.getByTestId('runoff-coefficient').textContent())!)).toBeCloseTo(node.figures({ kind: 'variable-slope' }, node.found, 38).runoffCoefficient!, 2);
  });

  it('switches to the Eckhardt filter with typed constants and redraws the baseflow', async () => {
    const canvas = page.locator('.storm-plot canvas');
    const before = await canvas.evaluate((c: HTMLCanvasElement) => c.toDataURL());
    await openMethods();
    await page.locator('input[data-method="eckhardt"]').check();
    await page.getByLabel(/Largest baseflow index/).fill('0.25');
    const node = await stormInNode(latest_ms);
    const eckhardt: SeparationMethod = { kind: 'eckhardt', bfiMax: 0.25, recession: 0.98 };
    await volumeIs(node.figures(eckhardt).directVolume_m3);
    const after = await canvas.evaluate((c: HTMLCanvasElement) => c.toDataURL());
    expect(after).not.toBe(before);
    await page.getByLabel(/Largest baseflow index/).fill('1.5');
    await expect(page.getByText(/must lie between 0 and 1/).first().isVisible()).resolves.toBe(true);
    await page.getByLabel(/Largest baseflow index/).fill('0.25');
    await volumeIs(node.figures(eckhardt).directVolume_m3);
  });

  it('reads out a tapped time in the site zone, and zooms with two fingers', async () => {
    const plot = page.locator('.storm-plot canvas');
    await plot.waitFor();
    const box = (await plot.boundingBox())!;
    // A spot on the plot that no handle's target covers (a tap on a target is the start of a drag).
    const free = await page.locator('.storm-plot .plot-gestures').evaluate((over) => {
      const r = over.getBoundingClientRect();
      for (const fy of [0.5, 0.3, 0.7]) for (let fx = 0.3; fx < 0.95; fx += 0.05) {
        const p = { x: r.x + r.width * fx, y: r.y + r.height * fy };
        if (document.elementFromPoint(p.x, p.y) === over) return p;
      }
      return null;
    });
    expect(free, 'some of the plot is free of handles').not.toBeNull();
    await page.touchscreen.tap(free!.x, free!.y);
    await expect(page.getByTestId('readout').textContent()).resolves.toMatch(
      /^\d{4}-\d\d-\d\d \d\d:\d\d · stage \d+\.\d{3} m · discharge [\d.,]+ m³\/s · baseflow [\d.,]+ m³\/s$/,
    );
    // Two fingers moving apart between the rise start and the peak spread those two handles apart on screen.
    const rise = page.locator('[data-handle="riseStart_ms"]');
    const peak = page.locator('[data-handle="peak_ms"]');
    // Measured at the points the handles stand for (a target may sit aside from its point so none overlap).
    const pointX = async (h: Locator) => Number(await h.getAttribute('data-point-x'));
    const gap = async () => (await pointX(peak)) - (await pointX(rise));
    const before = await gap();
    const cdp = await page.context().newCDPSession(page);
    const overlayLeft = (await page.locator('.storm-plot .plot-box').boundingBox())!.x;
    // The fingers go down on the plot itself, at a height where neither lands on a handle's target.
    const midX = overlayLeft + ((await pointX(rise)) + (await pointX(peak))) / 2;
    const y = await page.evaluate((x) => {
      const over = document.querySelector('.storm-plot .plot-gestures')!;
      const r = over.getBoundingClientRect();
      for (let yy = r.top + 2; yy < r.bottom - 2; yy += 2) {
        if (document.elementFromPoint(x - 20, yy) === over && document.elementFromPoint(x + 20, yy) === over) return yy;
      }
      return null;
    }, midX);
    expect(y, 'a height where both fingers land on the plot').not.toBeNull();
    const mid = { x: midX, y: y! };
    const slider = () => page.locator('.key-handle').evaluateAll((els) => Object.fromEntries(els.map((e) => [e.getAttribute('data-handle'), e.getAttribute('aria-valuenow')])));
    const held = await slider();
    const fingers = (d: number) => [
      { x: mid.x - d, y: mid.y, id: 1 },
      { x: mid.x + d, y: mid.y, id: 2 },
    ];
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: fingers(20) });
    for (const d of [30, 40, 50, 60]) await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: fingers(d) });
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
    await cdp.detach();
    await page.waitForTimeout(100);
    expect(await gap()).toBeGreaterThan(before * 1.5);
    // Zooming moves no key point (those zoomed out of view have no handle).
    const now = await slider();
    expect(Object.keys(now).length).toBeGreaterThanOrEqual(2);
    for (const [key, value] of Object.entries(now)) expect(value, key).toBe(held[key]);
    // Whole window shows everything again.
    await page.getByLabel('Whole window').check();
    await page.getByLabel('Whole window').uncheck();
  });

  it('widens the window for smoothed minima and gives the volume core computes on it', async () => {
    const before = await stormInNode(latest_ms);
    const from0 = fromLocalInput(await page.locator('#storm-from').inputValue(), ZONE);
    const to0 = fromLocalInput(await page.locator('#storm-to').inputValue(), ZONE);
    await openMethods();
    await page.locator('input[data-method="smoothed-minima"]').check();
    await expect(page.getByTestId('storm-notes').textContent()).resolves.toContain('The window was widened to 25 days');
    const from1 = fromLocalInput(await page.locator('#storm-from').inputValue(), ZONE);
    const to1 = fromLocalInput(await page.locator('#storm-to').inputValue(), ZONE);
    expect(to1 - from1).toBe(25 * 86_400_000);
    expect(to1 - from1).toBeGreaterThan(to0 - from0);
    // The storm's key points stay those found on the storm's own window; smoothed minima runs on the wider one.
    const node = await stormInNode(latest_ms);
    await volumeIs(node.figures(methodWithDefaults('smoothed-minima'), before.found).directVolume_m3);
    await page.locator('input[data-method="eckhardt"]').check();
  });

  it('shares the plot as a PNG picture of the plot', async () => {
    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Share picture' }).click();
    const file = await (await download).path();
    const png = readFileSync(file);
    // PNG signature and IHDR first (ISO/IEC 15948 §5.2, §11.2.2): width and height big-endian at bytes 16–23.
    expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(png.subarray(12, 16).toString('ascii')).toBe('IHDR');
    const width = png.readUInt32BE(16);
    const plotWidth = await page.locator('.storm-plot canvas').evaluate((c: HTMLCanvasElement) => c.width);
    expect(width).toBe(plotWidth + 24);
    expect(png.readUInt32BE(20)).toBeGreaterThan(200);
  });

  it('has no serious accessibility findings and no sideways scroll at 360 px', async () => {
    expect(await seriousViolations(page)).toEqual([]);
    const widths = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
    expect(widths.scroll).toBeLessThanOrEqual(widths.client);
    await page.evaluate(() => scrollTo(0, 0));
    await page.screenshot({ path: join(ARTIFACTS, 'storm.png') });
    await page.screenshot({ path: join(ARTIFACTS, 'storm-full.png'), fullPage: true });
  });

  it('saves the analysis and reopens it with the same figures after an offline reload', async () => {
    const shown = await page.getByTestId('direct-volume').textContent();
    const depth = await page.getByTestId('runoff-depth').textContent();
    await page.getByLabel('Note (optional)').fill('Browser test storm');
    await page.getByRole('button', { name: 'Save this analysis' }).click();
    await page.getByTestId('storm-action-done').filter({ hasText: 'Saved on this phone' }).waitFor();
    await page.reload();
    await page.getByTestId('direct-volume').waitFor();
    // A fresh screen opens the storm with the first method again ...
    await expect(page.getByTestId('direct-volume').textContent()).resolves.not.toBe(shown);
    // ... and Open brings back the window, points, method with its constants, and rainfall.
    await page.getByRole('button', { name: /Open the analysis/ }).click();
    await volumeIs(numberIn(shown!));
    await expect(page.getByTestId('runoff-depth').textContent()).resolves.toBe(depth);
    await expect(page.getByLabel(/Rain \(mm\)/).inputValue()).resolves.toBe('38');
    await openMethods();
    await expect(page.getByLabel(/Largest baseflow index/).inputValue()).resolves.toBe('0.25');
    await expect(page.getByTestId('saved-analyses').textContent()).resolves.toContain('Browser test storm');
  });
});

// The storm plot's key-point handles in Chromium at 360×640 on the demo storm (issue 24): every target at
// least 44 × 44 CSS px (WCAG 2.1 success criterion 2.5.5, target size), wholly inside the plotting area,
// none over another, on the storm as found, with the Eckhardt filter, with two points dragged next to each
// other and with the whole window shown (the four points crowded); a finger drag on each target moves that
// key point and no other; the point's name shows inside the plot while it is dragged or moved with the
// arrow keys, and is gone when the drag ends or the focus leaves.
// Geometry is the browser's own (getBoundingClientRect); the plotting area is uPlot's over layer.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { DEMO_SITE_ID } from '../../core';
import { ARTIFACTS, launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { boxes, intersects, within } from '../support/browser/geometry';

const KEYS = ['riseStart_ms', 'peak_ms', 'inflection_ms', 'runoffEnd_ms'] as const;
let server: Preview;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  server = await startPreview(4262);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await page.goto(`${server.url}#/sites`);
  await page.getByRole('button', { name: 'Load the demo site' }).click();
  await page.waitForFunction((id) => location.hash === `#/sites/${id}`, DEMO_SITE_ID, { timeout: 60_000 });
  await page.goto(`${server.url}#/storm/${DEMO_SITE_ID}`);
  await page.getByTestId('direct-volume').waitFor({ timeout: 30_000 });
  await showPlot();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** Scrolls the plot into the middle of the screen (it then stays in view under the top bar). */
const showPlot = () => page.locator('.storm-plot').evaluate((el) => el.scrollIntoView({ block: 'center' }));
const handle = (key: string): Locator => page.locator(`[data-handle="${key}"]`);
/** The reading each key point sits on (a handle's slider value is its reading's index in the window). */
const indexes = () => page.locator('.key-handle').evaluateAll((els) => Object.fromEntries(els.map((e) => [e.getAttribute('data-handle'), Number(e.getAttribute('aria-valuenow'))])));
const namesShown = () => page.getByTestId('key-name').count();

/** Every handle whole, inside the plotting area, and apart; the element at each target's centre is that target. */
async function handlesApart(where: string): Promise<void> {
  await page.waitForTimeout(50);
  const targets = await boxes(page, '.key-handle');
  expect(targets.length, where).toBe(4);
  const [area] = await boxes(page, '.storm-plot .u-over');
  targets.forEach((h, k) => {
    expect(h.width, `${where}: width of ${KEYS[k]}`).toBeGreaterThanOrEqual(44);
    expect(h.height, `${where}: height of ${KEYS[k]}`).toBeGreaterThanOrEqual(44);
    expect(within(h, area, 0.5), `${where}: ${KEYS[k]} inside the plotting area`).toBe(true);
    for (let j = k + 1; j < targets.length; j++) expect(intersects(h, targets[j]), `${where}: ${KEYS[k]} and ${KEYS[j]}`).toBe(false);
  });
  for (const key of KEYS) {
    const hit = await handle(key).evaluate((el) => {
      const r = el.getBoundingClientRect();
      return el.contains(document.elementFromPoint(r.x + r.width / 2, r.y + r.height / 2));
    });
    expect(hit, `${where}: ${key} is what a touch on its centre reaches`).toBe(true);
  }
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

describe('key-point handles on the demo storm at 360×640', () => {
  it('keeps the targets whole, inside the plotting area and apart on the storm as found', async () => {
    await handlesApart('as found');
    await page.screenshot({ path: join(ARTIFACTS, 'storm-handles-found.png') });
  });

  it('moves only the key point whose target a finger drags, and hides its name when the drag ends', async () => {
    for (const key of KEYS) {
      const before = await indexes();
      const at = await centre(handle(key));
      // Rise start and end of runoff have room outwards; peak and inflection move towards each other's far side.
      const dx = key === 'riseStart_ms' || key === 'peak_ms' ? -14 : 14;
      await touchDrag(at, { x: at.x + dx, y: at.y });
      await expect.poll(async () => (await indexes())[key], { timeout: 5_000 }).not.toBe(before[key]);
      const after = await indexes();
      expect(Math.sign(after[key] - before[key]), key).toBe(Math.sign(dx));
      for (const other of KEYS) if (other !== key) expect(after[other], `${other} after dragging ${key}`).toBe(before[other]);
      await expect.poll(namesShown).toBe(0);
      await handlesApart(`after dragging ${key}`);
    }
    await page.getByRole('button', { name: 'Reset key points' }).click();
  });

  it('keeps them apart with the Eckhardt filter drawn', async () => {
    if (!(await page.locator('details.storm-method').evaluate((d: HTMLDetailsElement) => d.open))) await page.locator('.storm-method summary').click();
    await page.locator('input[data-method="eckhardt"]').check();
    await showPlot();
    await handlesApart('Eckhardt');
  });

  it('keeps them apart with the inflection dragged next to the peak, the name shown in the plot only during the drag', async () => {
    const before = await indexes();
    const [box] = await boxes(page, '.storm-plot .plot-box');
    const peakX = box.x + Number(await handle('peak_ms').getAttribute('data-point-x'));
    const at = await centre(handle('inflection_ms'));
    await page.mouse.move(at.x, at.y);
    await page.mouse.down();
    await page.mouse.move(at.x - 10, at.y, { steps: 3 });
    // While dragging: the name, wholly inside the plotting area.
    await expect.poll(namesShown).toBe(1);
    const [area] = await boxes(page, '.storm-plot .u-over');
    const [name] = await boxes(page, '[data-testid="key-name"] > span');
    expect(within(name, area, 0.5)).toBe(true);
    await expect(page.getByTestId('key-name').textContent()).resolves.toMatch(/^Inflection \d+ \w{3} \d\d:\d\d$/);
    await page.screenshot({ path: join(ARTIFACTS, 'storm-handles-dragging.png') });
    await page.mouse.move(peakX + 2, at.y, { steps: 6 });
    await page.mouse.up();
    await expect.poll(namesShown).toBe(0);
    const after = await indexes();
    expect(after.inflection_ms).toBeLessThan(before.inflection_ms);
    // Stopped one reading after the peak at most (key-point-order.ts), the other points untouched.
    expect(after.inflection_ms).toBeGreaterThan(after.peak_ms);
    expect([after.riseStart_ms, after.peak_ms, after.runoffEnd_ms]).toEqual([before.riseStart_ms, before.peak_ms, before.runoffEnd_ms]);
    const points = await page.locator('.key-handle').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-point-x'))));
    expect(points[2] - points[1], 'the two points are closer than one target').toBeLessThan(44);
    await handlesApart('inflection next to the peak');
    await page.screenshot({ path: join(ARTIFACTS, 'storm-handles-close.png') });
  });

  it('keeps them apart with the whole window shown, the four points crowded together', async () => {
    await page.getByRole('button', { name: 'Reset key points' }).click();
    await page.getByLabel('Whole window').check();
    await showPlot();
    const span = async () => {
      const points = await page.locator('.key-handle').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-point-x'))));
      return points[3] - points[0];
    };
    // Once the plot has redrawn the whole window, the storm spans less than two targets.
    await expect.poll(span).toBeLessThan(2 * 44);
    await handlesApart('whole window');
    await page.screenshot({ path: join(ARTIFACTS, 'storm-handles-whole.png') });
    // A drag on a set-aside target still moves its own point.
    const before = await indexes();
    const at = await centre(handle('runoffEnd_ms'));
    await touchDrag(at, { x: at.x + 12, y: at.y });
    await expect.poll(async () => (await indexes()).runoffEnd_ms).toBeGreaterThan(before.runoffEnd_ms);
    const after = await indexes();
    expect([after.riseStart_ms, after.peak_ms, after.inflection_ms]).toEqual([before.riseStart_ms, before.peak_ms, before.inflection_ms]);
    await expect.poll(namesShown).toBe(0);
    await handlesApart('whole window, after a drag');
  });

  it('shows the name of a handle moved with the arrow keys inside the plot, and hides it when the focus leaves', async () => {
    const before = await indexes();
    await handle('runoffEnd_ms').focus();
    await page.keyboard.press('ArrowLeft');
    await expect.poll(async () => (await indexes()).runoffEnd_ms).toBe(before.runoffEnd_ms - 1);
    await expect(page.getByTestId('key-name').textContent()).resolves.toMatch(/^End of runoff \d+ \w{3} \d\d:\d\d$/);
    const [area] = await boxes(page, '.storm-plot .u-over');
    const [name] = await boxes(page, '[data-testid="key-name"] > span');
    expect(within(name, area, 0.5)).toBe(true);
    await handle('runoffEnd_ms').evaluate((el: HTMLElement) => el.blur());
    await expect.poll(namesShown).toBe(0);
  });
});

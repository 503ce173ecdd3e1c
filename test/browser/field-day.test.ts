// A technician's day at 360×640, offline after the first visit (issue 24): a 13-vertical gauging typed
// fast (taps and keys counted), reopened, corrected and exported vertical by vertical; labels never under
// the totals card and table cells never wrapped; the site plot's time labels on the readings' own day;
// storm handles apart and inside the plot; the site picker and the shared picture never cut. Outside
// references: core's mid-section (Turnipseed & Sauer 2010, USGS TM 3-A8) recomputed in Node, Node's Intl
// with the IANA zone database for the dates, papaparse reading the CSV, and the PNG signature and IHDR
// layout (ISO/IEC 15948 §5.2, §11.2.2). Geometry is the browser's own (getBoundingClientRect).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_SITE_ID, midSection, toLocalInput, verticalMeanVelocity, type PointVelocities } from '../../core';
import { formatQuantity } from '../../web/format';
import { ARTIFACTS, type Browser, type Preview } from '../support/browser/harness';
import { goTo, loadDemoSite, openApp, type AppSession } from '../support/browser/app';
import { boxes, intersects, within, wrappedTexts } from '../support/browser/geometry';

const ZONE = 'Pacific/Auckland';
let server: Preview;
let browser: Browser;
let page: Page;
let app: AppSession | undefined;
let siteId = '';
const pageErrors: string[] = [];

async function shot(name: string): Promise<void> {
  await page.screenshot({ path: join(ARTIFACTS, `day-${name}.png`) });
}
const go = (hash: string): Promise<void> => goTo(page, server.url, hash);

beforeAll(async () => {
  app = await openApp(4287, { hash: '#/sites', pageErrors });
  ({ server, browser, page } = app);
  await loadDemoSite(page);
  await browser.context.setOffline(true);
});

afterAll(async () => {
  expect(pageErrors).toEqual([]);
  await app?.close();
});

// Invented section: 13 verticals 0.5 m apart, edges dry; vertical 9 read at 0.2 and 0.8 depth.
const VERTICALS = Array.from({ length: 13 }, (_, i) => {
  const k = Math.min(i, 12 - i);
  const edge = k === 0;
  const v = edge ? 0 : Number((0.1 + 0.04 * k).toFixed(2));
  const velocity: PointVelocities = i === 8 ? { kind: 'two-point', v02_mps: Number((v + 0.05).toFixed(2)), v08_mps: Number((v - 0.05).toFixed(2)) } : { kind: 'six-tenths', v06_mps: v };
  return { station_m: 0.5 * i, depth_m: edge ? 0 : Number((0.2 + 0.05 * k).toFixed(2)), velocity };
});
const coreOf = (vs: typeof VERTICALS) => vs.map((v) => ({ station_m: v.station_m, depth_m: v.depth_m, velocity_mps: verticalMeanVelocity(v.velocity) }));

describe('a site of our own, offline', () => {
  it('keeps a site in Auckland time with a rating from two days ago', async () => {
    await go('#/sites/new');
    await page.locator('#site-code').fill('FB-2');
    await page.locator('#site-name').fill('Fernbrook at the ford');
    await page.locator('#site-timeZone').selectOption(ZONE);
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Fernbrook at the ford' }).waitFor();
    siteId = decodeURIComponent(page.url().split('#/sites/')[1]);
    await go(`#/sites/${siteId}/ratings/new`);
    await page.locator('#validFrom').fill(toLocalInput(Date.now() - 2 * 86_400_000, ZONE));
    await page.locator('#seg0-offset').fill('0.1');
    await page.locator('#seg0-coefficient').fill('5');
    await page.locator('#seg0-exponent').fill('1.8');
    await page.getByRole('button', { name: 'Save rating' }).click();
    await page.getByText('in force now').waitFor();
  });

  it('labels the site plot’s time axis with the readings’ own day and hours (never “1 Jan”)', async () => {
    const now = Math.floor(Date.now() / 60_000) * 60_000;
    const times = [now - 3 * 3_600_000, now - 2 * 3_600_000, now - 3_600_000];
    for (const [k, t] of times.entries()) {
      await go(`#/record/${siteId}`);
      await page.locator('#stage').fill(String(0.41 + 0.02 * k));
      await page.locator('#time').fill(toLocalInput(t, ZONE));
      await page.getByRole('button', { name: 'Save reading' }).click();
      await page.locator('[data-testid="saved"]').waitFor();
    }
    await go(`#/sites/${siteId}`);
    const host = page.locator('[data-time-ticks]');
    await host.waitFor();
    const labels = (await host.getAttribute('data-time-ticks'))!.split(' | ');
    // The readings' day in Auckland by Intl (IANA zone database), e.g. "2 Dec".
    const day = (t: number) => new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, day: 'numeric', month: 'short' }).format(t);
    const days = new Set(times.map(day));
    const hour = (t: number) => Number(new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, hour: '2-digit', hourCycle: 'h23' }).format(t));
    // Every local hour from an hour before the first reading to an hour after the last, in Auckland: a set,
    // so a window that crosses local midnight (22, 23, 0, 1) is compared as it is on the clock.
    const hours = new Set<number>();
    for (let t = times[0] - 3_600_000; t <= times[2] + 3_600_000; t += 60_000) hours.add(hour(t));
    expect(labels.length).toBeGreaterThanOrEqual(2);
    expect(days.has(labels[0].split(' ').slice(1).join(' '))).toBe(true);
    for (const l of labels) {
      const [clock] = l.split(' ');
      expect(clock).toMatch(/^\d\d:\d\d$/);
      expect(hours.has(Number(clock.slice(0, 2))), l).toBe(true);
    }
    expect(labels.join(' ')).not.toContain('1 Jan');
    await shot('site-plot');
  });
});

describe('a 13-vertical gauging', () => {
  /** Taps and key presses since the last reset, counted by the page itself. */
  const resetCounts = () => page.evaluate(() => {
    const w = window as unknown as { __taps: number; __keys: number; __counting?: boolean };
    w.__taps = 0;
    w.__keys = 0;
    if (!w.__counting) {
      w.__counting = true;
      document.addEventListener('pointerdown', () => w.__taps++, true);
      document.addEventListener('keydown', () => w.__keys++, true);
    }
  });
  const counts = () => page.evaluate(() => ({ taps: (window as unknown as { __taps: number }).__taps, keys: (window as unknown as { __keys: number }).__keys }));
  const rows = () => page.locator('[data-testid="verticals"] tbody tr').count();
  const typed = (x: number) => String(Number(x.toFixed(2)));

  it('types a regular vertical in at most 2 taps plus its digits, Enter moving box to box', async () => {
    await go(`#/sites/${siteId}/gaugings/new`);
    for (const v of VERTICALS.slice(0, 2)) {
      await page.locator('#vStation').fill(typed(v.station_m));
      await page.locator('#vDepth').fill(typed(v.depth_m));
      await page.locator('#v06').fill(typed((v.velocity as { v06_mps: number }).v06_mps));
      await page.getByRole('button', { name: 'Keep vertical' }).click();
    }
    const measured: { taps: number; keys: number; digits: number }[] = [];
    for (const [i, v] of VERTICALS.entries()) {
      if (i < 2 || i === 12) continue;
      await resetCounts();
      // One tap takes the offered station (the last spacing continued).
      await expect(page.getByTestId('offered-station').textContent()).resolves.toBe(`Station ${typed(v.station_m)} m`);
      if (i === 8) {
        // The carried-over method is shown, and changed in one tap.
        await expect(page.getByTestId('carried').textContent()).resolves.toContain(`vertical ${i}`);
        await page.getByRole('button', { name: '0.2 + 0.8' }).tap();
      }
      if (i === 9) {
        await expect(page.getByRole('button', { name: '0.2 + 0.8' }).getAttribute('aria-pressed')).resolves.toBe('true');
        await page.getByRole('button', { name: '0.6 depth' }).tap();
      }
      await page.getByTestId('offered-station').tap();
      const o = v.velocity;
      const parts = [typed(v.depth_m), ...(o.kind === 'two-point' ? [typed(o.v02_mps), typed(o.v08_mps)] : [typed((o as { v06_mps: number }).v06_mps)])];
      for (const p of parts) {
        await page.keyboard.type(p);
        await page.keyboard.press('Enter');
      }
      await expect.poll(rows).toBe(i + 1);
      const c = await counts();
      const digits = parts.join('').length;
      measured.push({ ...c, digits });
      // A regular vertical: 1 tap (2 with a change of method) and its digits with one Enter a box.
      expect(c.taps, `vertical ${i + 1}`).toBeLessThanOrEqual(i === 8 || i === 9 ? 2 : 1);
      expect(c.keys, `vertical ${i + 1}`).toBe(digits + parts.length);
    }
    console.log(`regular verticals: ${JSON.stringify(measured)}`);
    // The last edge: the offered station and the edge button.
    await page.getByTestId('offered-station').tap();
    await page.getByRole('button', { name: 'Edge of water' }).tap();
    await page.getByRole('button', { name: 'Keep vertical' }).tap();
    await expect.poll(rows).toBe(13);
    const expected = midSection(coreOf(VERTICALS));
    await expect.poll(() => page.getByTestId('running-discharge').textContent()).toBe(formatQuantity('discharge', expected.discharge_m3s, 'metric'));
  });

  it('never puts the totals card over a label, wraps no value in the table and shows more than three rows', async () => {
    await page.locator('#gStage').fill('0.45');
    for (const target of ['#gGrade', '#vStation', '[data-testid="verticals"]']) {
      await page.locator(target).scrollIntoViewIfNeeded();
      const [card] = await boxes(page, '[data-testid="running-totals"]');
      for (const label of await boxes(page, 'form label, form legend, form .field .hint')) expect(intersects(card, label), target).toBe(false);
    }
    const table = page.locator('.vertical-table');
    await table.scrollIntoViewIfNeeded();
    await shot('gauging-table');
    expect(await wrappedTexts(page, '[data-testid="verticals"] td:not(.actions), [data-testid="verticals"] th > span.unit')).toEqual([]);
    // One Fix button a row, on one line.
    const tops = await page.locator('[data-testid="verticals"] td.actions').evaluateAll((tds) => tds.map((td) => new Set([...td.querySelectorAll('button')].map((b) => Math.round(b.getBoundingClientRect().top))).size));
    expect(tops.every((n) => n === 1)).toBe(true);
    // Nothing cut at the right: the table is no wider than its card.
    await expect(table.evaluate((e) => e.scrollWidth - e.clientWidth)).resolves.toBeLessThanOrEqual(0);
    const [frame] = await boxes(page, '.vertical-table');
    const visible = (await boxes(page, '[data-testid="verticals"] tbody tr')).filter((r) => within(r, frame));
    expect(visible.length).toBeGreaterThan(3);
    for (const cell of await boxes(page, '[data-testid="verticals"] td')) expect(cell.x + cell.width).toBeLessThanOrEqual(frame.x + frame.width + 0.5);
    await shot('gauging-table');
    await page.locator('#gGrade').scrollIntoViewIfNeeded();
    await shot('gauging-grade');
    await page.getByRole('button', { name: 'Save gauging' }).click();
    await page.getByTestId('gauging-saved').waitFor();
  });

  it('opens the saved gauging to every vertical with its share, as core’s mid-section gives', async () => {
    await go(`#/sites/${siteId}/gaugings`);
    await page.locator('ul[aria-label="Gaugings, newest first"] a.item').first().click();
    await page.getByTestId('view-discharge').waitFor();
    const expected = midSection(coreOf(VERTICALS));
    await expect(page.getByTestId('view-discharge').textContent()).resolves.toBe(formatQuantity('discharge', expected.discharge_m3s, 'metric'));
    const cells = await page.locator('[data-testid="verticals"] tbody tr').evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent)));
    expect(cells).toHaveLength(13);
    cells.forEach((c, i) => expect(c[5], `share of vertical ${i + 1}`).toBe((100 * expected.subsections[i].share).toFixed(1)));
    expect(await wrappedTexts(page, '[data-testid="verticals"] td')).toEqual([]);
    await shot('gauging-view');
  });

  it('corrects it as a new revision of the same gauging', async () => {
    const before = await storedGaugings();
    await page.getByRole('link', { name: 'Correct' }).click();
    await page.getByRole('heading', { name: 'Correct a gauging' }).waitFor();
    await expect(page.locator('[data-testid="verticals"] tbody tr').count()).resolves.toBe(13);
    await page.getByRole('button', { name: 'Fix vertical 7' }).click();
    await page.locator('#vDepth').fill('0.6');
    await page.getByRole('button', { name: 'Keep the correction' }).click();
    await page.getByRole('button', { name: 'Save the correction' }).click();
    await page.getByTestId('gauging-saved').waitFor();
    const corrected = VERTICALS.map((v, i) => (i === 6 ? { ...v, depth_m: 0.6 } : v));
    const q = midSection(coreOf(corrected)).discharge_m3s;
    await expect(page.getByTestId('gauging-saved').textContent()).resolves.toContain(`Correction saved: ${formatQuantity('discharge', q, 'metric')}`);
    const after = await storedGaugings();
    expect(after.map((g) => g.id)).toEqual(before.map((g) => g.id));
    expect(after[0].rev > before[0].rev).toBe(true);
    expect(after[0].discharge_m3s).toBeCloseTo(q, 12);
    // The two-point vertical kept its point velocities through the correction.
    expect(after[0].verticals[8].observed).toEqual(VERTICALS[8].velocity);
  });

  it('exports the verticals as CSV, one row per vertical with core’s share', async () => {
    await go('#/data');
    await page.locator('#export-site').selectOption(siteId);
    await page.locator('#export-kind').selectOption('verticals-csv');
    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Download' }).click();
    const csv = readFileSync((await (await download).path())!, 'utf8');
    const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(13);
    const corrected = midSection(coreOf(VERTICALS.map((v, i) => (i === 6 ? { ...v, depth_m: 0.6 } : v))));
    parsed.data.forEach((r, i) => expect(Number(r.share_percent)).toBeCloseTo(100 * corrected.subsections[i].share, 2));
    expect(parsed.data[8]['velocity_0.2_m/s']).toBe(String((VERTICALS[8].velocity as { v02_mps: number }).v02_mps));
  });

  it('shows a shift of 0.120 m on one line', async () => {
    await go(`#/sites/${siteId}/ratings`);
    await page.locator('.list a.item').first().click();
    await page.locator('#shiftValue').fill('0.12');
    await page.getByRole('button', { name: 'Add shift' }).click();
    await page.getByText('Shift saved').waitFor();
    await page.getByTestId('shift-words').scrollIntoViewIfNeeded();
    await expect(page.getByTestId('shift-words').textContent()).resolves.toBe('0.120 m');
    expect(await wrappedTexts(page, '[data-testid="shift-words"] .nowrap')).toEqual([]);
    await shot('shifts');
  });

  it('keeps every shift in the list whole: no value wrapped, nothing cut, clear of its Remove button', async () => {
    await page.locator('#shiftKind').selectOption('stage-variable');
    await page.locator('#shiftFrom').fill(toLocalInput(Date.now() - 86_400_000, ZONE));
    await page.locator('#shiftPoints').fill('0.30 -0.02\n0.80 0.00');
    await page.getByRole('button', { name: 'Add shift' }).click();
    await expect.poll(() => page.getByTestId('shift-words').count()).toBe(2);
    const words = await page.getByTestId('shift-words').allTextContents();
    expect(words.some((w) => /^[−-]0\.020 m at 0\.300 m, 0\.000 m at 0\.800 m$/.test(w)), words.join(' | ')).toBe(true);
    // Each value keeps the comma after it: no line of the list starts with a comma.
    for (const piece of await page.locator('[data-testid="shift-words"] .nowrap').allTextContents()) expect(piece).not.toMatch(/^[,\s]/);
    expect(await wrappedTexts(page, '[data-testid="shift-words"] .nowrap')).toEqual([]);
    const items = page.locator('ul[aria-label="Dated shifts"] > li');
    await expect(items.count()).resolves.toBe(2);
    for (let k = 0; k < 2; k++) {
      const item = items.nth(k);
      await expect(item.evaluate((e) => e.scrollWidth - e.clientWidth)).resolves.toBeLessThanOrEqual(0);
      const [text] = await boxes(page, `ul[aria-label="Dated shifts"] > li:nth-child(${k + 1}) > span`);
      const [button] = await boxes(page, `ul[aria-label="Dated shifts"] > li:nth-child(${k + 1}) > button`);
      const [frame] = await boxes(page, `ul[aria-label="Dated shifts"] > li:nth-child(${k + 1})`);
      expect(intersects(text, button), `shift ${k + 1}: words and Remove`).toBe(false);
      expect(within(text, frame) && within(button, frame), `shift ${k + 1}: inside its row`).toBe(true);
    }
    await page.getByTestId('shift-words').first().scrollIntoViewIfNeeded();
    await shot('shifts-two');
  });
});

/** The gaugings of the test site straight from IndexedDB (the test may look; screens may not). */
function storedGaugings(): Promise<{ id: string; rev: string; discharge_m3s: number; verticals: { observed?: unknown }[] }[]> {
  return page.evaluate(
    (id) =>
      new Promise((resolve, reject) => {
        const open = indexedDB.open('freshet');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const req = open.result.transaction('gaugings').objectStore('gaugings').getAll();
          req.onsuccess = () => {
            resolve((req.result as { siteId: string }[]).filter((g) => g.siteId === id) as never);
            open.result.close();
          };
        };
      }),
    siteId,
  );
}

describe('the storm screen and its picture', () => {
  const LONG_NAME = 'Millstone Ford below the old weir at the lower millrace pool';

  it('takes a 60-character site name', async () => {
    expect(LONG_NAME.length).toBe(60);
    await go(`#/sites/${DEMO_SITE_ID}/edit`);
    await page.locator('#site-name').fill(LONG_NAME);
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: LONG_NAME }).waitFor();
  });

  it('shows the whole site name in the picker, wrapped, not cut', async () => {
    await page.goto(`${server.url}#/storm/${DEMO_SITE_ID}`);
    await page.getByTestId('direct-volume').waitFor({ timeout: 30_000 });
    const picker = await page.locator('#storm-site').evaluate((s: HTMLSelectElement) => ({
      appearance: getComputedStyle(s).appearance, scroll: s.scrollWidth, client: s.clientWidth, height: s.getBoundingClientRect().height,
    }));
    expect(picker.appearance).toBe('base-select');
    expect(picker.scroll).toBeLessThanOrEqual(picker.client);
    // Two lines of text: taller than the one-line 48 px control.
    expect(picker.height).toBeGreaterThan(48);
    await shot('storm-picker');
  });

  const handleCheck = async (where: string) => {
    const handles = await boxes(page, '.key-handle');
    expect(handles.length, where).toBe(4);
    const [plot] = await boxes(page, '.storm-plot .plot-box');
    for (const h of handles) {
      expect(h.width).toBeGreaterThanOrEqual(44);
      expect(h.height).toBeGreaterThanOrEqual(44);
      expect(within(h, plot, 1), `${where}: handle inside the plot`).toBe(true);
    }
    for (let a = 0; a < handles.length; a++) for (let b = a + 1; b < handles.length; b++) expect(intersects(handles[a], handles[b]), `${where}: handles ${a}, ${b}`).toBe(false);
  };

  it('keeps the key-point handles whole, apart and inside the plot, with Eckhardt too', async () => {
    await page.evaluate(() => scrollTo(0, 0));
    await handleCheck('variable slope');
    if (!(await page.locator('details.storm-method').evaluate((d: HTMLDetailsElement) => d.open))) await page.locator('.storm-method summary').click();
    await page.locator('input[data-method="eckhardt"]').check();
    await page.evaluate(() => scrollTo(0, 0));
    await handleCheck('Eckhardt');
    await shot('storm-handles');
  });

  it('hides the point’s name once a drag ends', async () => {
    const end = page.locator('[data-handle="runoffEnd_ms"]');
    await end.scrollIntoViewIfNeeded();
    const r = (await end.boundingBox())!;
    const p = { x: r.x + r.width / 2, y: r.y + r.height / 2 };
    await page.mouse.move(p.x, p.y);
    await page.mouse.down();
    await page.mouse.move(p.x - 20, p.y, { steps: 4 });
    await expect(page.getByTestId('key-name').isVisible()).resolves.toBe(true);
    await page.mouse.up();
    await expect.poll(() => page.getByTestId('key-name').count()).toBe(0);
  });

  it('lays out the shared picture’s text inside the image with the 60-character name', async () => {
    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Share picture' }).click();
    const png = readFileSync((await (await download).path())!);
    expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    const width = png.readUInt32BE(16);
    const plotWidth = await page.locator('.storm-plot canvas').first().evaluate((c: HTMLCanvasElement) => c.width);
    expect(width).toBe(plotWidth + 24);
    const plotHeight = await page.locator('.storm-plot canvas').first().evaluate((c: HTMLCanvasElement) => c.height);
    // The title (code, the 60-character name, the day) cannot fit one line of 336 px: two title lines of
    // 21 px and five figure lines of 18 px at least, above the plot and its 12 px margins.
    expect(png.readUInt32BE(20)).toBeGreaterThanOrEqual(plotHeight + 24 + 2 * 21 + 5 * 18);
    // Decoded by Chromium: ink above the plot, and none in the 12 px margins either side (text cut at the
    // edge of the image would leave it there).
    const ink = await page.evaluate(async ([b64, plotH]) => {
      const img = new Image();
      img.src = `data:image/png;base64,${b64}`;
      await img.decode();
      const c = document.createElement('canvas');
      c.width = img.width;
      c.height = img.height;
      const ctx = c.getContext('2d')!;
      ctx.drawImage(img, 0, 0);
      const data = ctx.getImageData(0, 0, img.width, img.height).data;
      const dark = (x: number, y: number) => data[4 * (y * img.width + x)] < 128;
      const textBottom = img.height - 12 - Number(plotH);
      let textRows = 0;
      let marginInk = 0;
      for (let y = 0; y < img.height; y++) {
        let rowInk = false;
        for (let x = 0; x < img.width; x++) {
          if (!dark(x, y)) continue;
          rowInk = true;
          if (x < 12 || x >= img.width - 12) marginInk++;
        }
        if (rowInk && y < textBottom) textRows++;
      }
      return { textRows, marginInk };
    }, [png.toString('base64'), plotHeight] as const);
    expect(ink.textRows).toBeGreaterThan(60);
    expect(ink.marginInk).toBe(0);
    await page.screenshot({ path: join(ARTIFACTS, 'day-storm-picture-page.png') });
    await page.evaluate((b64) => {
      document.body.innerHTML = `<img alt="" src="data:image/png;base64,${b64}" style="width:100%">`;
    }, png.toString('base64'));
    await shot('storm-picture');
  });
});

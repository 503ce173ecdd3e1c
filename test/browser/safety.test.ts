// Issue 10 items 4, 10 and 11 in Chromium against the built app at 360×640:
// - the Content-Security-Policy (meta tag and preview header) holds on every area with no violation,
//   while an injected inline script is refused (so the policy is really enforced);
// - a reading typed at a skipped or repeated wall time asks which instant was meant and stores it
//   (Europe/Oslo 2026: forward 29 March 02:00→03:00, back 25 October 03:00→02:00; IANA tz database,
//   EU rule of Directive 2000/84/EC);
// - hostile and absurd input in every field of the site and reading forms shows no internal name and no
//   raw millisecond number.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import * as core from '../../core';
import type { Preview } from '../support/browser/harness';
import { goTo, openApp, type AppSession } from '../support/browser/app';

const { DEMO_SITE_ID } = core;
let server: Preview;
let page: Page;
let app: AppSession | undefined;

// Internal names: snake_case identifiers, camelCase record fields, raw millisecond counts, error class
// names, NaN/undefined; and every camelCase function exported by the core (e.g. separateBaseflow).
// (innerText runs adjacent buttons together, "Add location" + "Save" → "locationSave", so camelCase is
// matched by name: the core's exports and the record fields, not by shape.)
const LEAK = /\b[A-Za-z]+_[A-Za-z0-9_]+\b|\b(jumpLimit|timeZone|displayUnits|siteId|readingId|gaugedRange|baseflowAtPoints|bfiMax|followsClock)\b|\d{11,}|\bUTC ms\b|epoch|milliseconds|RecordValidationError|StorageError|RangeError|\bNaN\b|\bundefined\b/;
const CORE_NAMES = Object.keys(core).filter((k) => /^[a-z]+[A-Z]/.test(k));

const go = (hash: string): Promise<void> => goTo(page, server.url, hash);
/** The text a user can read, with their own typed text (echoed in quotes) taken out. */
async function visibleText(): Promise<string> {
  // The time-zone list (option names such as "Africa/Addis_Ababa") is not a message: leave selects out.
  const text = await page.evaluate(() => {
    const selects = [...document.querySelectorAll('select')];
    for (const s of selects) s.style.display = 'none';
    const t = document.body.innerText;
    for (const s of selects) s.style.display = '';
    return t;
  });
  return text.replace(/"[^"]*"|“[^”]*”/g, '""');
}
async function expectPlain(where: string): Promise<void> {
  const text = await visibleText();
  expect(LEAK.exec(text)?.[0], where).toBeUndefined();
  for (const name of CORE_NAMES) expect(text.includes(name), `${where}: ${name}`).toBe(false);
}
async function violations(): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __csp: string[] }).__csp ?? []);
}
async function storedReadings(siteId: string): Promise<{ time_ms: number; stage_m: number }[]> {
  return page.evaluate(
    (id) =>
      new Promise<{ time_ms: number; stage_m: number }[]>((resolve, reject) => {
        const open = indexedDB.open('freshet');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const req = open.result.transaction('readings').objectStore('readings').getAll();
          req.onsuccess = () => {
            resolve((req.result as { siteId: string; deleted?: boolean; time_ms: number; stage_m: number }[]).filter((r) => r.siteId === id && !r.deleted));
            open.result.close();
          };
        };
      }),
    siteId,
  );
}

beforeAll(async () => {
  app = await openApp(4621, {
    beforePage: (b) =>
      b.context.addInitScript(() => {
        const w = window as unknown as { __csp: string[] };
        w.__csp = [];
        document.addEventListener('securitypolicyviolation', (e) => w.__csp.push(`${e.effectiveDirective} ${e.blockedURI}`));
      }),
  });
  ({ server, page } = app);
});

afterAll(async () => {
  await app?.close();
});

describe('Content-Security-Policy (issue 10 item 10)', () => {
  it('is sent as a header and written into the page, with no inline script allowed', async () => {
    const res = await fetch(server.url);
    const header = res.headers.get('content-security-policy') ?? '';
    expect(header).toMatch(/script-src 'self'(;|$)/);
    expect(header).toMatch(/frame-ancestors 'none'/);
    const meta = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(meta).toMatch(/default-src 'self'/);
    expect(meta).toMatch(/connect-src 'self' https: http:\/\/127\.0\.0\.1:\* http:\/\/localhost:\*/);
    expect(meta).not.toMatch(/unsafe-inline|unsafe-eval/);
  });

  it('lets every area work with no violation: service worker, demo, plots, storm, CSV download', async () => {
    await go('#/sites');
    await page.getByRole('button', { name: 'Load the demo site' }).click();
    await page.waitForURL(new RegExp(`#/sites/${DEMO_SITE_ID}$`), { timeout: 60_000 });
    await page.locator('.hydrograph canvas, .plot canvas').first().waitFor({ timeout: 30_000 }); // uPlot drew
    for (const hash of ['#/sites', '#/sites/new', '#/record', `#/record/${DEMO_SITE_ID}`, '#/storm', `#/storm/${DEMO_SITE_ID}`, '#/data', '#/about']) {
      await go(hash);
      await page.waitForTimeout(300);
    }
    await go(`#/storm/${DEMO_SITE_ID}`);
    await page.locator('canvas').first().waitFor({ timeout: 30_000 });
    await go('#/data');
    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: /^Download( CSV)?$/ }).first().click();
    expect((await download).suggestedFilename()).toMatch(/\.(csv|xml)$/); // a blob: download
    // The plot's share picture travels as data: and blob: images: both must load under the policy.
    const loaded = await page.evaluate(async () => {
      const c = document.createElement('canvas');
      c.width = 4;
      c.height = 4;
      c.getContext('2d')!.fillRect(0, 0, 4, 4);
      const load = (src: string) => new Promise<boolean>((ok) => { const i = new Image(); i.onload = () => ok(true); i.onerror = () => ok(false); i.src = src; });
      const blob = await new Promise<Blob>((ok) => c.toBlob((b) => ok(b!), 'image/png'));
      return [await load(c.toDataURL('image/png')), await load(URL.createObjectURL(blob))];
    });
    expect(loaded).toEqual([true, true]);
    expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
    expect(await violations()).toEqual([]);
  });

  it('refuses an injected inline script (the policy is enforced)', async () => {
    const ran = await page.evaluate(async () => {
      const s = document.createElement('script');
      s.textContent = 'window.__injected = true';
      document.body.append(s);
      await new Promise((r) => setTimeout(r, 100));
      return (window as unknown as { __injected?: boolean }).__injected === true;
    });
    expect(ran).toBe(false);
    expect((await violations()).some((v) => v.startsWith('script-src') && v.endsWith('inline'))).toBe(true);
  });
});

describe('times the clocks skipped or repeated (issue 10 item 4)', () => {
  let siteId = '';
  it('creates a site in Europe/Oslo', async () => {
    await go('#/sites/new');
    await page.locator('#site-code').fill('OS-1');
    await page.locator('#site-name').fill('Skarv bekk');
    await page.locator('#site-timeZone').selectOption('Europe/Oslo');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.waitForURL(/#\/sites\/[0-9a-f-]{36}$/);
    siteId = /#\/sites\/([0-9a-f-]{36})$/.exec(page.url())![1];
  });

  it('asks which time was meant for 02:30 on 29 March 2026 and stores the one chosen', async () => {
    await go(`#/record/${siteId}`);
    await page.locator('#stage').fill('0.512');
    await page.locator('#time').fill('2026-03-29T02:30');
    const choice = page.getByTestId('time-choice');
    await expect(choice.textContent()).resolves.toMatch(/did not happen in Europe\/Oslo/);
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByText('Choose which of the two times below was meant.').waitFor();
    expect(await storedReadings(siteId)).toEqual([]);
    await page.getByLabel(/03:30 \(UTC\+02:00\), if the watch was not yet put forward/).check();
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByTestId('saved').waitFor();
    expect((await storedReadings(siteId)).map((r) => r.time_ms)).toEqual([Date.UTC(2026, 2, 29, 1, 30)]);
  });

  it('asks which 02:30 on 25 October 2026 and stores the second when chosen', async () => {
    await go(`#/record/${siteId}`);
    await page.locator('#stage').fill('0.498');
    await page.locator('#time').fill('2026-10-25T02:30');
    await expect(page.getByTestId('time-choice').textContent()).resolves.toMatch(/happened twice in Europe\/Oslo/);
    await page.getByLabel(/The second 02:30 \(UTC\+01:00\)/).check();
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByTestId('saved').waitFor();
    const times = (await storedReadings(siteId)).map((r) => r.time_ms).sort((a, b) => a - b);
    expect(times).toEqual([Date.UTC(2026, 2, 29, 1, 30), Date.UTC(2026, 9, 25, 1, 30)]);
  });
});

describe('hostile and absurd input shows no internal name (issue 10 item 11)', () => {
  const hostile = [
    '1e23', '100000000000000000000000', '1 2', '-0', 'NaN', 'undefined', '<img src=x onerror=alert(1)>',
    "=cmd|' /C calc'!A0", '١٢٣', '0x10', '\u202e12', 'x'.repeat(5000), '1767225600000', '-99999999',
  ];

  it('site form: every field', async () => {
    for (const value of hostile) {
      await go('#/sites/new');
      for (const id of ['code', 'name', 'area', 'jumpLimit', 'datumDescription', 'datumElevation', 'lat', 'lon']) await page.locator(`#site-${id}`).fill(value);
      await page.getByRole('button', { name: 'Save site' }).click();
      await page.getByRole('alert').first().waitFor();
      await expectPlain(`site form, every field "${value.slice(0, 30)}"`);
    }
    // Valid numbers but text past the stored limits: the refusal comes from the core's validation.
    await go('#/sites/new');
    for (const [id, v] of [['code', 'C'.repeat(300)], ['name', 'N'], ['area', ''], ['jumpLimit', '0.3'], ['datumDescription', ''], ['datumElevation', ''], ['lat', ''], ['lon', '']]) {
      await page.locator(`#site-${id}`).fill(v);
    }
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('alert').first().waitFor();
    expect(await visibleText()).toMatch(/The site code is needed and must be at most 40 characters long\./);
    await expectPlain('site form, long code');
    // Absurd area: refused with the plausible range.
    await page.locator('#site-code').fill('AB-1');
    await page.locator('#site-area').fill('100000000000000000000000');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByText(/catchment area must be above 0 and at most 10,000,000 km²/).waitFor();
    await expectPlain('site form, area 1e23');
  });

  it('reading form: every field', async () => {
    for (const value of hostile) {
      await go(`#/record/${DEMO_SITE_ID}`);
      await page.locator('#stage').fill(value);
      await page.locator('#observer').fill(value);
      await page.locator('#note').fill(value);
      await page.getByRole('button', { name: 'Save reading' }).click();
      await page.waitForTimeout(200);
      await expectPlain(`reading form "${value.slice(0, 30)}"`);
    }
    // A number that parses but no gauge reads, and a year 0070 time: refused by the core in plain words.
    await go(`#/record/${DEMO_SITE_ID}`);
    await page.locator('#stage').fill('100000000000000000000000');
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByText(/The stage must be a number from −1,000 to 1,000 m/).waitFor();
    await expectPlain('reading form, stage 1e23');
    await page.locator('#stage').fill('0.5');
    await page.locator('#time').fill('0070-06-01T10:00');
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByText(/time must be a date and time from 1970 onwards/).waitFor();
    await expectPlain('reading form, year 0070');
  });
});

// The app shell in Chromium against the built app: service-worker control, offline start (with parts
// loaded on first use), install criteria, a 360×640 layout with no sideways scroll, touch targets and
// axe-core checks on every area.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page, Request, Response } from 'playwright-core';
import { ARTIFACTS, launchBrowser, ROOT, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { seriousViolations } from '../support/browser/axe';
import { FIRST_VISIT_BUDGET_BYTES, measureFirstVisit } from '../support/browser/first-visit';

const AREAS = ['sites', 'record', 'storm', 'data', 'sync', 'about'];
let server: Preview;
let browser: Browser;
let page: Page;

/** Width and height of a PNG from its IHDR chunk (PNG spec, ISO/IEC 15948 §11.2.2). */
function pngSize(bytes: Buffer): { width: number; height: number } {
  expect(bytes.subarray(1, 4).toString('ascii')).toBe('PNG');
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

async function waitForController(p: Page): Promise<void> {
  await p.waitForFunction(() => !!navigator.serviceWorker.controller, undefined, { timeout: 15_000 });
}

async function openArea(p: Page, area: string): Promise<void> {
  await p.locator(`nav[aria-label="Main"] a[href="#/${area}"]`).click();
  await p.locator('#screen-title').waitFor();
  await p.waitForFunction((a) => location.hash === `#/${a}`, area);
}

beforeAll(async () => {
  server = await startPreview(4181);
  browser = await launchBrowser();
  page = await browser.context.newPage();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

describe('service worker and offline start', () => {
  it('controls the first visit', async () => {
    await page.goto(server.url);
    await waitForController(page);
    const scope = await page.evaluate(async () => (await navigator.serviceWorker.ready).scope);
    expect(scope).toBe(server.url);
  });

  it('starts from the service worker with no network, opens every area, and says it is offline', async () => {
    /** The top bar's network word once it reads `want` (or whatever it reads after 15 s). */
    const net = async (want: string): Promise<string | null> => {
      await page.waitForFunction((w) => document.querySelector('.topbar .net')?.textContent === w, want, { timeout: 15_000 }).catch(() => undefined);
      return page.locator('.topbar .net').textContent();
    };
    expect(await net('Online')).toBe('Online');
    await browser.context.setOffline(true);
    try {
      const res = await page.reload();
      expect(res?.fromServiceWorker()).toBe(true);
      await expect(page.locator('nav[aria-label="Main"]').isVisible()).resolves.toBe(true);
      // What the user sees comes from requests that got no answer, not from navigator.onLine (Chromium
      // 150 reports true on a page reloaded from the service worker while the context is offline).
      expect(await net('Offline')).toBe('Offline');
      for (const area of AREAS) await openArea(page, area);
      expect(await net('Offline')).toBe('Offline');
    } finally {
      await browser.context.setOffline(false);
    }
    // The network is back: the next change of screen finds it.
    await openArea(page, 'sites');
    expect(await net('Online')).toBe('Online');
  });
});

describe('install criteria', () => {
  it('has a manifest with the fields and icons an install needs', async () => {
    const href = await page.locator('link[rel="manifest"]').getAttribute('href');
    expect(href).toBe('/manifest.webmanifest');
    const manifest = (await page.evaluate(async (h) => (await fetch(h)).json(), href!)) as {
      name: string; short_name: string; start_url: string; scope: string; display: string; id: string;
      theme_color: string; background_color: string; icons: { src: string; sizes: string; type: string; purpose?: string }[];
    };
    // The values we ship (vite.config.ts); install needs name, icons 192 and 512, start_url, display
    // (W3C Web Application Manifest; Chromium's installability criteria).
    expect(manifest.name).toBe('Freshet — stream gauging in the field');
    expect(manifest.short_name).toBe('Freshet');
    expect(manifest.id).toBe('./');
    expect(manifest.start_url).toBe('./');
    expect(manifest.scope).toBe('./');
    expect(manifest.display).toBe('standalone');
    expect(manifest.theme_color).toBe('#0d4a5c');
    expect(manifest.background_color).toBe('#f6f3ec');
    // W3C manifest §start_url: the start URL, resolved against the manifest URL, must be within scope.
    const base = new URL(href!, server.url);
    expect(new URL(manifest.start_url, base).href.startsWith(new URL(manifest.scope, base).href)).toBe(true);
    expect(manifest.icons).toEqual([
      { src: 'icons/freshet.svg', sizes: 'any', type: 'image/svg+xml' },
      { src: 'icons/freshet-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
      { src: 'icons/freshet-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
      { src: 'icons/freshet-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
    ]);
    const pngs = manifest.icons.filter((i) => i.type === 'image/png');
    for (const icon of pngs) {
      const [w, h] = icon.sizes.split('x').map(Number);
      const actual = pngSize(readFileSync(join(ROOT, 'dist', icon.src)));
      expect(actual, icon.src).toEqual({ width: w, height: h });
    }
    expect(pngs.map((i) => i.sizes)).toEqual(expect.arrayContaining(['192x192', '512x512']));
    expect(pngs.some((i) => i.purpose?.split(' ').includes('maskable'))).toBe(true);
    expect(manifest.icons.some((i) => i.type === 'image/svg+xml')).toBe(true);
  });
});

describe('phone layout and accessibility at 360×640', () => {
  for (const theme of ['system', 'sunlight', 'night'] as const) {
    it(`no area scrolls sideways or has serious axe findings (${theme} theme)`, async () => {
      await page.goto(server.url);
      await page.evaluate((t) => localStorage.setItem('freshet.theme', t), theme);
      await page.reload();
      for (const area of AREAS) {
        await openArea(page, area);
        const { scrollWidth, clientWidth } = await page.evaluate(() => ({
          scrollWidth: document.documentElement.scrollWidth,
          clientWidth: document.documentElement.clientWidth,
        }));
        expect(scrollWidth, `${area} scrolls sideways`).toBeLessThanOrEqual(clientWidth);
        expect(await seriousViolations(page), `${area} (${theme})`).toEqual([]);
        if (theme === 'system') await page.screenshot({ path: join(ARTIFACTS, `shell-${area}.png`) });
      }
    });
  }

  it('follows the phone: dark colours in dark mode, sunlight colours when more contrast is asked for', async () => {
    await page.goto(server.url);
    await page.evaluate(() => localStorage.setItem('freshet.theme', 'system'));
    const theme = () => page.evaluate(() => document.documentElement.dataset.theme);
    await page.emulateMedia({ colorScheme: 'dark', contrast: 'no-preference' });
    await page.reload();
    expect(await theme()).toBe('night');
    const bg = await page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);
    expect(bg).toBe('rgb(15, 21, 24)'); // the night background, #0f1518
    await page.emulateMedia({ colorScheme: 'light' });
    await page.waitForFunction(() => document.documentElement.dataset.theme === 'day');
    await page.emulateMedia({ contrast: 'more' });
    await page.waitForFunction(() => document.documentElement.dataset.theme === 'sunlight');
    await page.emulateMedia({ colorScheme: 'light', contrast: 'no-preference' });
  });

  it('gives every control a touch target of at least 44 × 44 CSS px', async () => {
    await page.goto(server.url);
    for (const area of AREAS) {
      await openArea(page, area);
      const small = await page.evaluate(() =>
        [...document.querySelectorAll<HTMLElement>('button, select, input:not([type=radio]):not([type=checkbox]), nav a, a.button, label.choice')]
          .filter((el) => el.offsetParent !== null)
          .map((el) => ({ el: el.outerHTML.slice(0, 80), r: el.getBoundingClientRect() }))
          .filter(({ r }) => r.width < 44 || r.height < 44)
          .map(({ el, r }) => `${el} ${r.width}×${r.height}`),
      );
      expect(small, area).toEqual([]);
    }
  });
});

describe('first-visit budget', () => {
  it('loads at most 45 KiB gzip of JS and CSS on the first visit', async () => {
    const { files, total_gzip_bytes } = await measureFirstVisit(server.url);
    expect(files.some((f) => f.kind === 'script')).toBe(true);
    expect(files.some((f) => /uplot/i.test(f.url)), 'uPlot must load only with a plot').toBe(false);
    expect(total_gzip_bytes).toBeLessThanOrEqual(FIRST_VISIT_BUDGET_BYTES);
  });
});

describe('parts loaded on first use, offline', () => {
  it('precaches every chunk, and after the first visit loads the demo site and its plot with no network', async () => {
    // Every script and stylesheet of the build is in the service worker's precache list (vite.config.ts
    // globs them all), so what the first visit did not load is still there offline.
    const sw = readFileSync(join(ROOT, 'dist', 'sw.js'), 'utf8');
    const assets = readdirSync(join(ROOT, 'dist', 'assets')).filter((f) => /\.(js|css)$/.test(f));
    expect(assets.filter((f) => !sw.includes(`assets/${f}`)), 'chunks missing from the precache').toEqual([]);
    await page.goto(server.url);
    await waitForController(page);
    await browser.context.setOffline(true);
    const fetched: { url: string; fromWorker: boolean }[] = [];
    const failed: string[] = [];
    const onResponse = (r: Response) => {
      if (['script', 'stylesheet'].includes(r.request().resourceType())) fetched.push({ url: r.url(), fromWorker: r.fromServiceWorker() });
    };
    const onFailed = (r: Request) => {
      if (['script', 'stylesheet'].includes(r.resourceType())) failed.push(r.url());
    };
    page.on('response', onResponse);
    page.on('requestfailed', onFailed);
    try {
      const res = await page.reload();
      expect(res?.fromServiceWorker()).toBe(true);
      await page.locator('#screen-title').waitFor();
      const beforeTap = new Set(fetched.map((f) => f.url));
      // The demo loader and the plot (uPlot) load on this tap, not with the first screen.
      await page.getByRole('button', { name: 'Load the demo site' }).click();
      await page.waitForFunction(() => /^#\/sites\/[^/]+$/.test(location.hash), undefined, { timeout: 60_000 });
      await page.locator('.hydrograph canvas').first().waitFor({ timeout: 30_000 });
      const afterTap = fetched.filter((f) => !beforeTap.has(f.url));
      expect(afterTap.length, 'chunks loaded on the tap').toBeGreaterThan(0);
      expect(fetched.filter((f) => !f.fromWorker), 'chunks not served by the service worker').toEqual([]);
      expect(failed).toEqual([]);
    } finally {
      page.off('response', onResponse);
      page.off('requestfailed', onFailed);
      await browser.context.setOffline(false);
    }
  });
});

describe('a screen that has not reached the phone yet', () => {
  it('says so in plain words offline, never reloads into the browser\'s error page, and opens once the network is back', async () => {
    // A first visit whose signal went before the app was held on the phone: no service worker controls it.
    const bare = await launchBrowser({ serviceWorkers: 'block' });
    try {
      const p = await bare.context.newPage();
      await p.goto(server.url);
      await p.locator('#screen-title').waitFor();
      await bare.context.setOffline(true);
      await p.locator('nav[aria-label="Main"] a[href="#/storm"]').click();
      const note = p.getByTestId('screen-not-here');
      await note.waitFor();
      const text = (await note.textContent()) ?? '';
      expect(text).toMatch(/not on this phone yet/);
      expect(text).not.toMatch(/import|module|assets|\.js\b|TypeError|Failed to fetch/i);
      await p.getByRole('button', { name: 'Try again' }).click();
      await p.getByText('Still no connection').waitFor();
      await p.screenshot({ path: join(ARTIFACTS, 'screen-not-here-offline.png') });
      expect(new URL(p.url()).hash).toBe('#/storm');
      await bare.context.setOffline(false);
      await p.getByRole('button', { name: 'Try again' }).click();
      await p.locator('#screen-title').waitFor();
      await p.waitForFunction(() => document.querySelector('[data-testid="screen-not-here"]') === null, undefined, { timeout: 15_000 });
      expect(new URL(p.url()).hash).toBe('#/storm');
      await p.screenshot({ path: join(ARTIFACTS, 'screen-loaded-after-signal.png') });
    } finally {
      await bare.close();
    }
  });
});

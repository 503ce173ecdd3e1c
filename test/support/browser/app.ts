// The built app open in Chromium as most browser specs begin: served by `vite preview`, a fresh phone-sized
// browser, one page on the app; and the moves those specs share (open a screen, load the demo site).
import type { Page } from 'playwright-core';
import { DEMO_SITE_ID } from '../../../core';
import { launchBrowser, startPreview, type Browser, type Preview } from './harness';

/** The app under test: its server, the browser and the page opened on it. */
export interface AppSession {
  server: Preview;
  browser: Browser;
  page: Page;
  /** Closes the browser, then stops the server. */
  close(): Promise<void>;
}

/** How to open the app. */
export interface OpenAppOptions {
  /** The first address's hash ('' for the start page). */
  hash?: string;
  /** Wait until the service worker controls the page, so the app opens again with no network (default true). */
  controlled?: boolean;
  /** Every uncaught error of the page is pushed here (listening from before the first address). */
  pageErrors?: string[];
  /** Run on the browser before the page opens (e.g. an init script). */
  beforePage?: (browser: Browser) => Promise<unknown>;
}

/** Serves the built app on 127.0.0.1:`port`, launches Chromium and opens the app in one page. */
export async function openApp(port: number, options: OpenAppOptions = {}): Promise<AppSession> {
  const server = await startPreview(port);
  let browser: Browser | undefined;
  const close = async (): Promise<void> => {
    await browser?.close();
    await server.stop();
  };
  try {
    browser = await launchBrowser();
    await options.beforePage?.(browser);
    const page = await browser.context.newPage();
    const errors = options.pageErrors;
    if (errors) page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(server.url + (options.hash ?? ''));
    if (options.controlled ?? true) await page.waitForFunction(() => !!navigator.serviceWorker.controller);
    return { server, browser, page, close };
  } catch (e) {
    await close();
    throw e;
  }
}

/** Opens `hash` of the app at `url` by a fresh navigation and waits for the screen's title. */
export async function goTo(page: Page, url: string, hash: string): Promise<void> {
  await page.goto(url + hash);
  await page.locator('#screen-title').waitFor();
}

/** On the empty Sites screen: loads the demo site with its button and waits for the demo site's page. */
export async function loadDemoSite(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Load the demo site' }).click();
  await page.waitForFunction((id) => location.hash === `#/sites/${id}`, DEMO_SITE_ID, { timeout: 60_000 });
}

/** Moves inside the app by its hash route (no reload, so it works offline too) and waits for the screen's title. */
export async function goByHash(page: Page, hash: string): Promise<void> {
  await page.evaluate((h) => (location.hash = h), hash);
  await page.waitForFunction((h) => location.hash === h, hash);
  await page.locator('#screen-title').waitFor();
}

/** Resolves once `check` holds, asking every `poll_ms`; throws "Timed out waiting until <what>" after `timeout_ms`. */
export async function until(what: string, check: () => boolean | Promise<boolean>, timeout_ms = 30_000, poll_ms = 200): Promise<void> {
  const end = Date.now() + timeout_ms;
  while (!(await check())) {
    if (Date.now() > end) throw new Error(`Timed out waiting until ${what}`);
    await new Promise((r) => setTimeout(r, poll_ms));
  }
}

// Issue 25 in Chromium at 360×640 against the real office receiver (office/receiver on PGlite, in this
// process, another origin): a reading with a photo taken offline (a generated 12-megapixel picture set on
// the camera input) is saved with its photo; when the network returns the office holds the bytes once,
// with the SHA-256 Node's crypto computes from them; a second phone pulls the reading and opens the photo
// (fetched by GET, "not on this phone yet" while offline). Deleting a photo offers undo, and its tombstone
// reaches the office. A photo that does not fit (the page's put refused as a full disk refuses it) leaves
// the reading saved and says so, after a warning that little room is left.
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { createReceiver } from '../../office/receiver/http';
import { openOfficeDatabase } from '../../office/receiver/open';
import { ARTIFACTS, launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';

const APP_PORT = 4597;
const OFFICE_PORT = 4598;
let server: Preview;
let office: Server;
let db: Database;
const dataDir = mkdtempSync(join(tmpdir(), 'freshet-photos-browser-'));
const tokens: string[] = [];
let phoneA: Browser;
let phoneB: Browser;
let a: Page;
let b: Page;
let siteId = '';
let readingId = '';
let photoSha = '';
const base = `http://127.0.0.1:${OFFICE_PORT}`;

async function until(what: string, check: () => boolean | Promise<boolean>, timeout_ms = 60_000): Promise<void> {
  const end = Date.now() + timeout_ms;
  while (!(await check())) {
    if (Date.now() > end) throw new Error(`Timed out waiting until ${what}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

async function go(page: Page, hash: string): Promise<void> {
  await page.evaluate((h) => (location.hash = h), hash);
  await page.waitForFunction((h) => location.hash === h, hash);
  await page.locator('#screen-title').waitFor();
}

async function open(browser: Browser): Promise<Page> {
  const page = await browser.context.newPage();
  page.on('pageerror', (e) => console.log('page error:', e.message));
  await page.goto(server.url);
  await page.waitForFunction(() => !!navigator.serviceWorker.controller, undefined, { timeout: 20_000 });
  return page;
}

async function setEndpoint(page: Page, token: string): Promise<void> {
  await go(page, '#/sync');
  await page.locator('#sync-base').fill(base);
  await page.locator('#sync-token').fill(token);
  await page.getByRole('button', { name: 'Save endpoint' }).click();
  await page.getByText('Saved.').waitFor();
}

async function syncNow(page: Page): Promise<void> {
  await go(page, '#/sync');
  await page.getByRole('button', { name: 'Send and receive now' }).click();
}

/** The records of a store of the phone's database, read directly (test only). */
function stored(page: Page, store: string): Promise<Record<string, unknown>[]> {
  return page.evaluate((s) => new Promise<Record<string, unknown>[]>((resolve, reject) => {
    const req = indexedDB.open('freshet');
    req.onsuccess = () => {
      const all = req.result.transaction(s).objectStore(s).getAll();
      all.onsuccess = () => {
        const rows = (all.result as Record<string, unknown>[]).map((r) => Object.fromEntries(Object.entries(r).filter(([, v]) => !(v instanceof Blob))));
        req.result.close();
        resolve(rows);
      };
      all.onerror = () => reject(all.error);
    };
    req.onerror = () => reject(req.error);
  }), store);
}

/** A generated camera picture (JPEG) of width × height made in the page: a gradient with a band every `marks` px. */
async function picture(page: Page, width: number, height: number, marks = 120): Promise<Buffer> {
  const b64 = await page.evaluate(async ([w, h, step]) => {
    const c = new OffscreenCanvas(w, h);
    const ctx = c.getContext('2d')!;
    const g = ctx.createLinearGradient(0, 0, w, h);
    g.addColorStop(0, '#2b5d34');
    g.addColorStop(1, '#c9b27c');
    ctx.fillStyle = g;
    ctx.fillRect(0, 0, w, h);
    ctx.fillStyle = '#f2f2f2';
    for (let y = 0; y < h; y += step) ctx.fillRect(w * 0.45, y, w * 0.1, 40); // staff gauge marks
    const bytes = new Uint8Array(await (await c.convertToBlob({ type: 'image/jpeg', quality: 0.9 })).arrayBuffer());
    let s = '';
    for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
    return btoa(s);
  }, [width, height, marks]);
  return Buffer.from(b64, 'base64');
}

async function officeRows<T>(sql: string, params: unknown[] = []): Promise<T[]> {
  return db.query<T>(sql, params) as Promise<T[]>;
}

beforeAll(async () => {
  server = await startPreview(APP_PORT);
  db = await openOfficeDatabase({ data: dataDir });
  tokens.push(await createDevice(db, 'phone A'), await createDevice(db, 'phone B'));
  office = createReceiver({ db, origins: [new URL(server.url).origin], log: () => {} });
  await new Promise<void>((r) => office.listen(OFFICE_PORT, '127.0.0.1', r));
  phoneA = await launchBrowser();
  phoneB = await launchBrowser();
  a = await open(phoneA);
  b = await open(phoneB);
  await go(a, '#/sites/new');
  await a.locator('#site-code').fill('TB-3');
  await a.locator('#site-name').fill('Tarn Beck at the footbridge');
  await a.locator('#site-jumpLimit').fill('0.5');
  await a.getByRole('button', { name: 'Save site' }).click();
  await a.getByRole('heading', { name: 'Tarn Beck at the footbridge' }).waitFor();
  siteId = decodeURIComponent((await a.evaluate(() => location.hash)).split('/')[2]);
  await setEndpoint(a, tokens[0]);
  await until('the site reached the office', async () => (await officeRows("select id from current_records where kind = 'site'")).length === 1);
}, 120_000);

afterAll(async () => {
  await phoneA?.close();
  await phoneB?.close();
  await new Promise<void>((r) => {
    office?.closeAllConnections();
    office ? office.close(() => r()) : r();
  });
  await db?.close();
  await server?.stop();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('photos from the field to the office and another phone', () => {
  it('keeps a photo taken offline with its reading, resized to 2,048 px', async () => {
    await a.context().setOffline(true);
    await go(a, `#/record/${siteId}`);
    await a.locator('#stage').fill('0.412');
    await a.locator('#photo-new-caption').fill('Staff gauge; weed on the control');
    const file = await picture(a, 4000, 3000);
    await a.locator('#photo-new-camera').setInputFiles({ name: 'IMG_0412.jpg', mimeType: 'image/jpeg', buffer: file });
    await a.getByRole('list', { name: 'Photos of this reading' }).getByRole('listitem').waitFor({ timeout: 60_000 });
    await a.screenshot({ path: join(ARTIFACTS, 'photos-pending-360.png'), fullPage: true });
    await a.getByRole('button', { name: 'Save reading' }).click();
    const saved = a.locator('[data-testid="saved"]');
    await saved.waitFor();
    expect(await saved.textContent()).toMatch(/Its photo is kept\./);
    const [photo] = await stored(a, 'photos');
    expect(photo).toMatchObject({ width_px: 2048, height_px: 1536, type: 'image/jpeg', caption: 'Staff gauge; weed on the control', siteId });
    readingId = (photo.owner as { id: string }).id;
    photoSha = photo.sha256 as string;
    const [bytes] = await stored(a, 'photoBytes');
    expect(bytes).toMatchObject({ sha256: photoSha, confirmed: false, type: 'image/jpeg' });
    await go(a, `#/record/${siteId}/${readingId}`);
    await a.getByRole('button', { name: /^Open the photo taken/ }).waitFor();
    await a.screenshot({ path: join(ARTIFACTS, 'photos-saved-reading-360.png'), fullPage: true });
  }, 180_000);

  it('when the network returns, the office holds the photo once with the same SHA-256', async () => {
    await a.context().setOffline(false);
    await syncNow(a);
    await until('the photo record reached the office', async () => (await officeRows("select id from current_records where kind = 'photo'")).length === 1);
    const blobs = await officeRows<{ sha256: string; data: Uint8Array; type: string }>('select sha256, data, type from office_blobs');
    expect(blobs).toHaveLength(1);
    expect(blobs[0].sha256).toBe(photoSha);
    expect(createHash('sha256').update(blobs[0].data).digest('hex')).toBe(photoSha);
    expect(blobs[0].type).toBe('image/jpeg');
    const [bytes] = await stored(a, 'photoBytes');
    expect(bytes.confirmed).toBe(true);
  }, 120_000);

  it('a second phone pulls the reading and opens the photo; offline it says the photo is not there yet', async () => {
    await setEndpoint(b, tokens[1]);
    await until('phone B has the photo record', async () => (await stored(b, 'photos')).length === 1);
    await b.context().setOffline(true);
    await go(b, `#/record/${siteId}/${readingId}`);
    const thumb = b.getByRole('button', { name: /^Open the photo taken/ });
    await thumb.waitFor();
    await b.getByText('Not on this phone yet').waitFor();
    await thumb.click();
    await b.getByText('This photo is not on this phone yet. It loads from the office when the network is back.').waitFor();
    await b.context().setOffline(false);
    // The network comes back as the browser notices it: tap "Try again" until the photo opens (bounded).
    await until('the photo opened on phone B', async () => {
      if ((await b.locator('.photo-viewer img').count()) > 0) return true;
      const again = b.getByRole('button', { name: 'Try again' });
      if ((await again.count()) > 0) await again.click();
      await new Promise((r) => setTimeout(r, 500));
      return false;
    }, 30_000);
    await b.waitForFunction(() => (document.querySelector('.photo-viewer img') as HTMLImageElement | null)?.naturalWidth === 2048);
    await b.screenshot({ path: join(ARTIFACTS, 'photos-full-view-360.png') });
    const close = await b.getByRole('button', { name: 'Close' }).boundingBox();
    expect(close!.height).toBeGreaterThanOrEqual(44);
    expect(close!.width).toBeGreaterThanOrEqual(44);
    const [kept] = await stored(b, 'photoBytes');
    expect(kept).toMatchObject({ sha256: photoSha, confirmed: true });
    await b.getByRole('button', { name: 'Close' }).click();
  }, 120_000);

  it("deletes with undo, and a deleted photo's tombstone reaches the office", async () => {
    await go(a, `#/record/${siteId}/${readingId}`);
    await a.getByRole('button', { name: /^Open the photo taken/ }).click();
    await a.getByRole('button', { name: 'Delete photo' }).click();
    await a.getByText('Photo deleted.').waitFor();
    await a.getByRole('button', { name: 'Undo' }).click();
    await a.getByRole('button', { name: /^Open the photo taken/ }).waitFor();
    await a.getByRole('button', { name: /^Open the photo taken/ }).click();
    await a.getByRole('button', { name: 'Delete photo' }).click();
    await a.getByText('Photo deleted.').waitFor();
    expect(await a.getByRole('button', { name: /^Open the photo taken/ }).count()).toBe(0);
    await syncNow(a);
    await until('the tombstone reached the office', async () => {
      const [row] = await officeRows<{ deleted: boolean }>("select deleted from current_records where kind = 'photo'");
      return row?.deleted === true;
    });
    // The bytes stay at the office (content-addressed, maybe shared).
    expect(await officeRows('select sha256 from office_blobs')).toHaveLength(1);
  }, 120_000);

  it('a photo that does not fit the quota leaves the reading saved and says so', async () => {
    // The browser's answers made small for this page: an estimate with little room left, and the photo
    // bytes store refusing a put as a full disk does (QuotaExceededError, WebIDL §2.8.1).
    await a.evaluate(() => {
      const w = window as unknown as { __put: typeof IDBObjectStore.prototype.put; __estimate: typeof StorageManager.prototype.estimate };
      w.__put = IDBObjectStore.prototype.put;
      w.__estimate = StorageManager.prototype.estimate;
      StorageManager.prototype.estimate = async () => ({ usage: 9_950_000_000, quota: 10_000_000_000 });
      IDBObjectStore.prototype.put = function (this: IDBObjectStore, ...args: Parameters<IDBObjectStore['put']>) {
        if (this.name === 'photoBytes') throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
        return w.__put.apply(this, args);
      };
    });
    try {
      await go(a, `#/record/${siteId}`);
      await a.getByText('Little room is left for Freshet on this phone (about 48 MB). Send your records and photos to the office, or free some space, before taking many more photos.').waitFor();
      await a.locator('#stage').fill('0.415');
      await a.locator('#photo-new-choose').setInputFiles({ name: 'IMG_0413.jpg', mimeType: 'image/jpeg', buffer: await picture(a, 4000, 3000, 200) });
      await a.getByRole('list', { name: 'Photos of this reading' }).getByRole('listitem').waitFor({ timeout: 60_000 });
      await a.getByRole('button', { name: 'Save reading' }).click();
      const saved = a.locator('[data-testid="saved"]');
      await saved.waitFor();
      const text = await saved.textContent();
      console.log('saved says:', text);
      expect(text).toMatch(/^Saved: 0\.415 m/);
      expect(text).toMatch(/This photo was not kept: the phone has no room left for it\. What it belongs to is saved\./);
      await a.screenshot({ path: join(ARTIFACTS, 'photos-no-room-360.png'), fullPage: true });
      const readings = await stored(a, 'readings');
      expect(readings.map((r) => r.stage_m)).toContain(0.415);
      expect((await stored(a, 'photos')).filter((p) => !p.deleted)).toHaveLength(0);
    } finally {
      await a.evaluate(() => {
        const w = window as unknown as { __put: typeof IDBObjectStore.prototype.put; __estimate: typeof StorageManager.prototype.estimate };
        IDBObjectStore.prototype.put = w.__put;
        StorageManager.prototype.estimate = w.__estimate;
      });
    }
  }, 180_000);
});

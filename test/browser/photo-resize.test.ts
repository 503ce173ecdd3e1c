// The photo worker in Chromium (issue 25): a 12-megapixel picture comes back with a long edge of 2,048 px
// and its aspect, as a JPEG whose SHA-256 is the one Node's crypto computes from the same bytes; the
// camera's orientation tag is applied; the original is kept only when asked; a non-picture is refused.
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, startPreview, type Browser, type Preview } from '../support/browser/harness';
import { buildDbPages, DB_PAGES_DIR } from '../support/browser/pages/build';

let server: Preview;
let browser: Browser;
let page: Page;

beforeAll(async () => {
  buildDbPages();
  server = await startPreview(4596, DB_PAGES_DIR);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await page.goto(`${server.url}photo.html`);
  await page.waitForFunction(() => document.body.dataset.ready === 'true');
}, 180_000);

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const red = (c: number[]) => c[0] > 200 && c[1] < 60 && c[2] < 60;
const blue = (c: number[]) => c[2] > 200 && c[0] < 60 && c[1] < 60;
/** The JPEG start-of-image marker, FF D8 FF (ITU-T T.81, Table B.1). */
const isJpeg = (b: Buffer) => b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff;

describe('the photo worker', () => {
  it('scales a 4,000 × 3,000 picture to 2,048 × 1,536 JPEG, hashed as Node hashes it', async () => {
    const r = await page.evaluate(() => window.freshetPhotoTest.prepare(4000, 3000));
    // Exact: 2048 / 4000 × 3000 = 1536 (the aspect 4:3 kept).
    expect([r.width_px, r.height_px]).toEqual([2048, 1536]);
    expect(r.type).toBe('image/jpeg');
    expect(r.blobType).toBe('image/jpeg');
    const bytes = Buffer.from(r.base64, 'base64');
    expect(isJpeg(bytes)).toBe(true);
    expect(r.bytes).toBe(bytes.length);
    expect(r.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    // The right way up: red on top, blue below.
    expect(red(r.corners.topLeft)).toBe(true);
    expect(blue(r.corners.bottomRight)).toBe(true);
    expect(r.original).toBeUndefined();
  }, 120_000);

  it('turns a picture whose Exif orientation is 6 (view turned 90° clockwise): portrait 1,536 × 2,048', async () => {
    const r = await page.evaluate(() => window.freshetPhotoTest.prepare(4000, 3000, { orientation: 6 }));
    expect([r.width_px, r.height_px]).toEqual([1536, 2048]);
    // Stored top (red) becomes the right-hand side when viewed (CIPA DC-008, orientation 6).
    expect(red(r.corners.topRight)).toBe(true);
    expect(blue(r.corners.topLeft)).toBe(true);
  }, 120_000);

  it('never scales up, and keeps the original (as chosen, same bytes) only when asked', async () => {
    const r = await page.evaluate(() => window.freshetPhotoTest.prepare(800, 600, { type: 'image/png', keepOriginal: true }));
    expect([r.width_px, r.height_px]).toEqual([800, 600]);
    expect(r.type).toBe('image/jpeg');
    expect(r.original).toMatchObject({ type: 'image/png', sameAsFile: true });
    expect(r.original!.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(r.original!.sha256).not.toBe(r.sha256);
  }, 60_000);

  it('refuses a file that is not a picture with a sentence', async () => {
    expect(await page.evaluate(() => window.freshetPhotoTest.refuse())).toBe(
      'This file could not be read as a picture. Choose a photo (JPEG, PNG, WebP or the camera’s own format).',
    );
  }, 60_000);
});

// Measures the JavaScript and CSS a first visit loads: every script and stylesheet the page itself
// requests (not the service worker's background precache of later screens), gzipped at level 9.
import { gzipSync } from 'node:zlib';
import { launchBrowser } from './harness';

/** One file loaded by the first visit, with its raw and gzip sizes in bytes. */
export interface LoadedFile {
  url: string;
  kind: 'script' | 'stylesheet';
  raw_bytes: number;
  gzip_bytes: number;
}

/** The first-visit budget in gzip bytes (45 KiB, issue 23). */
export const FIRST_VISIT_BUDGET_BYTES = 45 * 1024;

/** Loads `url` in a fresh Chromium profile and returns the scripts and stylesheets it fetched. */
export async function measureFirstVisit(url: string): Promise<{ files: LoadedFile[]; total_gzip_bytes: number }> {
  const browser = await launchBrowser();
  try {
    const page = await browser.context.newPage();
    const pending: Promise<LoadedFile | undefined>[] = [];
    page.on('response', (res) => {
      const kind = res.request().resourceType();
      if (kind !== 'script' && kind !== 'stylesheet') return;
      if (res.request().frame() !== page.mainFrame()) return;
      pending.push(
        res.body().then(
          (body) => ({ url: res.url(), kind, raw_bytes: body.length, gzip_bytes: gzipSync(body, { level: 9 }).length }),
          () => undefined,
        ),
      );
    });
    await page.goto(url, { waitUntil: 'networkidle' });
    await page.locator('#screen-title').waitFor();
    const files = (await Promise.all(pending)).filter((f): f is LoadedFile => !!f);
    return { files, total_gzip_bytes: files.reduce((s, f) => s + f.gzip_bytes, 0) };
  } finally {
    await browser.close();
  }
}

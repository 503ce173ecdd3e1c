// Opening a site's ratings in Chromium (the built app, real IndexedDB): a site with 10 ratings and 200
// gaugings, from the tap to the list drawn with the rating in force marked. Baseline in the same run: a
// bare IndexedDB read of the same ratings and gaugings by index in one transaction. Prints JSON lines.
// Run (after a build): node --import tsx test/bench/ratings.browser.ts
import { formatRev, validateBody, type GaugingBody, type RatingBody, type SiteBody } from '../../core';
import { launchBrowser, startPreview } from '../support/browser/harness';
import { emit, median, sig3 } from './measure';

const RUNS = Number(process.env.FRESHET_BENCH_ROUNDS ?? 3) * 7;
const SITE_ID = '0be0c4a0-0000-4000-8000-000000000001';
const DAY_MS = 86_400_000;
const now = Date.UTC(2026, 10, 1);

/** Invented site, 10 ratings a year apart and 200 gaugings a fortnight apart, as stored records. */
function records(): { sites: object[]; ratings: object[]; gaugings: object[] } {
  let counter = 0;
  const envelope = (id: string) => ({ id, rev: formatRev({ wall_ms: now, counter: counter++, deviceId: 'bench' }), updated_ms: now });
  const site: SiteBody = { code: 'BN-1', name: 'Benchmark brook', timeZone: 'UTC', displayUnits: 'metric', jumpLimit_m: 0.3 };
  validateBody('site', site);
  const ratings = Array.from({ length: 10 }, (_, i) => {
    const body: RatingBody = {
      siteId: SITE_ID, validFrom_ms: now - (10 - i) * 365 * DAY_MS,
      segments: [{ fromStage_m: 0.1, coefficient: 6 + i * 0.1, offset_m: 0.1, exponent: 1.7 }, { fromStage_m: 0.9, coefficient: 9 + i * 0.1, offset_m: 0.3, exponent: 1.6 }],
      gaugedRange_m: [0.2, 1.5], shifts: [], fittedFrom: [], note: `Rating ${i + 1}`,
      fit: { standardError_pct: 4.2, gaugingCount: 20, warnings: [] },
    };
    validateBody('rating', body);
    return { ...envelope(`0be0c4a0-0000-4000-8001-${String(i).padStart(12, '0')}`), ...body };
  });
  const gaugings = Array.from({ length: 200 }, (_, i) => {
    const h = 0.2 + ((i * 37) % 130) / 100;
    const body: GaugingBody = {
      siteId: SITE_ID, time_ms: now - (200 - i) * 14 * DAY_MS, meanStage_m: h, discharge_m3s: 6 * Math.pow(h - 0.1, 1.7) * (1 + (((i * 13) % 9) - 4) / 100),
      method: 'velocity-area', grade: i % 3 ? 'good' : 'fair', observer: '', note: '',
    };
    validateBody('gauging', body);
    return { ...envelope(`0be0c4a0-0000-4000-8002-${String(i).padStart(12, '0')}`), ...body };
  });
  return { sites: [{ ...envelope(SITE_ID), ...site }], ratings, gaugings };
}

const server = await startPreview(4461);
const browser = await launchBrowser();
try {
  const page = await browser.context.newPage();
  await page.goto(`${server.url}#/sites`);
  await page.getByText('No sites on this phone yet.').waitFor();
  // The sites list has opened (and created) the app's database; the benchmark writes straight into it.
  await page.evaluate(
    (data) =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open('freshet');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const tx = open.result.transaction(['sites', 'ratings', 'gaugings'], 'readwrite');
          for (const s of data.sites) tx.objectStore('sites').put(s);
          for (const r of data.ratings) tx.objectStore('ratings').put(r);
          for (const g of data.gaugings) tx.objectStore('gaugings').put(g);
          tx.oncomplete = () => {
            open.result.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error);
        };
      }),
    records(),
  );
  const open: number[] = [];
  const bare: number[] = [];
  for (let run = 0; run < RUNS + 2; run++) {
    const b = await page.evaluate(
      (siteId) =>
        new Promise<number>((resolve, reject) => {
          const t0 = performance.now();
          const req = indexedDB.open('freshet');
          req.onerror = () => reject(req.error);
          req.onsuccess = () => {
            const tx = req.result.transaction(['ratings', 'gaugings']);
            const range = IDBKeyRange.bound([siteId, -Infinity], [siteId, Infinity]);
            tx.objectStore('ratings').index('by-site-from').getAll(range);
            tx.objectStore('gaugings').index('by-site-time').getAll(range);
            tx.oncomplete = () => {
              req.result.close();
              resolve(performance.now() - t0);
            };
          };
        }),
      SITE_ID,
    );
    // From the hash change (a tap on "Ratings") to the list drawn with the rating in force marked.
    // (No named functions inside evaluate: the TypeScript loader would wrap them in a helper the page lacks.)
    const t = await page.evaluate(async (siteId) => {
      const t0 = performance.now();
      location.hash = `#/sites/${siteId}/ratings`;
      while (!(document.querySelector('.tag.in-force') && document.querySelectorAll('.list li').length === 10)) {
        await new Promise((r) => requestAnimationFrame(r));
      }
      return performance.now() - t0;
    }, SITE_ID);
    await page.evaluate(() => (location.hash = '#/about'));
    await page.locator('#screen-title', { hasText: 'About' }).waitFor();
    // The first two runs load the screen's code and warm the caches; they are not counted.
    if (run >= 2) {
      open.push(t);
      bare.push(b);
    }
  }
  const openMs = median(open);
  const bareMs = median(bare);
  emit({ name: 'ratings-open-10-ratings-200-gaugings-ms', value: sig3(openMs), target: '< 100', unit: 'ms', runs: RUNS });
  emit({ name: 'ratings-open-vs-bare-read-ratio', value: sig3(openMs / bareMs), target: 'informative', bare_read_ms: sig3(bareMs), runs: RUNS });
} finally {
  await browser.close();
  await server.stop();
}

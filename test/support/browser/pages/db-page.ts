// Test-only page: exposes web/db to page.evaluate in the Chromium test and benchmark.
import { unwrap } from 'idb';
import type { ReadingBody, ReadingRecord } from '../../../../core/records/index';
import { getSite, importReadings, listReadings, readingsWithDischarge, saveRating, saveSite, seriesWithDischarge, storageState } from '../../../../web/db/index';
import { getDb } from '../../../../web/db/connection';
import { READING_SOURCE_CODES } from '../../../../core/records/index';
import { readingSeries } from '../../../../web/db/series-read';
import { deleteFreshetDbForTests } from '../../../../web/db/testing';

const T0 = Date.UTC(2026, 2, 1);
const QUARTER_HOUR_MS = 900_000;
/** Pause (ms) before each timed read of the window benchmark. */
const SETTLE_MS = 30;

/** n invented logger readings every 15 minutes from T0. */
function series(siteId: string, n: number): ReadingBody[] {
  const out: ReadingBody[] = [];
  for (let i = 0; i < n; i++) {
    out.push({
      siteId, time_ms: T0 + i * QUARTER_HOUR_MS, stage_m: 0.5 + 0.3 * Math.sin(i / 96),
      source: 'logger', quality: 'good', observer: '', note: '', warnings: [],
    });
  }
  return out;
}

async function freshSite(): Promise<string> {
  await deleteFreshetDbForTests();
  const site = await saveSite({
    code: 'BW-07', name: 'Birchwater Brook at Mill Lane', area_km2: 31.5, timeZone: 'Europe/London',
    displayUnits: 'metric', jumpLimit_m: 0.25,
  });
  return site.id;
}

const api = {
  /** Saves an invented site and returns its id. */
  async saveSite(): Promise<string> {
    const site = await saveSite({ code: 'BW-07', name: 'Birchwater Brook at Mill Lane', timeZone: 'Europe/London', displayUnits: 'metric', jumpLimit_m: 0.25 });
    return site.id;
  },
  /** The name of the site with this id, or null. */
  async siteName(id: string): Promise<string | null> {
    return (await getSite(id))?.name ?? null;
  },
  /**
   * Imports n readings into an empty database; returns the count written, progress figures, the stored
   * count, and how the series compares with the imported readings: its length, its day chunks, and the
   * number of positions whose time, stage or source differs from the input or from listReadings.
   */
  async importSample(n: number, batchSize: number): Promise<{
    imported: number; progress: number[]; stored: number; seriesLength: number; seriesChunks: number; seriesMismatches: number;
  }> {
    const siteId = await freshSite();
    const input = series(siteId, n);
    const progress: number[] = [];
    const result = await importReadings(input, { batchSize, onProgress: (p) => progress.push(p.written) });
    const records = await listReadings(siteId, -Infinity, Infinity);
    const s = await readingSeries(siteId, -Infinity, Infinity);
    let seriesMismatches = Math.abs(s.time_ms.length - n) + Math.abs(s.time_ms.length - records.length);
    for (let i = 0; i < Math.min(n, s.time_ms.length, records.length); i++) {
      const code = READING_SOURCE_CODES[input[i].source];
      const r = records[i];
      if (s.time_ms[i] !== input[i].time_ms || s.stage_m[i] !== input[i].stage_m || s.source[i] !== code) seriesMismatches++;
      else if (r.time_ms !== s.time_ms[i] || r.stage_m !== s.stage_m[i] || READING_SOURCE_CODES[r.source] !== s.source[i]) seriesMismatches++;
    }
    const seriesChunks = await (await getDb()).count('series');
    return { imported: result.imported, progress, stored: records.length, seriesLength: s.time_ms.length, seriesChunks, seriesMismatches };
  },
  /** Wall time (ms) of importReadings for n readings into an empty database. */
  async timeImport(n: number): Promise<number> {
    const siteId = await freshSite();
    const input = series(siteId, n);
    const t0 = performance.now();
    await importReadings(input);
    return performance.now() - t0;
  },
  /** Wall time (ms) of a bare IndexedDB put loop of the same n records in one transaction, into an empty database. */
  async timeBarePut(n: number): Promise<number> {
    const siteId = await freshSite();
    const rev = '1767225600000-000000-bench';
    const records: ReadingRecord[] = series(siteId, n).map((r) => ({ ...r, id: crypto.randomUUID(), rev, updated_ms: T0 }));
    const db = unwrap(await getDb());
    const t0 = performance.now();
    const tx = db.transaction('readings', 'readwrite');
    const store = tx.objectStore('readings');
    for (const r of records) store.put(r);
    await new Promise<void>((resolve, reject) => {
      tx.oncomplete = () => resolve();
      tx.onabort = () => reject(tx.error);
    });
    return performance.now() - t0;
  },
  /**
   * Median wall times (ms) of reading 30 days of 15-minute readings (2,880) with their discharges through
   * a shifted rating: seriesWithDischarge (arrays, what plots and storm analysis read), readingsWithDischarge
   * (whole records), the floor of a bare index getAll of the same readings, and a bare getAll of the same
   * window's series chunks (what seriesWithDischarge reads before its join); runs alternate, each read after
   * the same short pause.
   */
  async timeWindow(runs: number): Promise<{ series_ms: number; records_ms: number; bareGetAll_ms: number; bareChunks_ms: number; rows: number; seriesRows: number }> {
    const siteId = await freshSite();
    await importReadings(series(siteId, 2880 + 960));
    await saveRating({
      siteId, validFrom_ms: 0, segments: [{ fromStage_m: 0, coefficient: 8.5, offset_m: 0.12, exponent: 1.7 }],
      gaugedRange_m: [0.2, 1.1], fittedFrom: [], note: '',
      shifts: [{ time_ms: T0, toNext: 'prorate', curve: { points: [{ stage_m: 0.3, shift_m: 0.02 }, { stage_m: 0.9, shift_m: 0 }] } },
        { time_ms: T0 + 20 * 86_400_000, toNext: 'hold', curve: { points: [{ stage_m: 0.3, shift_m: -0.01 }] } }],
    });
    const from = T0 + 5 * 86_400_000;
    const to = from + 30 * 86_400_000 - 1;
    let rows = 0;
    let seriesRows = 0;
    const seriesTimes: number[] = [];
    const recordTimes: number[] = [];
    const bare: number[] = [];
    const db = unwrap(await getDb());
    const range = IDBKeyRange.bound([siteId, from], [siteId, to]);
    const chunks = IDBKeyRange.bound([siteId, Math.floor(from / 86_400_000)], [siteId, Math.floor(to / 86_400_000)]);
    const bareChunks: number[] = [];
    // Each read starts after a pause (the same for all three): a read of 2,880 whole records leaves the
    // browser's storage busy for a while, and whichever read came next would pay for it.
    const settle = () => new Promise((resolve) => setTimeout(resolve, SETTLE_MS));
    for (let i = 0; i < runs + 3; i++) {
      await settle();
      const t0 = performance.now();
      seriesRows = (await seriesWithDischarge(siteId, from, to)).discharge_m3s.length;
      const t1 = performance.now();
      await settle();
      const t2 = performance.now();
      rows = (await readingsWithDischarge(siteId, from, to)).length;
      const t3 = performance.now();
      await settle();
      const t4 = performance.now();
      await new Promise((resolve) => {
        db.transaction('readings').objectStore('readings').index('by-site-time').getAll(range).onsuccess = resolve;
      });
      const t5 = performance.now();
      await settle();
      const t6 = performance.now();
      await new Promise((resolve) => {
        db.transaction('series').objectStore('series').getAll(chunks).onsuccess = resolve;
      });
      if (i >= 3) {
        seriesTimes.push(t1 - t0);
        recordTimes.push(t3 - t2);
        bare.push(t5 - t4);
        bareChunks.push(performance.now() - t6);
      }
    }
    const median = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    return { series_ms: median(seriesTimes), records_ms: median(recordTimes), bareGetAll_ms: median(bare), bareChunks_ms: median(bareChunks), rows, seriesRows };
  },
  storageState,
};

declare global {
  interface Window {
    freshetDbTest: typeof api;
  }
}
window.freshetDbTest = api;
document.body.dataset.ready = 'true';

// Test-only page: the 100,000-row logger import end to end (read in the worker, correct, store) and the
// floor it is measured against, a bare put loop of the same day records in one transaction.
import { unwrap } from 'idb';
import { driftCorrections, loggerDayId, splitLoggerDays, type LoggerMapping } from '../../../../core/index';
import { importLoggerRecord, saveSite } from '../../../../web/db/index';
import { getDb } from '../../../../web/db/connection';
import { deleteFreshetDbForTests } from '../../../../web/db/testing';
import { readInWorker } from '../../../../web/logger/parse-in-worker';

const Q_MS = 900_000;
/** 2026-02-20 00:00 at UTC+12, UTC ms: the invented file's first stamp. */
const FIRST_MS = Date.UTC(2026, 1, 19, 12);
const MAPPING: LoggerMapping = {
  firstDataLine: 3, delimiter: ',', decimalMark: '.', timeColumn: 1, timeFormat: 'year-month-day',
  clock: { kind: 'fixed-offset', offset_min: 720 }, levelColumn: 2, levelUnit: 'm', datumOffset_m: 0,
};
const CHECKS = [
  { time_ms: FIRST_MS + 10 * 86_400_000, staff_m: 0.742, logger_m: 0.73 },
  { time_ms: FIRST_MS + 20 * 86_400_000, staff_m: 0.615, logger_m: 0.64 },
];

/** An invented logger file of n rows every 15 minutes, stamps in UTC+12, three columns. */
function file(n: number): Blob {
  const lines = ['Logger 5120,serial 0042', 'Date Time,Level (m),Temp (C)'];
  for (let i = 0; i < n; i++) {
    const w = new Date(FIRST_MS + i * Q_MS + 12 * 3_600_000).toISOString();
    lines.push(`${w.slice(0, 10)} ${w.slice(11, 19)},${(0.7 + 0.1 * Math.sin(i / 96)).toFixed(3)},11.${i % 10}`);
  }
  return new Blob([`${lines.join('\r\n')}\r\n`], { type: 'text/csv' });
}

async function freshSite(): Promise<string> {
  await deleteFreshetDbForTests();
  const site = await saveSite({ code: 'LR-02', name: 'Larch Rill at Ford Farm', timeZone: 'Pacific/Auckland', displayUnits: 'metric', jumpLimit_m: 0.3 });
  return site.id;
}

const api = {
  /** Wall times (ms) of a whole import of an n-row file into an empty database: read, correct, store, total. */
  async timeImport(n: number): Promise<{ parse_ms: number; correct_ms: number; store_ms: number; total_ms: number; stored: number }> {
    const siteId = await freshSite();
    const blob = file(n);
    const t0 = performance.now();
    const read = await readInWorker(blob, MAPPING, () => undefined).result;
    const t1 = performance.now();
    const correction_m = driftCorrections(CHECKS, read.series.time_ms);
    const t2 = performance.now();
    const r = await importLoggerRecord({ siteId, fileName: 'bench.csv', time_ms: read.series.time_ms, raw_m: read.series.level_m, correction_m, checks: CHECKS });
    const t3 = performance.now();
    return { parse_ms: t1 - t0, correct_ms: t2 - t1, store_ms: t3 - t2, total_ms: t3 - t0, stored: r.stored };
  },
  /** Wall time (ms) of a bare put loop of the same n values as day records in one transaction, into an empty database. */
  async timeBareDayPut(n: number): Promise<number> {
    const siteId = await freshSite();
    const time_ms = Float64Array.from({ length: n }, (_, i) => FIRST_MS + i * Q_MS);
    const raw_m = Float64Array.from({ length: n }, (_, i) => Math.round((0.7 + 0.1 * Math.sin(i / 96)) * 1000) / 1000);
    const correction_m = driftCorrections(CHECKS, time_ms);
    const rev = '1767225600000-000000-bench';
    const records = splitLoggerDays({ time_ms, raw_m, correction_m }, { siteId, fileName: 'bench.csv', checks: CHECKS })
      .map((b) => ({ ...b, id: loggerDayId(siteId, b.day), rev, updated_ms: FIRST_MS }));
    const db = unwrap(await getDb());
    const t0 = performance.now();
    const tx = db.transaction('loggerDays', 'readwrite');
    const store = tx.objectStore('loggerDays');
    for (const r of records) store.put(r);
    await new Promise<void>((resolve, reject) => {
      tx.oncomplete = () => resolve();
      tx.onabort = () => reject(tx.error);
    });
    return performance.now() - t0;
  },
};

declare global {
  interface Window {
    freshetLoggerTest: typeof api;
  }
}
window.freshetLoggerTest = api;
document.body.dataset.ready = 'true';

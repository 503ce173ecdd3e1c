// Storage benchmark in Chromium (real IndexedDB): the 100,000-reading bulk import against a bare put loop
// of the same records in one transaction, measured in the same browser run, and reading a 30-day window
// of 15-minute readings (2,880) with their discharges (as the compact series; as whole records and a bare
// getAll of them for comparison). Prints JSON lines; asserts nothing.
// Run: node --import tsx test/bench/db.browser.ts
import { openTestPage } from '../support/browser/pages/build';
import { emit, figure, median, sig3 } from './measure';

const N = Number(process.env.FRESHET_BENCH_READINGS ?? 100_000);
const ROUNDS = Number(process.env.FRESHET_BENCH_ROUNDS ?? 3);

const { page, close } = await openTestPage(4312, 'db.html');
try {
  const imports: number[] = [];
  const bare: number[] = [];
  // Alternate the two so drift in the machine's load affects both alike.
  for (let round = 0; round < ROUNDS; round++) {
    bare.push(await page.evaluate((n) => window.freshetDbTest.timeBarePut(n), N));
    imports.push(await page.evaluate((n) => window.freshetDbTest.timeImport(n), N));
  }
  const importMs = median(imports);
  const bareMs = median(bare);
  emit({ name: 'db-bulk-import-100k-ratio', value: sig3(importMs / bareMs), target: '<= 1.3', import_ms: sig3(importMs), bare_put_ms: sig3(bareMs), readings: N, rounds: ROUNDS });
  const window30 = await page.evaluate(() => window.freshetDbTest.timeWindow(21));
  // What plots and storm analysis read: the compact series (times, stages, sources) with discharges.
  figure({
    name: 'db-window-30d-with-discharge-ms', value: window30.series_ms, unit: 'ms',
    floor: window30.bareGetAll_ms, floor_is: 'a bare index getAll of the same window\'s reading records',
    target: 'value < 5 ms', reads: 'seriesWithDischarge', rows: window30.seriesRows, runs: 21,
    note: 'each of the window reads starts after the same 30 ms pause, so none pays for the 2,880 whole records read just before it',
  });
  // Informative: the same window as whole records (readingsWithDischarge, what the readings list reads).
  emit({
    name: 'db-window-30d-records-with-discharge-ms', value: sig3(window30.records_ms), target: 'informative', unit: 'ms',
    rows: window30.rows, runs: 21,
  });
  // The floor set by the browser's own IndexedDB for whole records: a bare index getAll of the same window.
  emit({
    name: 'db-window-30d-bare-getall-ms', value: sig3(window30.bareGetAll_ms), target: 'informative', unit: 'ms',
    rows: window30.rows, runs: 21,
  });
  // Informative: the storage part of seriesWithDischarge alone, a bare getAll of the window's series chunks.
  emit({
    name: 'db-window-30d-bare-chunks-getall-ms', value: sig3(window30.bareChunks_ms), target: 'informative', unit: 'ms',
    note: 'one transaction, one getAll of the series store, no join and no discharge', runs: 21,
  });
} finally {
  await close();
}

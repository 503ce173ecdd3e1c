// Logger import benchmark in Chromium (real IndexedDB, the import worker): a 100,000-row logger file end
// to end (read in the worker, drift-corrected from two checks, stored as day records in one transaction),
// its ratio to the floor of a bare put loop of the same day records measured in the same run, and the
// worker's parse throughput in rows per second. Prints JSON lines; asserts nothing.
// Run: node --import tsx test/bench/logger.browser.ts
import { openTestPage } from '../support/browser/pages/build';
import { emit, median, sig3 } from './measure';

const N = Number(process.env.FRESHET_BENCH_LOGGER_ROWS ?? 100_000);
const ROUNDS = Number(process.env.FRESHET_BENCH_ROUNDS ?? 5);

const { page, close } = await openTestPage(4531, 'logger.html');
try {
  const runs: { parse_ms: number; correct_ms: number; store_ms: number; total_ms: number; stored: number }[] = [];
  const floor: number[] = [];
  // Alternate the two so drift in the machine's load affects both alike.
  for (let round = 0; round < ROUNDS; round++) {
    floor.push(await page.evaluate((n) => window.freshetLoggerTest.timeBareDayPut(n), N));
    runs.push(await page.evaluate((n) => window.freshetLoggerTest.timeImport(n), N));
  }
  const total = median(runs.map((r) => r.total_ms));
  const bare = median(floor);
  const parse = median(runs.map((r) => r.parse_ms));
  emit({
    name: 'logger-import-100k-ms', value: sig3(total), target: '< 5000', unit: 'ms', rows: N, rounds: ROUNDS,
    parse_ms: sig3(parse), correct_ms: sig3(median(runs.map((r) => r.correct_ms))), store_ms: sig3(median(runs.map((r) => r.store_ms))),
    stored: runs[0].stored,
  });
  emit({ name: 'logger-import-100k-ratio', value: sig3(total / bare), target: 'informative', import_ms: sig3(total), bare_day_put_ms: sig3(bare), rows: N });
  emit({ name: 'logger-parse-rows-per-s', value: sig3(N / (parse / 1000)), target: 'informative', unit: 'rows/s', parse_ms: sig3(parse), rows: N });
} finally {
  await close();
}

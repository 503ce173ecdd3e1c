// Readings of a window as plain arrays (times, stages, sources), read from the compact series store:
// what plots and the storm analysis need, at a fraction of the cost of reading whole records.
import type { SeriesChunk } from './schema';
import { withDb } from './connection';
import { dayOf } from './series-edit';
import { withLoggerDays } from './logger-series';
import type { LoggerDayRecord } from '../../core/records/index';

/** Non-deleted readings of a window as parallel arrays: times (UTC ms, ascending), stages (m), sources (READING_SOURCE_CODES). */
export interface ReadingSeries {
  time_ms: Float64Array;
  stage_m: Float64Array;
  source: Uint8Array;
}

/** Throws a RangeError unless from_ms ≤ to_ms and neither is NaN (±Infinity means unbounded). */
export function checkWindow(fn: string, from_ms: number, to_ms: number): void {
  if (Number.isNaN(from_ms) || Number.isNaN(to_ms) || !(from_ms <= to_ms)) {
    throw new RangeError(`${fn} needs a window with from_ms ≤ to_ms (UTC ms); got ${from_ms} to ${to_ms}`);
  }
}

/** The key range of the chunks that may hold readings of [from_ms, to_ms] at a site. */
export function chunkRange(siteId: string, from_ms: number, to_ms: number): IDBKeyRange {
  return IDBKeyRange.bound([siteId, dayOf(from_ms)], [siteId, dayOf(to_ms)]);
}

/** First index in t (ascending) whose value is ≥ x (or > x when `after`). */
function bound(t: Float64Array, x: number, after: boolean): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] < x || (after && t[mid] === x)) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The entries of day chunks (in day order) with from_ms ≤ time_ms ≤ to_ms, joined into one series. */
export function joinChunks(chunks: readonly SeriesChunk[], from_ms: number, to_ms: number): ReadingSeries {
  const spans = chunks.map((c) => [bound(c.time_ms, from_ms, false), bound(c.time_ms, to_ms, true)] as const);
  let n = 0;
  for (const [a, b] of spans) n += Math.max(0, b - a);
  const out: ReadingSeries = { time_ms: new Float64Array(n), stage_m: new Float64Array(n), source: new Uint8Array(n) };
  let k = 0;
  chunks.forEach((c, i) => {
    const [a, b] = spans[i];
    if (b <= a) return;
    out.time_ms.set(c.time_ms.subarray(a, b), k);
    out.stage_m.set(c.stage_m.subarray(a, b), k);
    out.source.set(c.source.subarray(a, b), k);
    k += b - a;
  });
  return out;
}

/**
 * Non-deleted readings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms; ±Infinity for no bound) as
 * arrays in time order (readings at one time in id order, as listReadings gives them). Throws a
 * RangeError for a window that ends before it starts.
 */
export async function readingSeries(siteId: string, from_ms: number, to_ms: number): Promise<ReadingSeries> {
  checkWindow('readingSeries', from_ms, to_ms);
  const chunks = await withDb(async (db) => {
    const tx = db.transaction(['series', 'loggerDays']);
    return seriesChunksIn(tx, siteId, from_ms, to_ms);
  });
  return joinChunks(chunks, from_ms, to_ms);
}

/** What a read transaction over the series and the logger days offers. */
export interface SeriesReadTx {
  objectStore(name: 'series'): { getAll(range: IDBKeyRange): Promise<SeriesChunk[]> };
  objectStore(name: 'loggerDays'): { index(name: 'by-site-day'): { getAll(range: IDBKeyRange): Promise<LoggerDayRecord[]> } };
}

/**
 * The day chunks of a site's window read in tx: the readings' series with the logger days merged in, so
 * every reader of series (plots, storm analysis, exports) sees staff readings and logger records alike.
 */
export async function seriesChunksIn(tx: SeriesReadTx, siteId: string, from_ms: number, to_ms: number): Promise<SeriesChunk[]> {
  const range = chunkRange(siteId, from_ms, to_ms);
  const [chunks, days] = await Promise.all([
    tx.objectStore('series').getAll(range),
    tx.objectStore('loggerDays').index('by-site-day').getAll(range),
  ]);
  return withLoggerDays(chunks, days);
}

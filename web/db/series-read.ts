// A site's stage record of a window as plain arrays, read from the compact series store and the logger
// days and joined by core's joinStageRecord (the one join of spot readings and logger values): what
// plots and the storm analysis need, at a fraction of the cost of reading whole records.
import type { SeriesChunk } from './schema';
import { withDb } from './connection';
import { SCOPES } from './stores';
import { dayOf } from './series-edit';
import { joinStageRecord, sortedIndex, type LoggerDayRecord, type StageRecord } from '../../core/index';
import { now_ms } from './clock';
import { latestReading, LATEST_AHEAD_MS } from './readings';


/**
 * The stage record of a window as parallel arrays: times (UTC ms, ascending), stages (m; logger values
 * corrected), sources (READING_SOURCE_CODES), raw logger values and corrections (m; NaN for spot readings).
 */
export type ReadingSeries = StageRecord;

/** The spot readings' day chunks and the logger days of a site's window, read in one transaction. */
export interface StageParts {
  chunks: SeriesChunk[];
  days: LoggerDayRecord[];
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

/** The spot readings of day chunks (in day order) with from_ms ≤ time_ms ≤ to_ms as one series. */
export function joinChunks(chunks: readonly SeriesChunk[], from_ms: number, to_ms: number): Pick<ReadingSeries, 'time_ms' | 'stage_m' | 'source'> {
  const spans = chunks.map((c) => [sortedIndex(c.time_ms, from_ms, false), sortedIndex(c.time_ms, to_ms, true)] as const);
  let n = 0;
  for (const [a, b] of spans) n += Math.max(0, b - a);
  const out = { time_ms: new Float64Array(n), stage_m: new Float64Array(n), source: new Uint8Array(n) };
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

/** The stage record of a window from its parts (core's joinStageRecord over the spot readings and logger days). */
export function stageOf(parts: StageParts, from_ms: number, to_ms: number): ReadingSeries {
  return joinStageRecord(joinChunks(parts.chunks, from_ms, to_ms), parts.days, from_ms, to_ms);
}

/**
 * The stage record of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms; ±Infinity for no bound): live
 * spot readings (at one time in id order, as listReadings gives them) and logger values in time order.
 * Throws a RangeError for a window that ends before it starts.
 */
export async function readingSeries(siteId: string, from_ms: number, to_ms: number): Promise<ReadingSeries> {
  checkWindow('readingSeries', from_ms, to_ms);
  const parts = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.series);
    return stagePartsIn(tx, siteId, from_ms, to_ms);
  });
  return stageOf(parts, from_ms, to_ms);
}

/** What a read transaction over the series and the logger days offers. */
export interface SeriesReadTx {
  objectStore(name: 'series'): { getAll(range: IDBKeyRange): Promise<SeriesChunk[]> };
  objectStore(name: 'loggerDays'): { index(name: 'by-site-day'): { getAll(range: IDBKeyRange): Promise<LoggerDayRecord[]> } };
}

/** The spot readings' day chunks and the logger days of a site's window, read in tx. */
export async function stagePartsIn(tx: SeriesReadTx, siteId: string, from_ms: number, to_ms: number): Promise<StageParts> {
  const range = chunkRange(siteId, from_ms, to_ms);
  const [chunks, days] = await Promise.all([
    tx.objectStore('series').getAll(range),
    tx.objectStore('loggerDays').index('by-site-day').getAll(range),
  ]);
  return { chunks, days };
}

/**
 * The time (UTC ms) of the latest value of a site's stage record, spot reading or logger value, not more
 * than a day ahead of the clock (a mistyped year must not move the default windows); undefined when none.
 */
export async function latestStageTime(siteId: string): Promise<number | undefined> {
  const upTo = now_ms() + LATEST_AHEAD_MS;
  const [reading, logger] = await Promise.all([
    latestReading(siteId),
    withDb(async (db) => {
      // The newest live day first, one record at a time: a long record is never read whole for this.
      let cursor = await db.transaction('loggerDays').store.index('by-site-day').openCursor(chunkRange(siteId, -Infinity, upTo), 'prev');
      while (cursor) {
        const d = cursor.value;
        if (!d.deleted) {
          const start = d.day * 86_400_000;
          let k = d.offset_ms.length - 1;
          while (k >= 0 && start + d.offset_ms[k] > upTo) k--;
          if (k >= 0) return start + d.offset_ms[k];
        }
        cursor = await cursor.continue();
      }
      return undefined;
    }),
  ]);
  if (reading === undefined) return logger;
  return logger === undefined ? reading.time_ms : Math.max(reading.time_ms, logger);
}

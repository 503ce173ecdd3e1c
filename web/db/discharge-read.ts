// Stored readings with the discharge each gives through the rating (and shift) in force at its time:
// as whole records for lists and exports, or as arrays read from the compact series for plots and
// storm analysis. Both read their window and the site's ratings in one transaction and leave the
// hydrometry to core (withDischarge, dischargeThrough), so they agree row for row.
import {
  dischargeThrough, stageRecordWithDischarge, withDischarge, type DischargeSeries, type ReadingWithDischarge, type StageRecordWithDischarge,
} from '../../core/index';
import { withDb } from './connection';
import { SCOPES } from './stores';
import { chunkRange, checkWindow, stageOf, stagePartsIn, type ReadingSeries } from './series-read';

/** A reading series with, per reading, its discharge (m³/s; NaN with no rating in force), shift (m), extrapolation flag and rating. */
export interface SeriesWithDischarge extends ReadingSeries, DischargeSeries {}

/** The ratings of a site that may be in force up to to_ms (UTC ms). */
const ratingsUpTo = (siteId: string, to_ms: number): IDBKeyRange => IDBKeyRange.bound([siteId, -Infinity], [siteId, to_ms]);

/**
 * Non-deleted readings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms), oldest first, each with the
 * discharge from the rating in force at its time and that rating's dated shifts. Reads whole records
 * (what a list of readings shows); plots and storm analysis read seriesWithDischarge, far faster.
 */
export async function readingsWithDischarge(siteId: string, from_ms: number, to_ms: number): Promise<ReadingWithDischarge[]> {
  checkWindow('readingsWithDischarge', from_ms, to_ms);
  const [readings, ratings] = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.readingsDischarge);
    return Promise.all([
      tx.objectStore('readings').index('by-site-time').getAll(IDBKeyRange.bound([siteId, from_ms], [siteId, to_ms])),
      tx.objectStore('ratings').index('by-site-from').getAll(ratingsUpTo(siteId, to_ms)),
    ]);
  });
  return withDischarge(ratings, readings.filter((r) => !r.deleted));
}

/**
 * Non-deleted readings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms) as arrays in time order, each
 * with its discharge exactly as readingsWithDischarge gives it. Reads the series and the ratings in one
 * transaction. Throws a RangeError for a window that ends before it starts.
 */
export async function seriesWithDischarge(siteId: string, from_ms: number, to_ms: number): Promise<SeriesWithDischarge> {
  checkWindow('seriesWithDischarge', from_ms, to_ms);
  const [parts, ratings] = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.seriesDischarge);
    return Promise.all([
      stagePartsIn(tx, siteId, from_ms, to_ms),
      tx.objectStore('ratings').index('by-site-from').getAll(ratingsUpTo(siteId, to_ms)),
    ]);
  });
  const series = stageOf(parts, from_ms, to_ms);
  return { ...series, ...dischargeThrough(ratings, series.time_ms, series.stage_m) };
}

/**
 * The stage record of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms) with whole records: live spot
 * readings and logger days joined by core (stageRecordWithDischarge), each value with its discharge.
 * What the readings list and the exports read; the same join as seriesWithDischarge, value for value.
 */
export async function stageRecordIn(siteId: string, from_ms: number, to_ms: number): Promise<StageRecordWithDischarge> {
  checkWindow('stageRecordIn', from_ms, to_ms);
  const [readings, days, ratings] = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.recordDischarge);
    return Promise.all([
      tx.objectStore('readings').index('by-site-time').getAll(IDBKeyRange.bound([siteId, from_ms], [siteId, to_ms])),
      tx.objectStore('loggerDays').index('by-site-day').getAll(chunkRange(siteId, from_ms, to_ms)),
      tx.objectStore('ratings').index('by-site-from').getAll(ratingsUpTo(siteId, to_ms)),
    ]);
  });
  return stageRecordWithDischarge(ratings, readings, days, from_ms, to_ms);
}

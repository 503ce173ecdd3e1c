// A window's series (times, stages, sources) with the discharge each reading gives through the rating and
// shift in force at its time: the arrays form of readingsWithDischarge, for plots and storm analysis.
import { dischargeAt, isExtrapolated, shiftAt } from '../../core/rating/index';
import type { RatingRecord } from '../../core/records/index';
import { withDb } from './connection';
import { checkWindow, joinChunks, seriesChunksIn, type ReadingSeries } from './readings-series';

/** A reading series with, per reading, its discharge (m³/s), shift (m), extrapolation flag and rating. */
export interface SeriesWithDischarge extends ReadingSeries {
  /** Discharge, m³/s; NaN where no rating is in force (how core's Series marks a gap: never show NaN). */
  discharge_m3s: Float64Array;
  /** Shift applied, m (0 when the rating has none or no rating is in force). */
  shift_m: Float64Array;
  /** 1 where the stage lies outside the rating's gauged range, else 0. */
  extrapolated: Uint8Array;
  /** Ids of the ratings the window's discharges come from, oldest first. */
  ratingIds: string[];
  /** Per reading, its rating's position in ratingIds; −1 where no rating is in force. */
  ratingIndex: Int32Array;
}

/**
 * Non-deleted readings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms) as arrays in time order, each
 * with the discharge from the rating in force at its time (latest validFrom_ms ≤ time_ms, not deleted)
 * and that rating's dated shifts, exactly as readingsWithDischarge computes it. Reads the series and the
 * ratings in one transaction. Throws a RangeError for a window that ends before it starts.
 */
export async function seriesWithDischarge(siteId: string, from_ms: number, to_ms: number): Promise<SeriesWithDischarge> {
  checkWindow('seriesWithDischarge', from_ms, to_ms);
  const [chunks, ratings] = await withDb(async (db) => {
    const tx = db.transaction(['series', 'loggerDays', 'ratings']);
    return Promise.all([
      seriesChunksIn(tx, siteId, from_ms, to_ms),
      tx.objectStore('ratings').index('by-site-from').getAll(IDBKeyRange.bound([siteId, -Infinity], [siteId, to_ms])),
    ]);
  });
  const series = joinChunks(chunks, from_ms, to_ms);
  const n = series.time_ms.length;
  const discharge_m3s = new Float64Array(n);
  const shift_m = new Float64Array(n);
  const extrapolated = new Uint8Array(n);
  const ratingIndex = new Int32Array(n);
  const ratingIds: string[] = [];
  const inForce: RatingRecord[] = ratings.filter((r) => !r.deleted);
  let k = -1;
  for (let i = 0; i < n; i++) {
    const t = series.time_ms[i];
    const stage = series.stage_m[i];
    while (k + 1 < inForce.length && inForce[k + 1].validFrom_ms <= t) k++;
    const rating = k >= 0 ? inForce[k] : undefined;
    if (!rating) {
      discharge_m3s[i] = Number.NaN;
      ratingIndex[i] = -1;
      continue;
    }
    if (ratingIds[ratingIds.length - 1] !== rating.id) ratingIds.push(rating.id);
    const shift = rating.shifts.length > 0 ? shiftAt(rating.shifts, t, stage) : 0;
    shift_m[i] = shift;
    discharge_m3s[i] = dischargeAt(rating, stage, shift);
    extrapolated[i] = isExtrapolated(rating, stage) ? 1 : 0;
    ratingIndex[i] = ratingIds.length - 1;
  }
  return { ...series, discharge_m3s, shift_m, extrapolated, ratingIds, ratingIndex };
}

// Readings of a window with the discharge each gives through the rating (and shift) in force at its time.
import { dischargeAt, isExtrapolated, shiftAt } from '../../core/rating/index';
import type { RatingRecord, ReadingRecord } from '../../core/records/index';
import { withDb } from './connection';

/** A reading with its discharge (m³/s) and the rating used; discharge_m3s is null when no rating applies. */
export interface ReadingWithDischarge {
  reading: ReadingRecord;
  discharge_m3s: number | null;
  /** Shift applied, m (0 when the rating has none). */
  shift_m: number;
  ratingId: string | null;
  /** True when the stage lies outside the rating's gauged range of gauge heights. */
  extrapolated: boolean;
}

/**
 * Non-deleted readings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms), oldest first, each with the
 * discharge from the rating in force at its time (latest validFrom_ms ≤ time_ms) and that rating's
 * dated shifts. Reads readings and ratings in one transaction. Reads whole records (what a list of
 * readings shows); plots and storm analysis read seriesWithDischarge, the same figures as arrays, far faster.
 */
export async function readingsWithDischarge(siteId: string, from_ms: number, to_ms: number): Promise<ReadingWithDischarge[]> {
  const [readings, ratings] = await withDb(async (db) => {
    const tx = db.transaction(['readings', 'ratings']);
    return Promise.all([
      tx.objectStore('readings').index('by-site-time').getAll(IDBKeyRange.bound([siteId, from_ms], [siteId, to_ms])),
      tx.objectStore('ratings').index('by-site-from').getAll(IDBKeyRange.bound([siteId, -Infinity], [siteId, to_ms])),
    ]);
  });
  const inForce: RatingRecord[] = ratings.filter((r) => !r.deleted);
  const out: ReadingWithDischarge[] = [];
  let k = -1;
  for (const reading of readings) {
    if (reading.deleted) continue;
    while (k + 1 < inForce.length && inForce[k + 1].validFrom_ms <= reading.time_ms) k++;
    const rating = k >= 0 ? inForce[k] : undefined;
    if (!rating) {
      out.push({ reading, discharge_m3s: null, shift_m: 0, ratingId: null, extrapolated: false });
      continue;
    }
    const shift_m = rating.shifts.length > 0 ? shiftAt(rating.shifts, reading.time_ms, reading.stage_m) : 0;
    out.push({
      reading,
      discharge_m3s: dischargeAt(rating, reading.stage_m, shift_m),
      shift_m,
      ratingId: rating.id,
      extrapolated: isExtrapolated(rating, reading.stage_m),
    });
  }
  return out;
}

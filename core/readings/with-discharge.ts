// Stored readings with the discharge each gives through the rating in force at its time: the record
// form of dischargeThrough, for lists and exports.
import { dischargeThrough, type DatedRating, type StageDischarge } from '../rating/index';
import type { ReadingRecord } from '../records/index';

/** A reading with its discharge (m³/s; NaN, NO_DISCHARGE, when no rating is in force), shift (m), flag and rating. */
export interface ReadingWithDischarge extends StageDischarge {
  reading: ReadingRecord;
}

/** Each reading (any order, kept) with its discharge through the rating in force at its time; see dischargeThrough. */
export function withDischarge(ratings: readonly DatedRating[], readings: readonly ReadingRecord[]): ReadingWithDischarge[] {
  const q = dischargeThrough(ratings, readings.map((r) => r.time_ms), readings.map((r) => r.stage_m));
  return readings.map((reading, i) => {
    const at = q.ratingIndex[i];
    return {
      reading,
      discharge_m3s: q.discharge_m3s[i],
      shift_m: q.shift_m[i],
      extrapolated: q.extrapolated[i] === 1,
      ratingId: at >= 0 ? q.ratingIds[at] : undefined,
    };
  });
}

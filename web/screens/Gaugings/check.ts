// How one gauging checks the rating in force at its time: deviation, within its grade or not, and the
// shift it implies. Pure; the rating in force is chosen by the caller.
import { checksRating, dischargeAt, shiftAt, shiftFor, type GaugingRecord, type RatingRecord } from '../../../core';

/** A gauging against its rating: deviation (%), whether it checks within its grade, shifts (m). */
export interface GaugingCheck {
  ratingId: string;
  /** Discharge the rating (with the shift in force) gives at the gauging's stage and time, m³/s. */
  rated_m3s: number;
  /** 100·(Q_measured − Q_rated)/Q_rated, percent. */
  deviation_pct: number;
  /** |deviation| within the grade's limit (common practice: excellent 2 %, good 5 %, fair 8 %). */
  checks: boolean;
  /** The shift (m) that would pass the base rating through the gauging. */
  impliedShift_m: number;
  /** The shift (m) already applied at that time and stage. */
  appliedShift_m: number;
}

/** The check of a gauging against `rating` (in force at its time), or undefined when it cannot be checked (no flow rated). */
export function gaugingCheck(gauging: GaugingRecord, rating: RatingRecord | undefined): GaugingCheck | undefined {
  if (!rating) return undefined;
  const appliedShift_m = rating.shifts.length ? shiftAt(rating.shifts, gauging.time_ms, gauging.meanStage_m) : 0;
  const rated_m3s = dischargeAt(rating, gauging.meanStage_m, appliedShift_m);
  if (!(rated_m3s > 0)) return undefined;
  const deviation_pct = (100 * (gauging.discharge_m3s - rated_m3s)) / rated_m3s;
  return {
    ratingId: rating.id,
    rated_m3s,
    deviation_pct,
    checks: checksRating(deviation_pct, gauging.grade),
    impliedShift_m: shiftFor(rating, { stage_m: gauging.meanStage_m, discharge_m3s: gauging.discharge_m3s }),
    appliedShift_m,
  };
}

/** The rating in force at time_ms among a site's ratings (oldest validFrom first): the latest that started by then. */
export function ratingAt(ratings: readonly RatingRecord[], time_ms: number): RatingRecord | undefined {
  let found: RatingRecord | undefined;
  for (const r of ratings) if (!r.deleted && r.validFrom_ms <= time_ms) found = r;
  return found;
}

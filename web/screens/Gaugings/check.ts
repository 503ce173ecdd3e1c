// How one gauging checks the rating in force at its time: deviation, within its grade or not, and the
// shift it implies. Pure; the rating in force, its shift and discharge come from core's one home.
import { checksRating, dischargeAtTime, hasDischarge, shiftFor, type GaugingRecord, type RatingRecord } from '../../../core';

/** A gauging against its rating: deviation (%), whether it checks within its grade, shifts (m). */
export interface GaugingCheck {
  ratingId: string;
  /** Discharge the rating in force (with its shift) gives at the gauging's stage and time, m³/s. */
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

/**
 * The check of a gauging against the site's rating in force at its time (core dischargeAtTime), or
 * undefined when no rating is in force or it rates no flow at that stage.
 */
export function gaugingCheck(gauging: GaugingRecord, ratings: readonly RatingRecord[]): GaugingCheck | undefined {
  const at = dischargeAtTime(ratings, gauging.time_ms, gauging.meanStage_m);
  const rating = ratings.find((r) => r.id === at.ratingId);
  if (!rating || !hasDischarge(at.discharge_m3s) || !(at.discharge_m3s > 0)) return undefined;
  const deviation_pct = (100 * (gauging.discharge_m3s - at.discharge_m3s)) / at.discharge_m3s;
  return {
    ratingId: rating.id,
    rated_m3s: at.discharge_m3s,
    deviation_pct,
    checks: checksRating(deviation_pct, gauging.grade),
    impliedShift_m: shiftFor(rating, { stage_m: gauging.meanStage_m, discharge_m3s: gauging.discharge_m3s }),
    appliedShift_m: at.shift_m,
  };
}

// How one gauging checks the rating: the one home of a gauging's deviation, used by the gauging list and
// entry, and by the rating plot's marks. The measured discharge is compared with the discharge the rating
// in force at the gauging's time gives at its stage WITH the shift in force then (dischargeAtTime): that
// is the discharge the record carried for that moment, so a gauging checks the rating as it was applied.
// A gauging taken to set a new shift shows its deviation from the shifted rating (and the shift it implies).
import { checksRating, type MeasurementGrade } from './grade';
import { dischargeAtTime, hasDischarge, type DatedRating } from './in-force';
import { shiftFor } from './shift';

/** What a deviation needs of a gauging: its time (UTC ms), mean stage (m), discharge (m³/s) and grade. */
export interface GaugedPoint {
  time_ms: number;
  meanStage_m: number;
  discharge_m3s: number;
  grade: MeasurementGrade;
}

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
 * The check of a gauging against the rating in force at its time among `ratings`, with the shift in
 * force then; undefined when no rating is in force or it rates no flow at that stage.
 */
export function gaugingCheck(gauging: GaugedPoint, ratings: readonly DatedRating[]): GaugingCheck | undefined {
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

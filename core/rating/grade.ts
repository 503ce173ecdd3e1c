import { requireFinite } from './validate';

/** Quality grade of a discharge measurement, by its percent uncertainty. */
export type MeasurementGrade = 'excellent' | 'good' | 'fair' | 'poor';

/** Upper uncertainty limit (%) of each grade; poor has none (USGS discharge-measurement quality codes). */
export const GRADE_LIMITS_PCT: Readonly<Record<MeasurementGrade, number>> = {
  excellent: 2,
  good: 5,
  fair: 8,
  poor: Infinity,
};

/** The grade for a measurement uncertainty in percent: excellent ≤ 2, good ≤ 5, fair ≤ 8, poor above. */
export function gradeOf(uncertainty_pct: number): MeasurementGrade {
  requireFinite('gradeOf', 'uncertainty_pct', uncertainty_pct);
  if (uncertainty_pct < 0) throw new RangeError(`gradeOf needs an uncertainty ≥ 0 %; got ${uncertainty_pct}`);
  if (uncertainty_pct <= GRADE_LIMITS_PCT.excellent) return 'excellent';
  if (uncertainty_pct <= GRADE_LIMITS_PCT.good) return 'good';
  if (uncertainty_pct <= GRADE_LIMITS_PCT.fair) return 'fair';
  return 'poor';
}

/**
 * Whether a gauging deviating deviation_pct (%) from the rating checks it within its grade: |d| ≤ the
 * grade's limit. A poor gauging has no upper limit, so its deviation alone never disproves the rating.
 */
export function checksRating(deviation_pct: number, grade: MeasurementGrade): boolean {
  requireFinite('checksRating', 'deviation_pct', deviation_pct);
  switch (grade) {
    case 'excellent':
    case 'good':
    case 'fair':
    case 'poor':
      return Math.abs(deviation_pct) <= GRADE_LIMITS_PCT[grade];
    default: {
      const unknown: never = grade;
      throw new RangeError(`checksRating needs a grade of 'excellent', 'good', 'fair' or 'poor'; got ${String(unknown)}`);
    }
  }
}

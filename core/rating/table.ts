import { dischargeAt } from './evaluate';
import { isExtrapolated } from './extrapolation';
import type { Rating } from './types';
import { requireFinite, validateRating } from './validate';

/** One row of a rating table: gauge height (m), discharge (m³/s), and whether it lies outside the gauged range. */
export interface RatingTableRow {
  stage_m: number;
  discharge_m3s: number;
  extrapolated: boolean;
}

/** Most rows ratingTable will produce; a finer table is refused rather than filling memory. */
export const RATING_TABLE_MAX_ROWS = 100_000;

/**
 * Rating table from from_m to to_m inclusive (m) every step_m (m), with an optional constant stage
 * shift shift_m (m). The last row is to_m even when the range is not a whole number of steps.
 */
export function ratingTable(rating: Rating, from_m: number, to_m: number, step_m: number, shift_m = 0): RatingTableRow[] {
  validateRating('ratingTable', rating);
  requireFinite('ratingTable', 'from_m', from_m);
  requireFinite('ratingTable', 'to_m', to_m);
  requireFinite('ratingTable', 'step_m', step_m);
  requireFinite('ratingTable', 'shift_m', shift_m);
  if (!(step_m > 0)) throw new RangeError(`ratingTable needs step_m > 0; got ${step_m}`);
  if (!(to_m >= from_m)) throw new RangeError(`ratingTable needs to_m ≥ from_m; got from ${from_m} m to ${to_m} m`);
  const steps = (to_m - from_m) / step_m;
  // (0.9 − 0.3)/0.1 is 5.999…: allow a relative slack of 1e-9 of a step so float drift loses no row.
  const whole = Math.floor(steps + 1e-9);
  const exact = Math.abs(steps - whole) <= 1e-9 * Math.max(1, steps);
  const rows = whole + 1 + (exact ? 0 : 1);
  if (rows > RATING_TABLE_MAX_ROWS) {
    throw new RangeError(
      `ratingTable would make ${rows} rows; at most ${RATING_TABLE_MAX_ROWS} are allowed, so use a larger step_m`,
    );
  }
  const table: RatingTableRow[] = [];
  for (let k = 0; k < rows; k++) {
    // Multiplying (not accumulating) keeps each stage within one rounding of from + k·step; rounding to
    // a nanometre then removes that last bit (0.1 + 2·0.1 is 0.30000000000000004), so a row on the edge
    // of the gauged range is not marked extrapolated by a rounding error.
    const stage = k === rows - 1 ? to_m : Math.round((from_m + k * step_m) * 1e9) / 1e9;
    const discharge_m3s = dischargeAt(rating, stage, shift_m);
    // Q = 0 at or below the zero-flow stage is exact, not extrapolated, wherever the gaugings lie.
    table.push({ stage_m: stage, discharge_m3s, extrapolated: discharge_m3s > 0 && isExtrapolated(rating, stage) });
  }
  return table;
}

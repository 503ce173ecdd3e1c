import type { Rating, RatingSegment } from './types';
import { rejectStageAndShift, validateSegments } from './validate';

/** Index of the segment that applies at effective stage h (m): the last one whose breakpoint is ≤ h, else 0. */
export function segmentIndexAt(segments: readonly RatingSegment[], h_m: number): number {
  let i = segments.length - 1;
  while (i > 0 && h_m < segments[i].fromStage_m) i--;
  return i;
}

function dischargeMultiSegment(rating: Rating, h: number): number {
  validateSegments('dischargeAt', rating);
  const segments = rating.segments;
  const s = segments[segmentIndexAt(segments, h)];
  return h > s.offset_m ? finiteDischarge(s.coefficient * Math.pow(h - s.offset_m, s.exponent), h) : 0;
}

/** The discharge itself when finite; a RangeError when the stage is so far above the rating that Q overflows. */
function finiteDischarge(q: number, h: number): number {
  if (q < Infinity) return q;
  throw new RangeError(
    `dischargeAt needs a stage the rating can carry; ${h} m gives a discharge too large to represent. Check the stage and its units.`,
  );
}

/**
 * Discharge (m³/s) at gauge height stage_m (m) with an optional stage shift shift_m (m):
 * Q = C·(stage + shift − e)^b with the segment that applies at stage + shift; 0 at or below the offset.
 * A stage so high that Q overflows (e.g. 1e200 m) is refused with a RangeError rather than given as Infinity.
 */
export function dischargeAt(rating: Rating, stage_m: number, shift_m = 0): number {
  const h = stage_m + shift_m;
  // h − h is 0 for every finite h and NaN for NaN or ±Infinity: one comparison instead of two calls.
  if (!(h - h === 0)) rejectStageAndShift('dischargeAt', stage_m, shift_m);
  const segments = rating.segments;
  // Everything but the one-segment case goes out of line, so this stays small enough to be inlined.
  if (segments === undefined || segments.length !== 1) return dischargeMultiSegment(rating, h);
  const s = segments[0];
  const c = s.coefficient;
  const e = s.offset_m;
  const b = s.exponent;
  // One-segment fast path: check the fields inline (NaN fails every comparison), allocate nothing.
  if (!(c > 0 && c < Infinity && b > 0 && b < Infinity && e - e === 0 && s.fromStage_m - s.fromStage_m === 0)) {
    validateSegments('dischargeAt', rating);
  }
  if (!(h > e)) return 0;
  const q = c * Math.pow(h - e, b);
  return q < Infinity ? q : finiteDischarge(q, h);
}

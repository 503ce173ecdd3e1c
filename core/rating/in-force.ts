// The discharge of a stage at a time: the rating in force at time t, its dated shift at t, the
// discharge, and whether it is extrapolated. The one home of this rule: the reading check, the stored
// views (lists, plots, storm analysis) and the exports all call it.
import { segmentIndexAt } from './evaluate';
import { shiftIn, validateShifts, type DatedShift } from './shift-schedule';
import type { Rating } from './types';
import { validateRating } from './validate';

/** A rating with its identity and the time from which it is in force (UTC ms), with its dated shifts (m). */
export interface DatedRating extends Rating {
  id: string;
  /** In force from this time (UTC ms) until the next rating of the site. */
  validFrom_ms: number;
  shifts: readonly DatedShift[];
  /** A deleted rating is never in force. */
  deleted?: boolean;
}

/** "No discharge" (no rating in force at that time), the one spelling used in arrays and records alike: NaN. */
export const NO_DISCHARGE = Number.NaN;

/** True when a discharge (m³/s) is a value, false for NO_DISCHARGE. */
export function hasDischarge(discharge_m3s: number): boolean {
  return !Number.isNaN(discharge_m3s);
}

/** The discharge of one stage at one time through the rating in force (m³/s, shift m). */
export interface StageDischarge {
  /** m³/s; NO_DISCHARGE (NaN) when no rating is in force. */
  discharge_m3s: number;
  /** Shift applied, m: 0 when the rating has none in force, or no rating is in force. */
  shift_m: number;
  /** True when the stage lies outside the rating's gauged range and the discharge is above 0. */
  extrapolated: boolean;
  /** Id of the rating that applied; undefined when none is in force. */
  ratingId: string | undefined;
}

/** The discharge of many stages (m³/s) at many times, as arrays in the order given. */
export interface DischargeSeries {
  /** m³/s; NO_DISCHARGE (NaN) where no rating is in force. */
  discharge_m3s: Float64Array;
  /** Shift applied, m (0 where none). */
  shift_m: Float64Array;
  /** 1 where extrapolated (outside the gauged range, discharge above 0), else 0. */
  extrapolated: Uint8Array;
  /** Ids of the ratings that applied, in order of first use. */
  ratingIds: string[];
  /** Per stage, its rating's position in ratingIds; −1 where no rating is in force. */
  ratingIndex: Int32Array;
}

function before(a: DatedRating, b: DatedRating): number {
  return a.validFrom_ms - b.validFrom_ms || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/** The ratings that can be in force (not deleted), by validFrom_ms then id; ties go to the higher id. */
function inForceOrder<R extends DatedRating>(ratings: readonly R[]): R[] {
  if (!Array.isArray(ratings)) throw new RangeError('The ratings must be given as a list');
  return ratings.filter((r) => !r.deleted).sort(before);
}

/** Index of the last rating (in inForceOrder) with validFrom_ms ≤ time_ms; −1 when none. */
function lastFrom(order: readonly DatedRating[], time_ms: number): number {
  let lo = 0;
  let hi = order.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (order[mid].validFrom_ms <= time_ms) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}

/**
 * The rating in force at time_ms (UTC ms): of those not deleted, the one with the latest validFrom_ms
 * at or before time_ms (between two with the same time, the higher id); undefined when none.
 */
export function ratingInForce<R extends DatedRating>(ratings: readonly R[], time_ms: number): R | undefined {
  if (Number.isNaN(time_ms)) throw new RangeError('The time must be a number of UTC milliseconds');
  const order = inForceOrder(ratings);
  const k = lastFrom(order, time_ms);
  return k >= 0 ? order[k] : undefined;
}

/** Discharge (m³/s) at stage + shift h (m) on an already validated rating. */
function evaluate(rating: Rating, h_m: number): number {
  const s = rating.segments[segmentIndexAt(rating.segments, h_m)];
  return h_m > s.offset_m ? s.coefficient * Math.pow(h_m - s.offset_m, s.exponent) : 0;
}

/**
 * The discharge of stage_m[i] (m) at time_ms[i] (UTC ms) for every i, through the rating in force at
 * each time and its dated shifts. Times need not be sorted (sorted times are fastest). Each rating used
 * is validated once; a rating never in force is not looked at. Throws a RangeError for a bad rating or
 * shift, arrays of different lengths, or a stage or time that is not a finite number.
 */
export function dischargeThrough(ratings: readonly DatedRating[], time_ms: ArrayLike<number>, stage_m: ArrayLike<number>): DischargeSeries {
  const n = time_ms.length;
  if (stage_m.length !== n) throw new RangeError(`Each time needs one stage; got ${n} times and ${stage_m.length} stages`);
  const order = inForceOrder(ratings);
  const checked = new Uint8Array(order.length);
  const idIndex = new Int32Array(order.length).fill(-1);
  const out: DischargeSeries = {
    discharge_m3s: new Float64Array(n),
    shift_m: new Float64Array(n),
    extrapolated: new Uint8Array(n),
    ratingIds: [],
    ratingIndex: new Int32Array(n),
  };
  let k = -1;
  let lastT = -Infinity;
  for (let i = 0; i < n; i++) {
    const t = time_ms[i];
    const stage = stage_m[i];
    if (!(t - t === 0)) throw new RangeError(`Time ${i} is not a finite number of UTC milliseconds: ${t}`);
    if (!(stage - stage === 0)) throw new RangeError(`Stage ${i} is not a finite number of metres: ${stage}`);
    // Sorted input walks forward; anything else looks the rating up again.
    if (t >= lastT) while (k + 1 < order.length && order[k + 1].validFrom_ms <= t) k++;
    else k = lastFrom(order, t);
    lastT = t;
    if (k < 0) {
      out.discharge_m3s[i] = NO_DISCHARGE;
      out.ratingIndex[i] = -1;
      continue;
    }
    const rating = order[k];
    if (!checked[k]) {
      validateRating('The rating in force', rating);
      validateShifts('The rating in force', rating.shifts);
      checked[k] = 1;
      idIndex[k] = out.ratingIds.length;
      out.ratingIds.push(rating.id);
    }
    const shift = rating.shifts.length > 0 ? shiftIn(rating.shifts, t, stage) : 0;
    const q = evaluate(rating, stage + shift);
    // As dischargeAt: a stage so far above the rating that Q overflows is refused, never given as Infinity.
    if (!(q < Infinity)) throw new RangeError(`Stage ${i} (${stage} m) gives a discharge too large to represent; check the stage and its units`);
    const range = rating.gaugedRange_m;
    out.shift_m[i] = shift;
    out.discharge_m3s[i] = q;
    out.extrapolated[i] = q > 0 && range !== undefined && (stage < range[0] || stage > range[1]) ? 1 : 0;
    out.ratingIndex[i] = idIndex[k];
  }
  return out;
}

/** The discharge of one stage (m) at one time (UTC ms) through the rating in force then (see dischargeThrough). */
export function dischargeAtTime(ratings: readonly DatedRating[], time_ms: number, stage_m: number): StageDischarge {
  const r = dischargeThrough(ratings, [time_ms], [stage_m]);
  const at = r.ratingIndex[0];
  return {
    discharge_m3s: r.discharge_m3s[0],
    shift_m: r.shift_m[0],
    extrapolated: r.extrapolated[0] === 1,
    ratingId: at >= 0 ? r.ratingIds[at] : undefined,
  };
}

import { interpolateShift, validateShiftCurve, type ShiftCurve } from './shift-curve';
import { requireFinite } from './validate';

/**
 * A shift curve in effect from time_ms (UTC epoch ms). toNext says what happens until the next dated
 * shift: 'prorate' moves linearly in time to the next curve; 'hold' keeps this curve until then.
 */
export interface DatedShift {
  time_ms: number;
  curve: ShiftCurve;
  toNext: 'prorate' | 'hold';
}

/** Checks dated shifts: valid curves, finite times strictly ascending, toNext 'prorate' or 'hold'. */
export function validateShifts(fn: string, shifts: readonly DatedShift[]): void {
  if (!Array.isArray(shifts)) throw new RangeError(`${fn} needs an array of dated shifts`);
  for (let i = 0; i < shifts.length; i++) {
    const s = shifts[i];
    requireFinite(fn, `time_ms of dated shift ${i}`, s?.time_ms);
    validateShiftCurve(`${fn} (dated shift ${i})`, s.curve);
    if (s.toNext !== 'prorate' && s.toNext !== 'hold') {
      throw new RangeError(`${fn} needs toNext 'prorate' or 'hold' in dated shift ${i}; got ${String(s.toNext)}`);
    }
    if (i > 0 && !(s.time_ms > shifts[i - 1].time_ms)) {
      throw new RangeError(
        `${fn} needs dated shifts sorted by time_ms, strictly ascending; shift ${i} at ${s.time_ms} is not after shift ${i - 1} at ${shifts[i - 1].time_ms}`,
      );
    }
  }
}

/**
 * The shift (m) to apply at time_ms (UTC epoch ms) and gauge height stage_m (m): 0 before the first
 * dated shift; the last one's curve after it; between two, the earlier curve, prorated linearly in
 * time towards the later one when the earlier says 'prorate'.
 */
export function shiftAt(shifts: readonly DatedShift[], time_ms: number, stage_m: number): number {
  validateShifts('shiftAt', shifts);
  requireFinite('shiftAt', 'time_ms', time_ms);
  requireFinite('shiftAt', 'stage_m', stage_m);
  return shiftIn(shifts, time_ms, stage_m);
}

/** shiftAt (m) without validation, for callers that validated the shifts, time (UTC ms) and stage (m) already. */
export function shiftIn(shifts: readonly DatedShift[], time_ms: number, stage_m: number): number {
  if (shifts.length === 0 || time_ms < shifts[0].time_ms) return 0;
  let k = shifts.length - 1;
  while (shifts[k].time_ms > time_ms) k--;
  const from = shifts[k];
  const sFrom = interpolateShift(from.curve, stage_m);
  if (k === shifts.length - 1) return sFrom;
  switch (from.toNext) {
    case 'hold':
      return sFrom;
    case 'prorate': {
      const to = shifts[k + 1];
      const w = (time_ms - from.time_ms) / (to.time_ms - from.time_ms);
      return sFrom + w * (interpolateShift(to.curve, stage_m) - sFrom);
    }
    default: {
      const unreachable: never = from.toNext;
      throw new RangeError(`shiftAt: unknown toNext ${String(unreachable)}`);
    }
  }
}

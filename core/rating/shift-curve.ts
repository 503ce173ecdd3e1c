import { requireFinite } from './validate';

/** A stage-variable shift: (gauge height m, shift m) points, linear between them, constant beyond the ends. */
export interface ShiftCurve {
  points: { stage_m: number; shift_m: number }[];
}

/** A shift curve with one shift (m) at every stage. */
export function constantShift(shift_m: number): ShiftCurve {
  requireFinite('constantShift', 'shift_m', shift_m);
  return { points: [{ stage_m: 0, shift_m }] };
}

/** Checks a shift curve: at least one point, finite values, stages strictly ascending. Throws a RangeError. */
export function validateShiftCurve(fn: string, curve: ShiftCurve): void {
  const points = curve?.points;
  if (!Array.isArray(points) || points.length === 0) {
    throw new RangeError(`${fn} needs a shift curve with at least one (stage, shift) point`);
  }
  for (let i = 0; i < points.length; i++) {
    requireFinite(fn, `stage_m of shift point ${i}`, points[i].stage_m);
    requireFinite(fn, `shift_m of shift point ${i}`, points[i].shift_m);
    if (i > 0 && !(points[i].stage_m > points[i - 1].stage_m)) {
      throw new RangeError(
        `${fn} needs shift points sorted by stage_m, strictly ascending; point ${i} at ${points[i].stage_m} m is not above point ${i - 1} at ${points[i - 1].stage_m} m`,
      );
    }
  }
}

/** The shift (m) a stage-variable shift curve gives at gauge height stage_m (m). */
export function shiftFromCurve(curve: ShiftCurve, stage_m: number): number {
  validateShiftCurve('shiftFromCurve', curve);
  requireFinite('shiftFromCurve', 'stage_m', stage_m);
  return interpolateShift(curve, stage_m);
}

/** shiftFromCurve without validation, for callers that validated the curve already. */
export function interpolateShift(curve: ShiftCurve, stage_m: number): number {
  const points = curve.points;
  const last = points.length - 1;
  if (stage_m <= points[0].stage_m) return points[0].shift_m;
  if (stage_m >= points[last].stage_m) return points[last].shift_m;
  let k = 1;
  while (points[k].stage_m < stage_m) k++;
  const a = points[k - 1];
  const b = points[k];
  const w = (stage_m - a.stage_m) / (b.stage_m - a.stage_m);
  return a.shift_m + w * (b.shift_m - a.shift_m);
}

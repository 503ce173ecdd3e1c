import type { Rating } from './types';

/** Throws a RangeError naming the problem when `x` is not a finite number; `what` names the value. */
export function requireFinite(fn: string, what: string, x: number): void {
  if (typeof x !== 'number' || !Number.isFinite(x)) {
    throw new RangeError(`${fn} needs a finite ${what}; got ${String(x)}`);
  }
}

/**
 * Checks a rating's segments: at least one; every field finite; coefficient and exponent > 0; strictly
 * ascending by fromStage_m; above the first, each segment's offset below its breakpoint (so it carries
 * flow where it starts). Throws a RangeError naming the problem.
 */
export function validateSegments(fn: string, rating: Rating): void {
  const segments = rating?.segments;
  if (!Array.isArray(segments) || segments.length === 0) {
    throw new RangeError(`${fn} needs a rating with at least one segment; got ${segments === undefined ? 'none' : 'an empty list'}`);
  }
  for (let i = 0; i < segments.length; i++) {
    const s = segments[i];
    const name = `segment ${i}`;
    requireFinite(fn, `fromStage_m in ${name}`, s.fromStage_m);
    requireFinite(fn, `offset_m in ${name}`, s.offset_m);
    requireFinite(fn, `coefficient in ${name}`, s.coefficient);
    requireFinite(fn, `exponent in ${name}`, s.exponent);
    if (s.coefficient <= 0) {
      throw new RangeError(`${fn} needs a coefficient > 0 in ${name}; got ${s.coefficient}`);
    }
    if (s.exponent <= 0) {
      throw new RangeError(`${fn} needs an exponent > 0 in ${name}; got ${s.exponent}`);
    }
    if (i > 0) {
      const below = segments[i - 1];
      if (!(s.fromStage_m > below.fromStage_m)) {
        throw new RangeError(
          `${fn} needs segments sorted by fromStage_m, strictly ascending; ${name} starts at ${s.fromStage_m} m, not above segment ${i - 1} at ${below.fromStage_m} m`,
        );
      }
      if (!(s.offset_m < s.fromStage_m)) {
        throw new RangeError(
          `${fn} needs each segment above the first to have its offset below its breakpoint; ${name} has offset_m ${s.offset_m} m at or above fromStage_m ${s.fromStage_m} m`,
        );
      }
    }
  }
}

/** Checks a whole rating: its segments, and a gauged range, when given, finite with low ≤ high. */
export function validateRating(fn: string, rating: Rating): void {
  validateSegments(fn, rating);
  const range = rating.gaugedRange_m;
  if (range !== undefined) {
    if (!Array.isArray(range) || range.length !== 2) {
      throw new RangeError(`${fn} needs gaugedRange_m as [lowest, highest] stage in m; got ${String(range)}`);
    }
    requireFinite(fn, 'lowest gauged stage (gaugedRange_m[0])', range[0]);
    requireFinite(fn, 'highest gauged stage (gaugedRange_m[1])', range[1]);
    if (range[0] > range[1]) {
      throw new RangeError(`${fn} needs gaugedRange_m with lowest ≤ highest; got [${range[0]}, ${range[1]}]`);
    }
  }
}

/** Throws a RangeError naming which of stage and shift is not finite. */
export function rejectStageAndShift(fn: string, stage_m: number, shift_m: number): never {
  requireFinite(fn, 'stage_m', stage_m);
  requireFinite(fn, 'shift_m', shift_m);
  throw new RangeError(`${fn} needs a finite stage_m + shift_m; got ${stage_m} + ${shift_m}`);
}

import type { Rating, RatingSegment } from './types';
import { requireFinite, validateRating } from './validate';

/** Relative jump at a breakpoint above which ratingContinuity warns: 1 %. */
export const CONTINUITY_TOLERANCE = 0.01;

/** Discharge at one breakpoint from the segment below and the one above (m³/s), and the jump in percent. */
export interface BreakpointCheck {
  stage_m: number;
  below_m3s: number;
  above_m3s: number;
  /** 100·(above − below)/below; Infinity when the segment below gives no flow there. */
  jump_pct: number;
}

/** Checks every breakpoint of a rating for a jump larger than 1 %; one warning sentence per jump. */
export function ratingContinuity(rating: Rating): { breakpoints: BreakpointCheck[]; warnings: string[] } {
  validateRating('ratingContinuity', rating);
  const segments = rating.segments;
  const breakpoints: BreakpointCheck[] = [];
  const warnings: string[] = [];
  for (let i = 1; i < segments.length; i++) {
    const lower = segments[i - 1];
    const upper = segments[i];
    const h = upper.fromStage_m;
    const below = h > lower.offset_m ? lower.coefficient * Math.pow(h - lower.offset_m, lower.exponent) : 0;
    const above = upper.coefficient * Math.pow(h - upper.offset_m, upper.exponent);
    const jump_pct = below > 0 ? (100 * (above - below)) / below : Infinity;
    breakpoints.push({ stage_m: h, below_m3s: below, above_m3s: above, jump_pct });
    if (below === 0) {
      warnings.push(
        `At the breakpoint ${h} m segment ${i - 1} gives no flow while segment ${i} gives ${above.toPrecision(4)} m³/s; the segments do not meet.`,
      );
    } else if (Math.abs(above - below) > CONTINUITY_TOLERANCE * below) {
      warnings.push(
        `At the breakpoint ${h} m the discharge jumps by ${jump_pct.toFixed(2)} % (from ${below.toPrecision(4)} to ${above.toPrecision(4)} m³/s), more than ${100 * CONTINUITY_TOLERANCE} %.`,
      );
    }
  }
  return { breakpoints, warnings };
}

/**
 * The coefficient that makes a segment with the given offset (m) and exponent meet `lower` at the
 * breakpoint breakpoint_m (m): C2 = C1·(h_b − e1)^b1 / (h_b − e2)^b2.
 */
export function continuousCoefficient(lower: RatingSegment, offset_m: number, exponent: number, breakpoint_m: number): number {
  requireFinite('continuousCoefficient', 'offset_m', offset_m);
  requireFinite('continuousCoefficient', 'exponent', exponent);
  requireFinite('continuousCoefficient', 'breakpoint_m', breakpoint_m);
  validateRating('continuousCoefficient', { segments: [lower] });
  if (!(breakpoint_m > lower.offset_m) || !(breakpoint_m > offset_m)) {
    throw new RangeError(
      `continuousCoefficient needs the breakpoint above both offsets; got breakpoint ${breakpoint_m} m, offsets ${lower.offset_m} m and ${offset_m} m`,
    );
  }
  if (!(exponent > 0)) throw new RangeError(`continuousCoefficient needs an exponent > 0; got ${exponent}`);
  return (lower.coefficient * Math.pow(breakpoint_m - lower.offset_m, lower.exponent)) / Math.pow(breakpoint_m - offset_m, exponent);
}

import { ratingContinuity } from './continuity';
import { dischargeAt } from './evaluate';
import { fitRating, type RatingFit } from './fit';
import { fitJoined } from './joined-fit';
import type { GaugingPoint, Rating } from './types';
import { requireFinite } from './validate';

/**
 * Options of fitSegments: breakpoint_m (m) splits the gaugings into a lower segment (stage below it)
 * and an upper one (at or above it); offset_m (m) fixes the lower segment's offset; join fits both
 * segments together under continuity at the breakpoint (DOMAIN.md §2).
 */
export interface FitSegmentsOptions {
  breakpoint_m?: number;
  offset_m?: number;
  join?: boolean;
}

/** A one- or two-segment rating fitted to gaugings, with statistics over all the gaugings used (%). */
export interface SegmentsFit {
  rating: Rating;
  /** 100 × √(Σ(ln Q_i − ln Q̂_i)²/(n − p)) over every gauging, p = all fitted parameters, percent. */
  standardError_pct: number;
  /** 100·(Q_meas − Q_rating)/Q_rating per gauging, in input order. */
  deviations_pct: number[];
  /** Each segment fitted apart on its own gaugings, lowest first (with join, for comparison only). */
  parts: RatingFit[];
  /** Plain sentences: each part's warnings (named by segment when two) and the continuity check. */
  warnings: string[];
  /** n − p. */
  degreesOfFreedom: number;
}

/**
 * Fits a rating of one segment (no breakpoint) or two (split at breakpoint_m) to gaugings in log space,
 * each segment by fitRating. The upper segment's offset is always searched. With join the two segments
 * are fitted together: the log-space sum of squares over all gaugings is minimised with the upper
 * coefficient tied to the lower segment by continuity at the breakpoint and the offsets and exponents
 * free (one parameter fewer), never a rescale of a segment fitted apart. Throws a RangeError naming the
 * problem (too few gaugings on a side, an upper offset not below the breakpoint, bad numbers).
 */
export function fitSegments(points: readonly GaugingPoint[], options: FitSegmentsOptions = {}): SegmentsFit {
  const { breakpoint_m, offset_m, join = false } = options;
  if (breakpoint_m === undefined) {
    const fit = fitRating(points, offset_m === undefined ? {} : { offset_m });
    return {
      rating: { segments: [fit.segment], gaugedRange_m: fit.gaugedRange_m },
      standardError_pct: fit.standardError_pct,
      deviations_pct: fit.deviations_pct,
      parts: [fit],
      warnings: fit.warnings,
      degreesOfFreedom: fit.degreesOfFreedom,
    };
  }
  requireFinite('fitSegments', 'breakpoint_m', breakpoint_m);
  const lower = points.filter((p) => p.stage_m < breakpoint_m);
  const upper = points.filter((p) => p.stage_m >= breakpoint_m);
  const side = (what: string, run: () => RatingFit): RatingFit => {
    try {
      return run();
    } catch (err) {
      if (err instanceof RangeError) throw new RangeError(`fitSegments: the ${what} segment (gaugings ${what === 'lower' ? 'below' : 'at or above'} the breakpoint ${breakpoint_m} m): ${err.message}`);
      throw err;
    }
  };
  const low = side('lower', () => fitRating(lower, offset_m === undefined ? {} : { offset_m }));
  const high = side('upper', () => fitRating(upper));
  if (!join && !(high.segment.offset_m < breakpoint_m)) {
    throw new RangeError(
      `fitSegments needs the upper segment's offset below the breakpoint ${breakpoint_m} m; the upper gaugings give ${high.segment.offset_m.toFixed(3)} m, so move the breakpoint up to the lowest upper gauging or fit one segment`,
    );
  }
  let lowerSegment = low.segment;
  let upperSegment = { ...high.segment, fromStage_m: breakpoint_m };
  if (join) {
    const joined = fitJoined(lower, upper, breakpoint_m, { lowerOffset_m: low.segment.offset_m, upperOffset_m: high.segment.offset_m }, offset_m);
    if (!(joined.lower.exponent > 0) || !(joined.upper.exponent > 0)) {
      throw new RangeError(
        `fitSegments needs gaugings whose discharge rises with stage on both sides of the breakpoint ${breakpoint_m} m; the joined fit gives exponents ${joined.lower.exponent.toPrecision(3)} and ${joined.upper.exponent.toPrecision(3)}`,
      );
    }
    lowerSegment = joined.lower;
    upperSegment = joined.upper;
  }
  const lo = Math.min(low.gaugedRange_m[0], high.gaugedRange_m[0]);
  const hi = Math.max(low.gaugedRange_m[1], high.gaugedRange_m[1]);
  const rating: Rating = { segments: [lowerSegment, upperSegment], gaugedRange_m: [lo, hi] };
  let sse = 0;
  const deviations_pct = points.map((p) => {
    const rated = dischargeAt(rating, p.stage_m);
    const r = Math.log(p.discharge_m3s) - Math.log(rated);
    sse += r * r;
    return (100 * (p.discharge_m3s - rated)) / rated;
  });
  const parameters = (offset_m === undefined ? 3 : 2) + (join ? 2 : 3);
  const dof = points.length - parameters;
  // Each part numbers its own gaugings; say the index in the caller's list instead.
  const lowerAt: number[] = [];
  const upperAt: number[] = [];
  points.forEach((p, i) => (p.stage_m < breakpoint_m ? lowerAt : upperAt).push(i));
  const renumber = (w: string, at: number[]) => w.replace(/gauging at index (\d+)/g, (_m, k: string) => `gauging at index ${at[Number(k)]}`);
  const warnings = [
    ...low.warnings.map((w) => `Lower segment: ${renumber(w, lowerAt)}`),
    ...high.warnings.map((w) => `Upper segment: ${renumber(w, upperAt)}`),
    ...ratingContinuity(rating).warnings,
  ];
  return {
    rating,
    standardError_pct: 100 * Math.sqrt(sse / dof),
    deviations_pct,
    parts: [low, high],
    warnings,
    degreesOfFreedom: dof,
  };
}

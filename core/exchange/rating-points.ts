// A power-law rating written as a table of (stage, discharge) points fine enough that linear
// interpolation between neighbours stays within a stated tolerance of the curve (for WaterML 2.0 Part 2
// conversion tables, which readers interpolate linearly).
import { dischargeAt, isExtrapolated, segmentIndexAt, zeroFlowStage_m, type Rating } from '../rating/index';

/** One table point: gauge height (m), discharge (m³/s), and whether it lies outside the gauged range. */
export interface ConversionPoint {
  stage_m: number;
  discharge_m3s: number;
  extrapolated: boolean;
}

/** How close linear interpolation must stay to the curve: the larger of a share of Q and an absolute m³/s. */
export interface ConversionTolerance {
  relative: number;
  absolute_m3s: number;
}

/** 0.1 % of the discharge or 0.0001 m³/s (0.1 L/s), whichever is larger. */
export const DEFAULT_CONVERSION_TOLERANCE: ConversionTolerance = { relative: 0.001, absolute_m3s: 0.0001 };

/** Stages are placed on a 1 mm grid; an interval 1 mm wide is not split further. */
const GRID_M = 0.001;
const snap = (h: number) => Math.round(h / GRID_M) * GRID_M;

/**
 * The largest gap (m³/s) between the chord from a to b and the power law C·(h − e)^b on [a, b]: the
 * chord's slope equals the curve's slope at h − e = (slope / (C·b))^(1/(b − 1)) (mean value theorem),
 * where a convex or concave power law is farthest from its chord. Also returns the allowed gap there.
 */
export function chordGap(rating: Rating, a: number, b: number, tol: ConversionTolerance): { gap_m3s: number; allowed_m3s: number } {
  const seg = rating.segments[segmentIndexAt(rating.segments, (a + b) / 2)];
  // The law of the segment that holds inside the interval, also at its ends (a breakpoint at b may jump).
  const law = (h: number) => (h > seg.offset_m ? seg.coefficient * Math.pow(h - seg.offset_m, seg.exponent) : 0);
  const fa = law(a);
  const fb = law(b);
  const slope = (fb - fa) / (b - a);
  let x = (a + b) / 2;
  if (seg.exponent !== 1 && slope > 0 && a >= seg.offset_m) {
    const d = Math.pow(slope / (seg.coefficient * seg.exponent), 1 / (seg.exponent - 1));
    x = Math.min(b, Math.max(a, seg.offset_m + d));
  }
  const f = law(x);
  return { gap_m3s: Math.abs(fa + slope * (x - a) - f), allowed_m3s: Math.max(tol.relative * f, tol.absolute_m3s) };
}

/**
 * Table points of `rating` (no shift) from the gauge height of zero flow up to top_m (m), on a 1 mm grid:
 * every breakpoint, offset and gauged-range end is a point, and each interval is halved until the chord
 * stays within `tol` of the curve (or the interval is 1 mm: a law with exponent below 1, infinitely steep
 * at zero flow, is followed only from a few millimetres above it). Throws a RangeError when top_m is not above the
 * zero-flow stage.
 */
export function ratingConversionPoints(rating: Rating, top_m: number, tol: ConversionTolerance = DEFAULT_CONVERSION_TOLERANCE): ConversionPoint[] {
  const bottom = snap(zeroFlowStage_m(rating));
  const top = snap(top_m);
  if (!(top > bottom)) throw new RangeError(`A rating table needs a top stage above the stage of zero flow (${bottom} m); got ${top_m} m`);
  const knots = new Set<number>([bottom, top]);
  rating.segments.forEach((s, k) => {
    for (const h of [s.fromStage_m, s.offset_m]) if (h > bottom && h < top) knots.add(snap(h));
    // A rating that jumps at a breakpoint (not made continuous) gets the jump within the last millimetre.
    const h = snap(s.fromStage_m);
    if (k > 0 && h - GRID_M > bottom && h < top) {
      const below = rating.segments[k - 1];
      const left = h > below.offset_m ? below.coefficient * Math.pow(h - below.offset_m, below.exponent) : 0;
      if (Math.abs(left - dischargeAt(rating, h)) > Math.max(tol.relative * left, tol.absolute_m3s)) knots.add(snap(h - GRID_M));
    }
  });
  for (const h of rating.gaugedRange_m ?? []) if (h > bottom && h < top) knots.add(snap(h));
  const sorted = [...knots].sort((p, q) => p - q);
  const stages: number[] = [sorted[0]];
  const split = (a: number, b: number, depth: number): void => {
    const mid = snap((a + b) / 2);
    if (depth < 40 && mid > a && mid < b) {
      const { gap_m3s, allowed_m3s } = chordGap(rating, a, b, tol);
      if (gap_m3s > allowed_m3s) {
        split(a, mid, depth + 1);
        split(mid, b, depth + 1);
        return;
      }
    }
    stages.push(b);
  };
  for (let i = 1; i < sorted.length; i++) split(sorted[i - 1], sorted[i], 0);
  return stages.map((h) => {
    const stage_m = Number(h.toFixed(3));
    return { stage_m, discharge_m3s: dischargeAt(rating, stage_m), extrapolated: isExtrapolated(rating, stage_m) };
  });
}

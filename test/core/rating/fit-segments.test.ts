import { describe, expect, it } from 'vitest';
import { continuousCoefficient, dischargeAt, fitRating, fitSegments, type GaugingPoint, type Rating } from '../../../core/rating/index';
import { normalGenerator } from '../../support/noise';

// Invented two-segment rating: a riffle control up to 0.8 m, then the channel, joined at 0.8 m.
const low = { fromStage_m: 0.1, coefficient: 6, offset_m: 0.1, exponent: 2.2 };
const upperOffset = 0.35;
const upperExponent = 1.6;
const TRUE: Rating = {
  segments: [low, { fromStage_m: 0.8, coefficient: continuousCoefficient(low, upperOffset, upperExponent, 0.8), offset_m: upperOffset, exponent: upperExponent }],
};
const stages = [0.2, 0.25, 0.3, 0.37, 0.45, 0.52, 0.6, 0.7, 0.85, 0.95, 1.1, 1.3, 1.5, 1.8, 2.1];
const exact: GaugingPoint[] = stages.map((h) => ({ stage_m: h, discharge_m3s: dischargeAt(TRUE, h) }));

describe('fitSegments', () => {
  // exact: with no breakpoint it is fitRating itself
  it('is fitRating for one segment', () => {
    const noise = normalGenerator(7);
    const pts = exact.map((p) => ({ ...p, discharge_m3s: p.discharge_m3s * Math.exp(0.04 * noise()) }));
    const one = fitSegments(pts);
    const ref = fitRating(pts);
    expect(one.rating.segments).toEqual([ref.segment]);
    expect(one.standardError_pct).toBe(ref.standardError_pct);
    expect(one.deviations_pct).toEqual(ref.deviations_pct);
    const fixed = fitSegments(pts, { offset_m: 0.05 });
    expect(fixed.standardError_pct).toBe(fitRating(pts, { offset_m: 0.05 }).standardError_pct);
  });
  // exact: data on a two-segment power law are fitted with zero residual, so both segments come back
  it('recovers both segments of exact two-segment data', () => {
    const fit = fitSegments(exact, { breakpoint_m: 0.8 });
    const [a, b] = fit.rating.segments;
    expect(a.offset_m).toBeCloseTo(0.1, 5);
    expect(a.exponent).toBeCloseTo(2.2, 5);
    expect(b.fromStage_m).toBe(0.8);
    expect(b.offset_m).toBeCloseTo(upperOffset, 5);
    expect(b.exponent).toBeCloseTo(upperExponent, 5);
    expect(fit.standardError_pct).toBeLessThan(1e-4);
    expect(fit.degreesOfFreedom).toBe(stages.length - 6);
    expect(fit.rating.gaugedRange_m).toEqual([0.2, 2.1]);
  });
  // exact: S_e = √(Σ ln² (Q/Q̂) / (n − p)) recomputed by hand from the returned rating, p = 3 + 2 when joined
  it('joins the upper segment at the breakpoint and counts one parameter fewer', () => {
    const noise = normalGenerator(11);
    const pts = exact.map((p) => ({ ...p, discharge_m3s: p.discharge_m3s * Math.exp(0.03 * noise()) }));
    const fit = fitSegments(pts, { breakpoint_m: 0.8, join: true });
    const [a, b] = fit.rating.segments;
    expect(b.coefficient * (0.8 - b.offset_m) ** b.exponent).toBeCloseTo(a.coefficient * (0.8 - a.offset_m) ** a.exponent, 10);
    const sse = pts.reduce((s, p) => s + Math.log(p.discharge_m3s / dischargeAt(fit.rating, p.stage_m)) ** 2, 0);
    expect(fit.degreesOfFreedom).toBe(pts.length - 5);
    expect(fit.standardError_pct).toBeCloseTo(100 * Math.sqrt(sse / (pts.length - 5)), 10);
    expect(fit.deviations_pct[3]).toBeCloseTo(100 * (pts[3].discharge_m3s / dischargeAt(fit.rating, pts[3].stage_m) - 1), 10);
    expect(fit.warnings.some((w) => /jumps/.test(w))).toBe(false);
  });
  it('names the side that has too few gaugings', () => {
    expect(() => fitSegments(exact, { breakpoint_m: 1.6 })).toThrow(/upper segment \(gaugings at or above the breakpoint 1\.6 m\): fitRating needs at least 3 distinct stages; got 2/);
    expect(() => fitSegments(exact, { breakpoint_m: 0.26 })).toThrow(/lower segment/);
  });
  it('names an outlying gauging by its place in the list given, not within its segment', () => {
    // 8 gaugings below the breakpoint, 14 above; the 16th (index 15, 7th of the upper part) is 30 % high
    const many = [0.2, 0.25, 0.3, 0.37, 0.45, 0.52, 0.6, 0.7, ...Array.from({ length: 14 }, (_, k) => 0.85 + 0.1 * k)];
    const pts = many.map((h, i) => ({ stage_m: h, discharge_m3s: dischargeAt(TRUE, h) * (i === 15 ? 1.3 : 1 + 0.01 * Math.sin(i)) }));
    const fit = fitSegments(pts, { breakpoint_m: 0.8 });
    expect(fit.warnings.filter((w) => /index/.test(w))).toEqual([expect.stringMatching(/^Upper segment: The gauging at index 15 \(stage 1\.550 m/)]);
  });
});

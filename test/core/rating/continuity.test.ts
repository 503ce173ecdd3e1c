import { describe, expect, it } from 'vitest';
import { continuousCoefficient, dischargeAt, ratingContinuity, type Rating, type RatingSegment } from '../../../core/rating/index';

const lower: RatingSegment = { fromStage_m: 0.1, coefficient: 6, offset_m: 0.1, exponent: 1.6 };

function withUpper(coefficient: number): Rating {
  return { segments: [lower, { fromStage_m: 1.2, coefficient, offset_m: 0.5, exponent: 2.2 }] };
}

describe('ratingContinuity', () => {
  // DOMAIN.md §2: C2 = C1·(h_b − e1)^b1 / (h_b − e2)^b2 makes the segments meet
  it('finds no jump with the continuity coefficient', () => {
    const c2 = continuousCoefficient(lower, 0.5, 2.2, 1.2);
    expect(c2).toBeCloseTo((6 * 1.1 ** 1.6) / 0.7 ** 2.2, 12);
    const r = withUpper(c2);
    expect(dischargeAt(r, 1.2)).toBeCloseTo(dischargeAt(r, 1.2 - 1e-12), 9);
    const check = ratingContinuity(r);
    expect(check.warnings).toEqual([]);
    expect(Math.abs(check.breakpoints[0].jump_pct)).toBeLessThan(1e-10);
  });
  // issue 3: warn on a jump of more than 1 % at a breakpoint
  it('warns on a 2 % jump, not on a 0.5 % one', () => {
    const c2 = continuousCoefficient(lower, 0.5, 2.2, 1.2);
    const up = ratingContinuity(withUpper(c2 * 1.02));
    expect(up.breakpoints[0].jump_pct).toBeCloseTo(2, 10);
    expect(up.warnings).toHaveLength(1);
    expect(up.warnings[0]).toMatch(/breakpoint 1.2 m.*jumps by 2.00 %/);
    const down = ratingContinuity(withUpper(c2 * 0.98));
    expect(down.warnings[0]).toMatch(/jumps by -2.00 %/);
    expect(ratingContinuity(withUpper(c2 * 1.005)).warnings).toEqual([]);
  });
  // exact: a lower segment with its offset above the breakpoint gives no flow there
  it('warns when the lower segment gives no flow at the breakpoint', () => {
    const r: Rating = {
      segments: [
        { fromStage_m: 0, coefficient: 6, offset_m: 1.5, exponent: 1.6 },
        { fromStage_m: 1.2, coefficient: 5, offset_m: 0.5, exponent: 2 },
      ],
    };
    expect(ratingContinuity(r).warnings[0]).toMatch(/segment 0 gives no flow/);
  });
  it('refuses a breakpoint at or below an offset', () => {
    expect(() => continuousCoefficient(lower, 1.3, 2, 1.2)).toThrow(RangeError);
    expect(() => continuousCoefficient(lower, 1.3, 2, 1.2)).toThrow(/breakpoint above both offsets/);
    expect(() => continuousCoefficient(lower, 0.5, 0, 1.2)).toThrow(/exponent > 0; got 0/);
  });
});

import { describe, expect, it } from 'vitest';
import { dischargeAt, isExtrapolated, stageAt, zeroFlowStage_m, type Rating } from '../../../core/rating/index';

// Two segments meeting continuously at 1.0 m: C2 = 8·(1.0 − 0.2)^1.5 / (1.0 − 0.4)^2 (DOMAIN.md §2 formula).
const lower = { fromStage_m: 0.2, coefficient: 8, offset_m: 0.2, exponent: 1.5 };
const c2 = (8 * 0.8 ** 1.5) / 0.6 ** 2;
const twoSegments: Rating = {
  segments: [lower, { fromStage_m: 1.0, coefficient: c2, offset_m: 0.4, exponent: 2 }],
  gaugedRange_m: [0.3, 2.0],
};

describe('dischargeAt', () => {
  // exact: Q = C·(h − e)^b with numbers that are exact in binary
  it('evaluates one segment', () => {
    const r: Rating = { segments: [{ fromStage_m: 0.5, coefficient: 10, offset_m: 0.5, exponent: 2 }] };
    expect(dischargeAt(r, 1.5)).toBe(10);
    expect(dischargeAt(r, 2.5)).toBe(40);
    expect(dischargeAt(r, 0.75)).toBe(0.625);
  });
  // exact: Q = 0 at or below the offset (DOMAIN.md §2)
  it('is zero at and below the offset', () => {
    const r: Rating = { segments: [{ fromStage_m: 1, coefficient: 10, offset_m: 0.5, exponent: 2 }] };
    expect(dischargeAt(r, 0.5)).toBe(0);
    expect(dischargeAt(r, -3)).toBe(0);
    // the first segment also applies below its breakpoint, down to its offset
    expect(dischargeAt(r, 0.75)).toBe(0.625);
  });
  // exact: a shift s evaluates the rating at h + s (DOMAIN.md §2)
  it('applies the shift to the stage', () => {
    const r: Rating = { segments: [{ fromStage_m: 0, coefficient: 10, offset_m: 0.5, exponent: 2 }] };
    expect(dischargeAt(r, 1.25, 0.25)).toBe(10);
    expect(dischargeAt(r, 1.75, -0.25)).toBe(10);
    expect(dischargeAt(r, 0.6, -0.25)).toBe(0);
  });
  // exact: each segment from its breakpoint upward
  it('chooses the segment by stage in a multi-segment rating', () => {
    expect(dischargeAt(twoSegments, 0.6)).toBeCloseTo(8 * 0.4 ** 1.5, 14);
    expect(dischargeAt(twoSegments, 0.999)).toBeCloseTo(8 * 0.799 ** 1.5, 13);
    expect(dischargeAt(twoSegments, 1.0)).toBeCloseTo(c2 * 0.6 ** 2, 13);
    expect(dischargeAt(twoSegments, 1.8)).toBeCloseTo(c2 * 1.4 ** 2, 12);
    expect(dischargeAt(twoSegments, 0.1)).toBe(0);
  });
  // exact: the segment is chosen at the shifted stage, so a shift crossing a breakpoint uses the upper one
  it('chooses the segment at the shifted stage', () => {
    expect(dischargeAt(twoSegments, 0.9, 0.3)).toBeCloseTo(c2 * 0.8 ** 2, 13);
  });
});

describe('zero-flow stage and extrapolation', () => {
  // exact: the zero-flow stage is the first segment's offset
  it('zeroFlowStage_m', () => {
    expect(zeroFlowStage_m(twoSegments)).toBe(0.2);
    expect(stageAt(twoSegments, 0)).toBe(0.2);
  });
  // DOMAIN.md §2: outside the gauged range is extrapolated
  it('isExtrapolated', () => {
    expect(isExtrapolated(twoSegments, 0.29)).toBe(true);
    expect(isExtrapolated(twoSegments, 0.3)).toBe(false);
    expect(isExtrapolated(twoSegments, 2.0)).toBe(false);
    expect(isExtrapolated(twoSegments, 2.01)).toBe(true);
    expect(isExtrapolated({ segments: [lower] }, 50)).toBe(false);
  });
});

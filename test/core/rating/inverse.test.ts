import { describe, expect, it } from 'vitest';
import { dischargeAt, stageAt, type Rating } from '../../../core/rating/index';

describe('stageAt', () => {
  // exact: h = e + (Q/C)^(1/b)
  it('inverts one segment', () => {
    const r: Rating = { segments: [{ fromStage_m: 0.5, coefficient: 10, offset_m: 0.5, exponent: 2 }] };
    expect(stageAt(r, 40)).toBe(2.5);
    expect(stageAt(r, 10)).toBe(1.5);
    expect(stageAt(r, 10, 0.25)).toBe(1.25);
    expect(stageAt(r, 0)).toBe(0.5);
    expect(stageAt(r, 0, 0.1)).toBeCloseTo(0.4, 15);
  });
  // exact: inverse of each segment of a two-segment rating
  it('inverts each segment of a multi-segment rating', () => {
    const r: Rating = {
      segments: [
        { fromStage_m: 0, coefficient: 4, offset_m: 0, exponent: 2 },
        { fromStage_m: 1, coefficient: 4, offset_m: 0, exponent: 3 },
      ],
    };
    expect(stageAt(r, 1)).toBe(0.5);
    expect(stageAt(r, 32)).toBe(2);
    expect(dischargeAt(r, stageAt(r, 3.99))).toBeCloseTo(3.99, 12);
  });
  // exact: in an upward jump at a breakpoint the lowest stage reaching Q is the breakpoint
  it('returns the breakpoint for a discharge inside an upward jump', () => {
    const r: Rating = {
      segments: [
        { fromStage_m: 0, coefficient: 4, offset_m: 0, exponent: 2 },
        { fromStage_m: 1, coefficient: 5, offset_m: 0, exponent: 2 },
      ],
    };
    expect(stageAt(r, 4.5)).toBe(1);
    expect(stageAt(r, 4.5, 0.25)).toBe(0.75);
    expect(stageAt(r, 20)).toBe(2);
  });
});

import { describe, expect, it } from 'vitest';
import { dischargeAt, dischargeThrough, type Rating } from '../../../core/rating/index';

describe('dischargeAt refuses a stage whose discharge overflows (issue 12, #8)', () => {
  const one: Rating = { segments: [{ fromStage_m: 0, coefficient: 12, offset_m: 0.2, exponent: 1.6 }] };
  const two: Rating = {
    segments: [
      { fromStage_m: 0, coefficient: 12, offset_m: 0.2, exponent: 1.6 },
      { fromStage_m: 1, coefficient: 12 * 0.8 ** 1.6 / 0.9 ** 2, offset_m: 0.1, exponent: 2 },
    ],
  };
  for (const [name, rating] of [['one segment', one], ['two segments', two]] as const) {
    it(`${name}: 1e200 m is refused with a sentence, never Infinity`, () => {
      // exact: 12·(1e200)^1.6 = 1.2e321 > Number.MAX_VALUE ≈ 1.8e308 (IEEE 754 binary64)
      expect(() => dischargeAt(rating, 1e200)).toThrow(RangeError);
      expect(() => dischargeAt(rating, 1e200)).toThrow(/too large to represent/);
      // a large but representable stage still gives its discharge: 12·(1e100 − 0.2)^1.6 ≈ 12e160 (one segment)
      expect(Number.isFinite(dischargeAt(rating, 1e100))).toBe(true);
    });
  }
  it('the one-segment value just below the overflow is exact: Q = C·(h − e)^b', () => {
    expect(dischargeAt(one, 1.2)).toBeCloseTo(12, 12); // exact: 12·1^1.6
  });
  it('dischargeThrough, the discharge of a stage at a time, refuses it too', () => {
    const dated = { ...one, id: 'r1', validFrom_ms: 0, shifts: [] };
    expect(() => dischargeThrough([dated], [1000], [1e200])).toThrow(/too large to represent/);
    // exact: 12·(1.2 − 0.2)^1.6 = 12
    expect(dischargeThrough([dated], [1000], [1.2]).discharge_m3s[0]).toBeCloseTo(12, 12);
  });
});

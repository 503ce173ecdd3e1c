import { describe, expect, it } from 'vitest';
import { fitRating, johnsonOffset, johnsonOffsetOf } from '../../../core/rating/index';

describe("Johnson's three-point offset", () => {
  // exact: on Q = (h − 0.3)², Q = 1, 16, 4 at G = 1.3, 4.3, 2.3 and 4 = √(1·16), so
  // e = (1.3·4.3 − 2.3²)/(1.3 + 4.3 − 2·2.3) = 0.3 (Rantz et al. 1982 formula, from memory)
  it('formula on three stages', () => {
    expect(johnsonOffsetOf(1.3, 4.3, 2.3)).toBeCloseTo(0.3, 14);
  });
  // exact: with discharges in geometric progression the middle gauging is at √(Q1·Q2), so on exact
  // power-law data the estimate is the true offset
  it('equals the true offset on exact power-law data', () => {
    const e = 0.62;
    const points = Array.from({ length: 9 }, (_, k) => {
      const q = 0.4 * 1.9 ** k;
      return { stage_m: e + (q / 7.5) ** (1 / 2.1), discharge_m3s: q };
    });
    expect(johnsonOffset(points)).toBeCloseTo(e, 10);
    // the order of the gaugings does not matter
    expect(johnsonOffset([...points].reverse())).toBeCloseTo(e, 10);
    // fitRating reports it as a cross-check
    expect(fitRating(points).johnsonOffset_m).toBeCloseTo(e, 10);
  });
  it('refuses evenly spaced stages and unusable gaugings', () => {
    expect(() => johnsonOffsetOf(1, 3, 2)).toThrow(RangeError);
    expect(() => johnsonOffsetOf(1, 3, 2)).toThrow(/undetermined/);
    expect(() => johnsonOffsetOf(1, Number.NaN, 2)).toThrow(/finite G2 stage; got NaN/);
    const linear = [1, 2, 3, 4].map((h) => ({ stage_m: h, discharge_m3s: Math.exp(h) }));
    expect(() => johnsonOffset(linear)).toThrow(/undetermined/);
    expect(() => johnsonOffset(linear.slice(0, 2))).toThrow(/at least 3 gaugings; got 2/);
    expect(() => johnsonOffset([{ stage_m: 1, discharge_m3s: Number.NaN }])).toThrow(/finite discharge_m3s at index 0; got NaN/);
    // exact: G3 = 2 + (ln √10 − ln 1.1)/(ln 10 − ln 1.1) ≈ 2.478 gives e ≈ 3.28, above every gauging
    const flatThenSteep = [
      { stage_m: 1, discharge_m3s: 1 },
      { stage_m: 2, discharge_m3s: 1.1 },
      { stage_m: 3, discharge_m3s: 10 },
    ];
    expect(() => johnsonOffset(flatThenSteep)).toThrow(/gives 3\.2\d* m, not below the lowest gauged stage 1 m/);
  });
});

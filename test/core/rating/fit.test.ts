import { describe, expect, it } from 'vitest';
import { FIT_ADVISED_GAUGINGS, fitRating, type GaugingPoint } from '../../../core/rating/index';
import { normalGenerator } from '../../support/noise';

// Invented site: a gravel-bar control, Q = 12.5·(h − 0.35)^1.8.
const TRUE = { coefficient: 12.5, offset_m: 0.35, exponent: 1.8 };
function exact(stages: number[], t = TRUE): GaugingPoint[] {
  return stages.map((h) => ({ stage_m: h, discharge_m3s: t.coefficient * (h - t.offset_m) ** t.exponent }));
}
const stages14 = Array.from({ length: 14 }, (_, k) => 0.45 + 0.16 * k);

describe('fitRating on exact power-law data', () => {
  // exact: data on Q = C·(h − e)^b are fitted with zero residual, so C, e, b are recovered
  it('recovers C, e and b with a fitted offset', () => {
    const fit = fitRating(exact(stages14));
    expect(Math.abs(fit.segment.offset_m / TRUE.offset_m - 1)).toBeLessThan(1e-6);
    expect(Math.abs(fit.segment.coefficient / TRUE.coefficient - 1)).toBeLessThan(1e-6);
    expect(Math.abs(fit.segment.exponent / TRUE.exponent - 1)).toBeLessThan(1e-6);
    expect(fit.segment.fromStage_m).toBe(fit.segment.offset_m);
    expect(fit.standardError_pct).toBeLessThan(1e-5);
    expect(fit.deviations_pct.every((d) => Math.abs(d) < 1e-5)).toBe(true);
    expect(fit.warnings).toEqual([]);
    expect(fit.offsetFitted).toBe(true);
    expect(fit.degreesOfFreedom).toBe(11);
    expect(fit.gaugedRange_m[0]).toBe(0.45);
    expect(fit.gaugedRange_m[1]).toBeCloseTo(2.53, 14);
  });
  // exact: with the true offset fixed the log-space regression is exact
  it('recovers C and b with a fixed offset', () => {
    const fit = fitRating(exact(stages14), { offset_m: 0.35 });
    expect(fit.segment.offset_m).toBe(0.35);
    expect(fit.segment.coefficient).toBeCloseTo(12.5, 10);
    expect(fit.segment.exponent).toBeCloseTo(1.8, 12);
    expect(fit.offsetFitted).toBe(false);
    expect(fit.degreesOfFreedom).toBe(12);
  });
  // exact: a narrow-range example where the offset lies 4 spans below the lowest gauging
  it('recovers an offset far below the gaugings', () => {
    const t = { coefficient: 3, offset_m: -1, exponent: 2.4 };
    const fit = fitRating(exact([1.0, 1.1, 1.2, 1.3, 1.4, 1.5], t));
    expect(Math.abs(fit.segment.offset_m - t.offset_m)).toBeLessThan(1e-6);
    expect(Math.abs(fit.segment.exponent / t.exponent - 1)).toBeLessThan(1e-6);
  });
});

describe('fitRating statistics', () => {
  // exact: with residuals r = (+δ, −δ, −δ, +δ) orthogonal to 1 and x = ln(h − e) = (0, 1, 2, 3), least
  // squares returns the generating line, S_e = √(4δ²/(4 − 2)) and each deviation is 100·(e^r − 1).
  it('standard error with n − 2 degrees of freedom and deviations for a fixed offset', () => {
    const e = 0.2;
    const delta = 0.05;
    const r = [delta, -delta, -delta, delta];
    const points = [0, 1, 2, 3].map((x, i) => ({ stage_m: e + Math.exp(x), discharge_m3s: Math.exp(Math.log(4) + 1.5 * x + r[i]) }));
    const fit = fitRating(points, { offset_m: e });
    expect(fit.segment.coefficient).toBeCloseTo(4, 12);
    expect(fit.segment.exponent).toBeCloseTo(1.5, 12);
    expect(fit.standardError_pct).toBeCloseTo(100 * delta * Math.SQRT2, 10);
    fit.deviations_pct.forEach((d, i) => expect(d).toBeCloseTo(100 * Math.expm1(r[i]), 10));
  });
});

describe('fitRating warnings', () => {
  // ISO 18320 guidance, from memory: at least 12 gaugings
  it('warns below 12 gaugings', () => {
    const fit = fitRating(exact([0.5, 0.8, 1.1, 1.4, 1.7, 2.0, 2.3, 2.6]));
    expect(FIT_ADVISED_GAUGINGS).toBe(12);
    expect(fit.warnings).toEqual([expect.stringMatching(/^Only 8 gaugings; at least 12/)]);
  });
  // Rantz et al. 1982, from memory: exponents usually 1.3–3.0
  it('warns on an exponent outside 1.3–3.0', () => {
    const steep = fitRating(exact(stages14, { coefficient: 2, offset_m: 0.35, exponent: 3.5 }), { offset_m: 0.35 });
    expect(steep.warnings).toEqual([expect.stringMatching(/exponent 3\.50 is outside the usual range 1\.3–3\.0/)]);
    const flat = fitRating(exact(stages14, { coefficient: 2, offset_m: 0.35, exponent: 1.1 }), { offset_m: 0.35 });
    expect(flat.warnings).toEqual([expect.stringMatching(/exponent 1\.10 is outside/)]);
  });
  // issue 3: a gauging more than 2 standard errors off is named by index and stage
  it('names a gauging that deviates by more than 2 standard errors', () => {
    const z = normalGenerator(41);
    const points = exact(stages14).map((p) => ({ ...p, discharge_m3s: p.discharge_m3s * Math.exp(0.02 * z()) }));
    points[6] = { ...points[6], discharge_m3s: points[6].discharge_m3s * 1.3 };
    const fit = fitRating(points);
    const named = fit.warnings.filter((w) => /more than 2 standard errors/.test(w));
    expect(named).toEqual([expect.stringMatching(/index 6 \(stage 1\.410 m, .* deviates by \+\d+\.\d %/)]);
    expect(fit.deviations_pct[6]).toBeGreaterThan(2 * fit.standardError_pct);
  });
  // exact: exponential data Q = e^(2h) is the limit e → −∞ of the power law, so the search hits its bottom
  it('warns when the offset ends at the bottom of its bracket', () => {
    const points = Array.from({ length: 15 }, (_, k) => ({ stage_m: 1 + 0.1 * k, discharge_m3s: Math.exp(2 * (1 + 0.1 * k)) }));
    expect(fitRating(points).warnings).toContainEqual(expect.stringMatching(/offset ended at the bottom of its search range/));
  });
  // exact: a lowest gauging with almost no flow pulls the offset up against the lowest stage
  it('warns when the offset ends just below the lowest gauging', () => {
    const points = Array.from({ length: 14 }, (_, k) => {
      const h = 0.5 + 0.1 * k;
      return { stage_m: h, discharge_m3s: k === 0 ? 1e-9 : 3 * (h - 0.4) ** 2 };
    });
    expect(fitRating(points).warnings).toContainEqual(expect.stringMatching(/offset ended at the top of its search range.*0\.5 m/));
  });
});

describe('fitRating bad input', () => {
  const good = exact(stages14);
  const cases: [string, () => unknown, RegExp][] = [
    ['two distinct stages', () => fitRating(exact([1, 1, 2, 2, 2])), /at least 3 distinct stages; got 2/],
    ['three gaugings with a fitted offset', () => fitRating(exact([1, 2, 3])), /at least 4 gaugings .* offset .*got 3/],
    ['two gaugings with a fixed offset', () => fitRating(exact([1, 2]), { offset_m: 0 }), /at least 3 distinct stages; got 2/],
    ['NaN stage', () => fitRating([...good.slice(0, 5), { stage_m: Number.NaN, discharge_m3s: 1 }]), /finite stage_m at index 5; got NaN/],
    ['infinite discharge', () => fitRating([{ stage_m: 1, discharge_m3s: Infinity }, ...good]), /finite discharge_m3s at index 0; got Infinity/],
    ['zero discharge', () => fitRating([...good, { stage_m: 0.3, discharge_m3s: 0 }]), /discharges > 0 .*index 14 has 0/],
    ['negative discharge', () => fitRating([...good, { stage_m: 3, discharge_m3s: -2 }]), /discharges > 0 .*index 14 has -2/],
    ['offset at the lowest stage', () => fitRating(good, { offset_m: 0.45 }), /offset_m below the lowest gauged stage 0.45 m; got 0.45/],
    ['NaN offset', () => fitRating(good, { offset_m: Number.NaN }), /finite offset_m; got NaN/],
    ['falling discharge', () => fitRating(good.map((p) => ({ ...p, discharge_m3s: 1 / p.discharge_m3s })), { offset_m: 0 }), /discharge rises with stage.*exponent is -/],
    ['not an array', () => fitRating(undefined as unknown as GaugingPoint[]), /array of gaugings/],
  ];
  it.each(cases)('%s', (_name, call, message) => {
    expect(call).toThrow(RangeError);
    expect(call).toThrow(message);
  });
});

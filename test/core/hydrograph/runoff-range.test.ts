import { describe, expect, it } from 'vitest';
import { erf } from 'mathjs';
import { extrapolatedShare, roundDown, roundUp, runoffRange } from '../../../core/hydrograph/index';

/** Standard normal CDF from mathjs's erf (test-only oracle): Φ(z) = (1 + erf(z/√2))/2. */
const phi = (z: number) => (1 + erf(z / Math.SQRT2)) / 2;

describe('the runoff range (DOMAIN.md §5)', () => {
  // Log-normal propagation: with ln Q ~ N(ln Q̂, σ²), σ = S_e/100, the ±1σ ends are Q̂·exp(±σ), which hold
  // Φ(1) − Φ(−1) ≈ 68.27 % (checked with mathjs's erf); not 1 ± S_e/100 (issue 20: 10 % showed as 9.1 % low).
  it('lays the rating band in log space', () => {
    const r = runoffRange({ volume_m3: 100_000, standardError_pct: 10 });
    const sigma = 0.1;
    const pLow = phi(Math.log(r.rating.lowFactor) / sigma);
    const pHigh = phi(Math.log(r.rating.highFactor) / sigma);
    expect(pLow).toBeCloseTo(phi(-1), 12);
    expect(pHigh - pLow).toBeCloseTo(0.6827, 4); // the 68 % of the normal table (any statistics handbook)
    expect(r.exact.low_m3).toBeCloseTo(100_000 * Math.exp(-0.1), 6); // 90,484, i.e. 9.5 % low
    expect(r.exact.high_m3).toBeCloseTo(100_000 * Math.exp(0.1), 6);
    const two = runoffRange({ volume_m3: 100_000, standardError_pct: 10, band: 2 });
    expect(phi(Math.log(two.rating.highFactor) / sigma) - phi(Math.log(two.rating.lowFactor) / sigma)).toBeCloseTo(0.9545, 4);
    expect(two.sentences[0]).toMatch(/±2 standard errors \(about 95 % of errors\)/);
  });

  // Issue 20: 24,600–34,400 was shown as 25,000–34,000 (rounded inward); the ends round outward.
  it('rounds the ends outward', () => {
    expect(roundDown(24_600)).toBe(24_000);
    expect(roundUp(34_400)).toBe(35_000);
    expect(roundDown(24_000)).toBe(24_000);
    expect(roundUp(0.01234)).toBe(0.013);
    const r = runoffRange({ volume_m3: 29_000, methods: [{ name: 'A', volume_m3: 24_600 * Math.exp(0.05) }, { name: 'B', volume_m3: 34_400 * Math.exp(-0.05) }], standardError_pct: 5 });
    expect(r.exact.low_m3).toBeCloseTo(24_600, 6);
    expect(r.exact.high_m3).toBeCloseTo(34_400, 6);
    expect([r.low_m3, r.high_m3]).toEqual([24_000, 35_000]);
  });

  it('keeps unsuited methods out of the spread and says why', () => {
    const r = runoffRange({
      volume_m3: 24_000,
      standardError_pct: 4,
      methods: [
        { name: 'Straight line', volume_m3: 23_000 },
        { name: 'Lyne–Hollick', volume_m3: 48_000, leftOut: 'its α is set for daily flows.' },
        { name: 'Local minimum' },
      ],
    });
    expect(r.methods).toMatchObject({ low_m3: 23_000, high_m3: 24_000, used: ['Straight line'] });
    expect(r.methods.leftOut.map((l) => l.name)).toEqual(['Lyne–Hollick', 'Local minimum']);
    expect(r.sentences).toContain('Lyne–Hollick is left out: its α is set for daily flows.');
    expect(r.exact.high_m3).toBeCloseTo(24_000 * Math.exp(0.04), 6);
  });

  // Our rule (DOMAIN.md §5): the band doubled for the share of the volume beyond the gauged range.
  it('widens for extrapolated discharges and for the key points, and states a default S_e', () => {
    const r = runoffRange({ volume_m3: 10_000, extrapolatedShare: 0.25, keyPointVolumes_m3: [9_000, 11_000] });
    expect(r.rating.isDefault).toBe(true);
    expect(r.sentences.join(' ')).toMatch(/no fit statistics, so a standard error of 10 % is assumed/);
    expect(r.sentences.join(' ')).toMatch(/25 % of the volume comes from discharges beyond the gauged range/);
    expect(r.exact.high_m3).toBeCloseTo(11_000 * (0.75 * Math.exp(0.1) + 0.25 * Math.exp(0.2)), 6);
    expect(r.exact.low_m3).toBeCloseTo(9_000 * (0.75 * Math.exp(-0.1) + 0.25 * Math.exp(-0.2)), 6);
    expect(() => runoffRange({ volume_m3: 1, standardError_pct: -1 })).toThrow(/standard error as 0 % or more; got -1/);
  });

  // exact: a triangle of direct runoff over 0–4 h, flagged on the last hour: share = area of 3–4 h / total
  it('measures the extrapolated share of the direct volume by trapezoids', () => {
    const t = [0, 1, 2, 3, 4].map((h) => h * 3_600_000);
    const q = [1, 3, 5, 3, 1];
    const b = [1, 1, 1, 1, 1];
    expect(extrapolatedShare(t, q, b, [0, 0, 0, 0, 1])).toBeCloseTo(1 / 8, 12);
    expect(extrapolatedShare(t, q, b, [0, 0, 0, 0, 0])).toBe(0);
  });
});

import { describe, expect, it } from 'vitest';
import { findEventPoints, findInflection, findInflectionDetailed, inflectionByNewtonPolynomial } from '../../../core/hydrograph/index';
import { gammaSeries, H, T0 } from '../../support/hydrograph-series';

// Exact, derived: for f(x) = x^n·e^{−n·x} (x = t/t_p), f' = f·n(1/x − 1) and
// f'' = f·[n²(1/x − 1)² − n/x²], which is zero where |1 − x| = 1/√n; on the falling limb (x > 1)
// the inflection is at t = t_p·(1 + 1/√n). A constant base Q_b does not move it.
const cases = [
  { n: 4, tp: 6, step: 0.25 },
  { n: 3, tp: 10, step: 0.5 },
  { n: 9, tp: 5, step: 0.1 },
  { n: 4, tp: 6, step: 1 },
];

describe('smooth-fit inflection on the analytic hydrograph', () => {
  for (const { n, tp, step } of cases) {
    it(`n = ${n}, t_p = ${tp} h, step ${step} h: within a tenth of a step of t_p(1 + 1/√n)`, () => {
      const s = gammaSeries(2, 30, tp, n, step, 60);
      const exact = tp * (1 + 1 / Math.sqrt(n)); // exact, derived
      const found = (findInflection(s, T0 + tp * H, T0 + 60 * H) - T0) / H;
      expect(Math.abs(found - exact)).toBeLessThan(0.1 * step);
    });
  }

  it('reports the bracket that holds the root', () => {
    const s = gammaSeries(2, 30, 6, 4, 0.25, 60);
    const r = findInflectionDetailed(s, T0 + 6 * H, T0 + 60 * H);
    expect(r.bracket_ms).not.toBeNull();
    const [a, b] = r.bracket_ms!;
    expect(a).toBeLessThanOrEqual(r.inflection_ms);
    expect(b).toBeGreaterThanOrEqual(r.inflection_ms);
    expect(b - a).toBeLessThanOrEqual(0.25 * H);
  });

  it('stays near the exact point with ±1 % noise on every reading', () => {
    // exact, derived (as above); the noise is a fixed deterministic pattern, invented
    const s = gammaSeries(2, 30, 6, 4, 0.25, 60);
    const q = s.discharge_m3s as Float64Array;
    for (let i = 0; i < q.length; i++) q[i] *= 1 + 0.01 * Math.sin(i * 2.399963);
    const found = (findInflection(s, T0 + 6 * H, T0 + 60 * H) - T0) / H;
    expect(Math.abs(found - 9)).toBeLessThan(0.5);
  });

  it('findEventPoints puts its inflection at the exact point too', () => {
    const s = gammaSeries(2, 30, 6, 4, 0.25, 60);
    const p = findEventPoints(s);
    expect(Math.abs((p.inflection_ms - T0) / H - 9)).toBeLessThan(0.025); // exact, derived
  });
});

describe('Newton forward-difference polynomial with safeguarded Newton–Raphson', () => {
  for (const { n, tp, step } of cases) {
    it(`n = ${n}, t_p = ${tp} h: 7 nodes from the peak to t_p(1 + 2/√n) find t_p(1 + 1/√n)`, () => {
      const s = gammaSeries(2, 30, tp, n, step, 60);
      const exact = tp * (1 + 1 / Math.sqrt(n)); // exact, derived
      const to = tp * (1 + 2 / Math.sqrt(n));
      const r = inflectionByNewtonPolynomial(s, T0 + tp * H, T0 + to * H);
      const spacing = (to - tp) / 6;
      expect(r.converged).toBe(true);
      expect(Math.abs((r.inflection_ms - T0) / H - exact)).toBeLessThan(0.01 * spacing);
      expect(r.nodes_ms.length).toBe(7);
    });
  }
});

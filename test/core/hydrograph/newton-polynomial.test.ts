import { describe, expect, it } from 'vitest';
import { derivative, evaluate, lusolve, polynomialRoot, type Complex } from 'mathjs';
import { forwardDifferences, inflectionByNewtonPolynomial, newtonToPower } from '../../../core/hydrograph/index';
import { fromHours, gammaSeries, H, T0 } from '../../support/hydrograph-series';

describe('forward differences and the Newton polynomial', () => {
  it('Δ³ of a cubic is 6·a₃·h³ and Δ⁴ is 0', () => {
    // exact: the k-th forward difference of a degree-k polynomial a_k·x^k + … with step h is k!·a_k·h^k
    const y = [0, 1, 2, 3, 4].map((j) => 2 * (0.5 * j) ** 3 - (0.5 * j) ** 2 + 3);
    const d = forwardDifferences(y);
    expect(d[0]).toBe(3);
    expect(d[3]).toBeCloseTo(6 * 2 * 0.125, 12);
    expect(d[4]).toBeCloseTo(0, 12);
  });

  it('power coefficients match the interpolating polynomial solved by mathjs (test-only oracle)', () => {
    const y = [4, 9, 7.5, 6, 3.2, 2.9];
    const c = newtonToPower(forwardDifferences(y));
    const vandermonde = y.map((_, i) => y.map((__, j) => i ** j));
    const oracle = (lusolve(vandermonde, y.map((v) => [v])) as number[][]).map((r) => r[0]);
    for (let j = 0; j < y.length; j++) expect(c[j]).toBeCloseTo(oracle[j], 9);
  });
});

describe('inflection by Newton–Raphson on P″, checked with mathjs', () => {
  // Invented falling limb, 6 readings hourly: the degree-5 polynomial has a cubic P″ whose real roots
  // mathjs.polynomialRoot gives in closed form.
  const hours = [0, 1, 2, 3, 4, 5];
  const q = [40, 37, 28, 17, 10, 8];
  const series = fromHours(hours, q);

  it('the root equals a real root of P″ from mathjs.polynomialRoot', () => {
    const r = inflectionByNewtonPolynomial(series, T0, T0 + 5 * H, { nodes: 6 });
    const c = r.coefficients;
    const roots = polynomialRoot(2 * c[2], 6 * c[3], 12 * c[4], 20 * c[5]) as (number | Complex)[];
    const real = roots
      .map((x) => (typeof x === 'number' ? x : Math.abs(x.im) < 1e-9 ? x.re : NaN))
      .filter((x) => Number.isFinite(x));
    const nearest = real.reduce((a, b) => (Math.abs(b - r.root_s) < Math.abs(a - r.root_s) ? b : a));
    expect(r.root_s).toBeCloseTo(nearest, 9);
    expect(r.inflection_ms).toBeCloseTo(T0 + r.root_s * H, 0);
    expect(r.converged).toBe(true);
  });

  it('P″ changes sign from − to + at the root (mathjs symbolic derivative)', () => {
    const r = inflectionByNewtonPolynomial(series, T0, T0 + 5 * H, { nodes: 6 });
    const expr = Array.from(r.coefficients, (cj, j) => `(${cj}) * s^${j}`).join(' + ');
    const second = derivative(derivative(expr, 's'), 's');
    const at = (s: number) => second.evaluate({ s }) as number;
    expect(Math.abs(at(r.root_s))).toBeLessThan(1e-9);
    expect(at(r.root_s - 0.05)).toBeLessThan(0);
    expect(at(r.root_s + 0.05)).toBeGreaterThan(0);
    // the polynomial passes through every node (mathjs evaluates the same expression)
    for (let j = 0; j < hours.length; j++) expect(evaluate(expr, { s: j }) as number).toBeCloseTo(q[j], 9);
  });

  it('picks the − to + change where the fall is steepest when P″ has several', () => {
    const s = gammaSeries(2, 30, 6, 4, 0.5, 40);
    const r = inflectionByNewtonPolynomial(s, T0 + 4 * H, T0 + 16 * H, { nodes: 9 });
    expect(Math.abs((r.inflection_ms - T0) / H - 9)).toBeLessThan(0.1); // exact, derived: t_p(1 + 1/√n) = 9 h
  });

  it('throws a RangeError when the window holds no falling-limb inflection', () => {
    const rising = fromHours([0, 1, 2, 3, 4, 5], [1, 2, 4, 8, 16, 32]);
    expect(() => inflectionByNewtonPolynomial(rising, T0, T0 + 5 * H, { nodes: 6 })).toThrow(RangeError);
    expect(() => inflectionByNewtonPolynomial(rising, T0, T0 + 5 * H, { nodes: 6 })).toThrow(/no falling-limb inflection/);
    expect(() => inflectionByNewtonPolynomial(series, T0, T0 + 5 * H, { nodes: 3 })).toThrow(/nodes as an integer from 4 to 12/);
    expect(() => inflectionByNewtonPolynomial(series, T0 + 2 * H, T0 + H)).toThrow(/to_ms after from_ms/);
    expect(() => inflectionByNewtonPolynomial(series, T0, T0 + 9 * H)).toThrow(/inside the series/);
  });
});

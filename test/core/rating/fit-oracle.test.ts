import { describe, expect, it } from 'vitest';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { fitRating } from '../../../core/rating/index';
import { normalGenerator, uniformGenerator } from '../../support/noise';

// Oracle: ml-levenberg-marquardt (a general nonlinear least-squares package, test-only) minimises the
// same log-space residuals ln Q − (ln C + b·ln(h − e)) over all three parameters at once.
function oracle(points: { stage_m: number; discharge_m3s: number }[]) {
  const minH = Math.min(...points.map((p) => p.stage_m));
  const result = levenbergMarquardt(
    { x: points.map((p) => p.stage_m), y: points.map((p) => Math.log(p.discharge_m3s)) },
    ([lnC, b, e]) => (h: number) => lnC + b * Math.log(h - e),
    {
      // A deliberately rough start, away from the answer.
      initialValues: [Math.log(5), 2, minH - 0.3],
      jacobianFunction: ([, b, e]) => (h: number) => [1, Math.log(h - e), -b / (h - e)],
      minValues: [-50, 0.01, minH - 100],
      maxValues: [50, 10, minH - 1e-9],
      maxIterations: 2000,
      errorTolerance: 0,
      damping: 1e-3,
    },
  );
  const [lnC, b, e] = result.parameterValues;
  return { coefficient: Math.exp(lnC), exponent: b, offset_m: e, sse: result.parameterError };
}

function relative(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('fitRating against a Levenberg–Marquardt oracle', () => {
  // Invented gaugings at an invented site (a cobble riffle), 4 % log-normal scatter, fixed seeds.
  const sites = [
    { seed: 20240611, n: 20, C: 9.3, e: 0.42, b: 1.72, low: 0.55, span: 2.2, noise: 0.04 },
    { seed: 977, n: 35, C: 21, e: -0.15, b: 2.35, low: 0.1, span: 1.5, noise: 0.03 },
    { seed: 31337, n: 15, C: 4.1, e: 1.1, b: 1.45, low: 1.3, span: 3.0, noise: 0.05 },
  ];
  it.each(sites)('agrees to 4 significant figures (seed $seed)', (site) => {
    const u = uniformGenerator(site.seed);
    const z = normalGenerator(site.seed + 1);
    const points = Array.from({ length: site.n }, () => {
      const h = site.low + site.span * u();
      return { stage_m: h, discharge_m3s: site.C * (h - site.e) ** site.b * Math.exp(site.noise * z()) };
    });
    const ours = fitRating(points);
    const ref = oracle(points);
    expect(relative(ours.segment.coefficient, ref.coefficient)).toBeLessThan(5e-5);
    expect(relative(ours.segment.exponent, ref.exponent)).toBeLessThan(5e-5);
    expect(relative(ours.segment.offset_m, ref.offset_m)).toBeLessThan(5e-5);
    // the standard error follows from the same sum of squares with n − 3 degrees of freedom
    expect(relative(ours.standardError_pct, 100 * Math.sqrt(ref.sse / (site.n - 3)))).toBeLessThan(5e-5);
  });
});

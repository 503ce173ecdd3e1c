// The offset search shared by the one-segment fit (fit.ts) and the joined two-segment fit (joined-fit.ts):
// a grid scan, then Brent's method between the best point's neighbours. Checked on functions whose
// minima are known exactly (calculus), including one with two dips where a bracket on the wrong dip fails.
import { describe, expect, it } from 'vitest';
import { brentMinimize, scanThenBrent } from '../../../core/rating/minimize';

describe('scanThenBrent', () => {
  it('finds the lower of two dips: cos x + 0.01x on [0, 10] is least at x = π − asin(0.01) (f′ = 0, exact)', () => {
    const f = (x: number) => Math.cos(x) + 0.01 * x;
    const x = scanThenBrent(f, 0, 10, 32);
    expect(x).toBeCloseTo(Math.PI - Math.asin(0.01), 8);
    // Brent alone, started in the other dip's basin, settles there instead (near 3π − asin(0.01)).
    expect(brentMinimize(f, 6, 10, 9).x).toBeCloseTo(3 * Math.PI - Math.asin(0.01), 6);
  });

  it('uses a seed between grid points: (x − 0.123)² on [0, 1] with 2 grid points and the seed 0.1', () => {
    // Grid 0 and 1 alone bracket [0, 1]; the seed narrows the bracket to [0, 1] around 0.1 and Brent ends at 0.123.
    expect(scanThenBrent((x) => (x - 0.123) ** 2, 0, 1, 2, [0.1])).toBeCloseTo(0.123, 9);
  });

  it('refuses an empty range or fewer than 2 grid points', () => {
    expect(() => scanThenBrent((x) => x * x, 2, 2, 8)).toThrow(RangeError);
    expect(() => scanThenBrent((x) => x * x, 0, 1, 1)).toThrow(/at least 2 grid points/);
  });
});

/** Result of a one-dimensional minimisation: the abscissa, the function value there, and the evaluations used. */
export interface Minimum {
  x: number;
  value: number;
  evaluations: number;
}

const GOLDEN = 0.3819660112501051; // (3 − √5)/2

/**
 * Minimises f on the bracket [a, b] by Brent's method (golden-section steps with parabolic
 * interpolation; Brent 1973, "Algorithms for Minimization without Derivatives", ch. 5), starting from
 * `start` inside the bracket. Stops when the bracket around the best point is below
 * 2·(relTol·|x| + absTol).
 */
export function brentMinimize(
  f: (x: number) => number,
  a: number,
  b: number,
  start: number,
  relTol = 1e-10,
  absTol = 1e-12,
  maxIterations = 200,
): Minimum {
  if (!(a < b) || !(start >= a && start <= b)) {
    throw new RangeError(`brentMinimize needs a < b and a ≤ start ≤ b; got [${a}, ${b}] and start ${start}`);
  }
  let x = start;
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  let evaluations = 1;
  for (let iter = 0; iter < maxIterations; iter++) {
    const m = 0.5 * (a + b);
    const tol1 = relTol * Math.abs(x) + absTol;
    const tol2 = 2 * tol1;
    if (Math.abs(x - m) <= tol2 - 0.5 * (b - a)) break;
    let useGolden = true;
    if (Math.abs(e) > tol1) {
      // Parabola through (x, fx), (w, fw), (v, fv); accept its vertex only if it lies well inside the
      // bracket and the step is less than half the step before last (Brent's safeguard).
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = x < m ? tol1 : -tol1;
        useGolden = false;
      }
    }
    if (useGolden) {
      e = x < m ? b - x : a - x;
      d = GOLDEN * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = f(u);
    evaluations++;
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return { x, value: fx, evaluations };
}

/**
 * Minimises f over [lo, hi] when f may have several dips: scans `gridPoints` equally spaced points and
 * the `seeds` (each already inside [lo, hi]), then refines by Brent's method between the best point's
 * neighbours. Returns the abscissa found. Throws a RangeError unless lo < hi and gridPoints ≥ 2.
 */
export function scanThenBrent(f: (x: number) => number, lo: number, hi: number, gridPoints: number, seeds: readonly number[] = []): number {
  if (!(lo < hi) || !(gridPoints >= 2)) {
    throw new RangeError(`scanThenBrent needs lo < hi and at least 2 grid points; got [${lo}, ${hi}] and ${gridPoints}`);
  }
  const grid: number[] = [];
  for (let k = 0; k < gridPoints; k++) grid.push(lo + ((hi - lo) * k) / (gridPoints - 1));
  grid.push(...seeds);
  grid.sort((a, b) => a - b);
  let best = 0;
  let bestF = Infinity;
  for (let k = 0; k < grid.length; k++) {
    const v = f(grid[k]);
    if (v < bestF) {
      bestF = v;
      best = k;
    }
  }
  const a = grid[Math.max(0, best - 1)];
  const b = grid[Math.min(grid.length - 1, best + 1)];
  return brentMinimize(f, a, b, grid[best]).x;
}

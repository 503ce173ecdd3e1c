import { scanThenBrent } from './minimize';
import type { GaugingPoint, RatingSegment } from './types';

/** Two segments fitted together under continuity at the breakpoint, and their log-space sum of squares. */
export interface JoinedFit {
  lower: RatingSegment;
  upper: RatingSegment;
  /** Σ(ln Q_i − ln Q̂_i)² over every gauging, dimensionless. */
  sse: number;
}

/** Where the two offsets start: the segments fitted apart (m), used only to seed the search. */
export interface JoinedSeeds {
  lowerOffset_m: number;
  upperOffset_m: number;
}

const GRID_POINTS = 32;
const NEAREST_FRACTION = 1e-6;
const SEARCH_SPANS = 10;

interface LinearSolution {
  lnC: number;
  b1: number;
  b2: number;
  sse: number;
}

/**
 * Least squares in log space with both segments joined at h_b (DOMAIN.md §2). With the offsets e1, e2
 * fixed the joined model is linear in (ln C1, b1, b2):
 *   lower gauging:  ln Q = ln C1 + b1·ln(h − e1)
 *   upper gauging:  ln Q = ln C1 + b1·ln(h_b − e1) + b2·ln((h − e2)/(h_b − e2))
 * (the upper coefficient C2 = C1·(h_b − e1)^b1/(h_b − e2)^b2 substituted), so it is solved by the 3×3
 * normal equations; the offsets are then searched by nested Brent minimisations over t = ln(distance to
 * the nearest stage they must stay below), the lower one skipped when fixed.
 */
export function fitJoined(
  lowerPts: readonly GaugingPoint[],
  upperPts: readonly GaugingPoint[],
  breakpoint_m: number,
  seeds: JoinedSeeds,
  fixedLowerOffset_m?: number,
): JoinedFit {
  const nl = lowerPts.length;
  const nu = upperPts.length;
  const hl = Float64Array.from(lowerPts, (p) => p.stage_m);
  const hu = Float64Array.from(upperPts, (p) => p.stage_m);
  const yl = Float64Array.from(lowerPts, (p) => Math.log(p.discharge_m3s));
  const yu = Float64Array.from(upperPts, (p) => Math.log(p.discharge_m3s));
  const xl = new Float64Array(nl);
  const zu = new Float64Array(nu);
  const minLow = Math.min(...hl);
  const maxAll = Math.max(...hu);
  const span = maxAll - minLow;

  const solve = (e1: number, e2: number): LinearSolution => {
    const xb = Math.log(breakpoint_m - e1);
    const lb = Math.log(breakpoint_m - e2);
    // Normal equations for columns [1, x, z].
    let s1 = nl + nu, sx = 0, sz = 0, sxx = 0, sxz = 0, szz = 0, sy = 0, sxy = 0, szy = 0;
    for (let i = 0; i < nl; i++) {
      const x = Math.log(hl[i] - e1);
      xl[i] = x;
      sx += x; sxx += x * x; sy += yl[i]; sxy += x * yl[i];
    }
    for (let i = 0; i < nu; i++) {
      const z = Math.log(hu[i] - e2) - lb;
      zu[i] = z;
      sx += xb; sxx += xb * xb; sz += z; sxz += xb * z; szz += z * z;
      sy += yu[i]; sxy += xb * yu[i]; szy += z * yu[i];
    }
    // Cramer's rule on the symmetric 3×3 system.
    const det = s1 * (sxx * szz - sxz * sxz) - sx * (sx * szz - sxz * sz) + sz * (sx * sxz - sxx * sz);
    const lnC = (sy * (sxx * szz - sxz * sxz) - sx * (sxy * szz - sxz * szy) + sz * (sxy * sxz - sxx * szy)) / det;
    const b1 = (s1 * (sxy * szz - szy * sxz) - sy * (sx * szz - sxz * sz) + sz * (sx * szy - sxy * sz)) / det;
    const b2 = (s1 * (sxx * szy - sxz * sxy) - sx * (sx * szy - sxy * sz) + sy * (sx * sxz - sxx * sz)) / det;
    let sse = 0;
    for (let i = 0; i < nl; i++) {
      const r = yl[i] - lnC - b1 * xl[i];
      sse += r * r;
    }
    for (let i = 0; i < nu; i++) {
      const r = yu[i] - lnC - b1 * xb - b2 * zu[i];
      sse += r * r;
    }
    return { lnC, b1, b2, sse: Number.isFinite(sse) ? sse : Infinity };
  };

  const tLo = Math.log(span * NEAREST_FRACTION);
  const tHi = Math.log(span * SEARCH_SPANS);
  const lowerOffset = (t: number) => minLow - Math.exp(t);
  const upperOffset = (t: number) => breakpoint_m - Math.exp(t);
  const tOf = (distance: number) => Math.min(tHi, Math.max(tLo, Math.log(Math.max(distance, 1e-300))));

  const searchT = (f: (t: number) => number, seed: number): number => scanThenBrent(f, tLo, tHi, GRID_POINTS, [seed]);

  const seed1 = tOf(minLow - seeds.lowerOffset_m);
  const seed2 = tOf(breakpoint_m - seeds.upperOffset_m);
  const bestLowerT = (e2: number): number =>
    fixedLowerOffset_m !== undefined ? NaN : searchT((t1) => solve(lowerOffset(t1), e2).sse, seed1);
  const e1Of = (e2: number): number => (fixedLowerOffset_m !== undefined ? fixedLowerOffset_m : lowerOffset(bestLowerT(e2)));
  const t2 = searchT((t) => {
    const e2 = upperOffset(t);
    return solve(e1Of(e2), e2).sse;
  }, seed2);
  const e2 = upperOffset(t2);
  const e1 = e1Of(e2);
  const s = solve(e1, e2);
  const c1 = Math.exp(s.lnC);
  const c2 = Math.exp(s.lnC + s.b1 * Math.log(breakpoint_m - e1) - s.b2 * Math.log(breakpoint_m - e2));
  return {
    lower: { fromStage_m: e1, coefficient: c1, offset_m: e1, exponent: s.b1 },
    upper: { fromStage_m: breakpoint_m, coefficient: c2, offset_m: e2, exponent: s.b2 },
    sse: s.sse,
  };
}

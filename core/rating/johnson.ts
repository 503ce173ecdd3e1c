import type { GaugingPoint } from './types';
import { requireFinite } from './validate';

/**
 * Johnson's three-point offset (m): for stages G1, G2 on a power-law curve and G3 where the discharge is
 * √(Q1·Q2), e = (G1·G2 − G3²)/(G1 + G2 − 2·G3) (Rantz et al. 1982, USGS WSP 2175).
 */
export function johnsonOffsetOf(g1_m: number, g2_m: number, g3_m: number): number {
  requireFinite('johnsonOffsetOf', 'G1 stage', g1_m);
  requireFinite('johnsonOffsetOf', 'G2 stage', g2_m);
  requireFinite('johnsonOffsetOf', 'G3 stage', g3_m);
  const denominator = g1_m + g2_m - 2 * g3_m;
  const scale = Math.max(Math.abs(g1_m), Math.abs(g2_m), Math.abs(g2_m - g1_m), 1e-300);
  if (Math.abs(denominator) <= 1e-12 * scale) {
    throw new RangeError(
      `johnsonOffsetOf needs G3 off the midpoint of G1 and G2 (a curved rating); got G1 ${g1_m} m, G2 ${g2_m} m, G3 ${g3_m} m, which leaves the offset undetermined`,
    );
  }
  return (g1_m * g2_m - g3_m * g3_m) / denominator;
}

/**
 * Johnson's three-point offset (m) from gaugings, or a reason it cannot be found: G1 and G2 at the
 * lowest and highest discharge, G3 interpolated linearly in ln Q between the gaugings around √(Q1·Q2).
 */
export function tryJohnsonOffset(points: readonly GaugingPoint[]): { offset_m: number } | { problem: string } {
  if (points.length < 3) return { problem: `needs at least 3 gaugings; got ${points.length}` };
  const sorted = [...points].sort((p, q) => p.discharge_m3s - q.discharge_m3s || p.stage_m - q.stage_m);
  const first = sorted[0];
  const last = sorted[sorted.length - 1];
  if (!(first.discharge_m3s > 0)) return { problem: `needs positive discharges; got ${first.discharge_m3s} m³/s` };
  if (!(last.discharge_m3s > first.discharge_m3s)) return { problem: 'needs at least two different discharges' };
  const lnQ3 = 0.5 * (Math.log(first.discharge_m3s) + Math.log(last.discharge_m3s));
  let k = 1;
  while (k < sorted.length - 1 && Math.log(sorted[k].discharge_m3s) < lnQ3) k++;
  const lo = sorted[k - 1];
  const hi = sorted[k];
  const lnLo = Math.log(lo.discharge_m3s);
  const lnHi = Math.log(hi.discharge_m3s);
  const w = lnHi > lnLo ? (lnQ3 - lnLo) / (lnHi - lnLo) : 0.5;
  const g3 = lo.stage_m + w * (hi.stage_m - lo.stage_m);
  const g1 = first.stage_m;
  const g2 = last.stage_m;
  const denominator = g1 + g2 - 2 * g3;
  if (Math.abs(denominator) <= 1e-12 * Math.max(Math.abs(g1), Math.abs(g2), Math.abs(g2 - g1))) {
    return { problem: `found G3 ${g3} m at the midpoint of G1 ${g1} m and G2 ${g2} m, which leaves the offset undetermined` };
  }
  const offset_m = (g1 * g2 - g3 * g3) / denominator;
  let lowest = Infinity;
  for (const p of points) lowest = Math.min(lowest, p.stage_m);
  if (!(offset_m < lowest)) {
    return { problem: `gives ${offset_m} m, not below the lowest gauged stage ${lowest} m` };
  }
  return { offset_m };
}

/** Johnson's three-point estimate of the gauge height of zero flow (m) from gaugings; RangeError when it fails. */
export function johnsonOffset(points: readonly GaugingPoint[]): number {
  if (!Array.isArray(points)) throw new RangeError('johnsonOffset needs an array of gaugings');
  points.forEach((p, i) => {
    requireFinite('johnsonOffset', `stage_m at index ${i}`, p.stage_m);
    requireFinite('johnsonOffset', `discharge_m3s at index ${i}`, p.discharge_m3s);
  });
  const result = tryJohnsonOffset(points);
  if ('problem' in result) throw new RangeError(`johnsonOffset ${result.problem}`);
  return result.offset_m;
}

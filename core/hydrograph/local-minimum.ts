// Local-minimum baseflow (Sloto & Crouse 1996, USGS WRIR 96-4040).
import { checkArea, MS_PER_DAY } from './series';
import { joinAnchors } from './anchors';
import { runoffDuration_days } from './key-points';

/** The interval 2N* (days): the odd integer from 3 to 11 nearest to 2N, N = 0.827·A^0.2 (A in km²). */
export function localMinimumInterval_days(area_km2: number): number {
  const twoN = 2 * runoffDuration_days(checkArea(area_km2, 'localMinimumInterval_days'));
  const odd = 2 * Math.round((twoN - 1) / 2) + 1;
  return Math.min(11, Math.max(3, odd));
}

/**
 * Baseflow (m³/s) of a regular record of daily (or coarser) flows: a reading is a local minimum when it is the lowest within
 * (interval − 1)/2 days either side; baseflow is linear between local minima, held level beyond, ≤ Q.
 */
export function localMinimum(t: Float64Array, q: Float64Array, step_ms: number, interval_days: number): Float64Array {
  const half = Math.max(1, Math.round((((interval_days - 1) / 2) * MS_PER_DAY) / step_ms));
  const n = q.length;
  const anchors: number[] = [];
  for (let i = 0; i < n; i++) {
    const from = Math.max(0, i - half);
    const to = Math.min(n - 1, i + half);
    let lowest = true;
    for (let j = from; j <= to && lowest; j++) if (q[j] < q[i]) lowest = false;
    if (lowest) anchors.push(i);
  }
  return joinAnchors(t, q, anchors);
}

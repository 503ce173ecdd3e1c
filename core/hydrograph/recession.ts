// Recession constant from a recession segment: Q_t = Q₀·k^t with t in days, and K = −1/ln k.
import { MS_PER_DAY, prepareSeries, type Series } from './series';

/** Recession fit: k per day (0 < k < 1), K = −1/ln k (days), Q₀ (m³/s at from_ms) and the readings used. */
export interface RecessionFit {
  k_perDay: number;
  K_days: number;
  q0_m3s: number;
  readings: number;
}

/** Fits Q_t = Q₀·k^t (t in days) by least squares on ln Q to the readings between from_ms and to_ms. */
export function recessionConstant(series: Series, from_ms: number, to_ms: number): RecessionFit {
  const fn = 'recessionConstant';
  const { time_ms: t, discharge_m3s: q, gaps } = prepareSeries(series, fn);
  if (!Number.isFinite(from_ms) || !Number.isFinite(to_ms) || !(to_ms > from_ms)) {
    throw new RangeError(`${fn} needs finite times with to_ms after from_ms; got ${from_ms} and ${to_ms}`);
  }
  const missing = new Uint8Array(t.length);
  for (const g of gaps) for (let i = g.first; i <= g.last; i++) missing[i] = 1;
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < t.length; i++) {
    if (t[i] < from_ms || t[i] > to_ms || missing[i] || !(q[i] > 0)) continue;
    const x = (t[i] - from_ms) / MS_PER_DAY;
    const y = Math.log(q[i]);
    n++;
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
  }
  if (n < 2) throw new RangeError(`${fn} needs at least 2 readings above 0 m³/s between from_ms and to_ms; got ${n}`);
  const vxx = sxx - (sx * sx) / n;
  const slope = (sxy - (sx * sy) / n) / vxx;
  const intercept = (sy - slope * sx) / n;
  if (!(slope < 0)) {
    throw new RangeError(`${fn} needs a falling segment (a recession); the fitted ln Q rises or is flat (slope ${slope} per day)`);
  }
  const k = Math.exp(slope);
  return { k_perDay: k, K_days: -1 / slope, q0_m3s: Math.exp(intercept), readings: n };
}

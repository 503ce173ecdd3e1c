// The end of direct runoff as the break between two straight lines fitted to ln Q on the recession.
import { MS_PER_DAY } from './series';

/**
 * Time (UTC ms) where the recession after from_ms (up to reading last) becomes straight on a semi-log plot:
 * the split minimising the total squared error of two least-squares lines through ln Q (≥ 3 readings each).
 * Falls back to the time of reading `last` when there are too few positive readings.
 */
export function semiLogBreak(t: Float64Array, q: Float64Array, from_ms: number, last: number): number {
  let first = 0;
  while (first < last && t[first] < from_ms) first++;
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = first; i <= last; i++) {
    if (q[i] > 0) {
      xs.push((t[i] - t[first]) / MS_PER_DAY);
      ys.push(Math.log(q[i]));
    }
  }
  const m = xs.length;
  if (m < 6) return t[last];
  const cum = (f: (k: number) => number) => {
    const c = new Float64Array(m + 1);
    for (let k = 0; k < m; k++) c[k + 1] = c[k] + f(k);
    return c;
  };
  const sx = cum((k) => xs[k]);
  const sy = cum((k) => ys[k]);
  const sxx = cum((k) => xs[k] * xs[k]);
  const syy = cum((k) => ys[k] * ys[k]);
  const sxy = cum((k) => xs[k] * ys[k]);
  const sse = (a: number, b: number) => {
    const n = b - a;
    const mx = (sx[b] - sx[a]) / n;
    const my = (sy[b] - sy[a]) / n;
    const vxx = sxx[b] - sxx[a] - n * mx * mx;
    const vyy = syy[b] - syy[a] - n * my * my;
    const vxy = sxy[b] - sxy[a] - n * mx * my;
    return vxx > 0 ? Math.max(0, vyy - (vxy * vxy) / vxx) : Math.max(0, vyy);
  };
  let best = 3;
  let bestError = Infinity;
  for (let split = 3; split <= m - 3; split++) {
    const e = sse(0, split) + sse(split, m);
    if (e < bestError) {
      bestError = e;
      best = split;
    }
  }
  return t[first] + xs[best] * MS_PER_DAY;
}

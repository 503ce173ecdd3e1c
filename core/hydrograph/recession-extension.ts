// Exponential recession extensions (straight on a semi-log plot) used by the event separation methods.
import { indexAtOrBefore } from './series';

/** Readings used to fit the recession just before the rise start or just after the end of runoff. */
export const RECESSION_FIT_READINGS = 5;

/**
 * Log-slope (1/ms, ≤ 0) of Q = Q₀·k^t fitted by least squares on ln Q to up to RECESSION_FIT_READINGS
 * positive readings at or before at_ms ('before') or at or after it ('after'). Returns 0 (a flat
 * extension) with fewer than 2 such readings or when those readings do not fall.
 */
export function recessionLogSlope(t: Float64Array, q: Float64Array, at_ms: number, side: 'before' | 'after'): number {
  const xs: number[] = [];
  const ys: number[] = [];
  if (side === 'before') {
    for (let i = indexAtOrBefore(t, at_ms); i >= 0 && xs.length < RECESSION_FIT_READINGS; i--) {
      if (q[i] > 0) {
        xs.push(t[i] - at_ms);
        ys.push(Math.log(q[i]));
      }
    }
  } else {
    let i = indexAtOrBefore(t, at_ms);
    if (i < 0 || t[i] < at_ms) i++;
    for (; i < t.length && xs.length < RECESSION_FIT_READINGS; i++) {
      if (q[i] > 0) {
        xs.push(t[i] - at_ms);
        ys.push(Math.log(q[i]));
      }
    }
  }
  const n = xs.length;
  if (n < 2) return 0;
  let mx = 0;
  let my = 0;
  for (let k = 0; k < n; k++) {
    mx += xs[k];
    my += ys[k];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (let k = 0; k < n; k++) {
    sxx += (xs[k] - mx) * (xs[k] - mx);
    sxy += (xs[k] - mx) * (ys[k] - my);
  }
  if (!(sxx > 0)) return 0;
  return Math.min(0, sxy / sxx);
}

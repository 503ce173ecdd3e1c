// Exponential recession extensions (straight on a semi-log plot) used by the event separation methods.
import { indexAtOrBefore } from './series';

/** Fewest readings a recession fit uses: on coarse records the span is widened to reach them. */
const FEWEST_READINGS = 3;

/**
 * Log-slope (1/ms, ≤ 0) of Q = Q₀·k^t fitted by least squares on ln Q to the positive readings within
 * span_ms before at_ms ('before': the rise start itself left out, as it may already be the foot of the rise)
 * or from at_ms to at_ms + span_ms ('after'). The span is a duration, comparable to the extension it serves,
 * not a count of readings; on coarse records it is widened to the 3 nearest readings on that side. Returns 0
 * (a flat extension) with fewer than 2 such readings or when those readings do not fall.
 */
export function recessionLogSlope(
  t: Float64Array,
  q: Float64Array,
  at_ms: number,
  side: 'before' | 'after',
  span_ms: number,
): number {
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  const add = (i: number) => {
    if (!(q[i] > 0)) return;
    const x = (t[i] - at_ms) / 3_600_000;
    const y = Math.log(q[i]);
    n++;
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
  };
  if (side === 'before') {
    let i = indexAtOrBefore(t, at_ms);
    if (i >= 0 && t[i] === at_ms) i--;
    for (let taken = 0; i >= 0 && (t[i] >= at_ms - span_ms || taken < FEWEST_READINGS); i--, taken++) add(i);
  } else {
    let i = indexAtOrBefore(t, at_ms);
    if (i < 0 || t[i] < at_ms) i++;
    for (let taken = 0; i < t.length && (t[i] <= at_ms + span_ms || taken < FEWEST_READINGS); i++, taken++) add(i);
  }
  if (n < 2) return 0;
  const vxx = sxx - (sx * sx) / n;
  if (!(vxx > 0)) return 0;
  const slopePerHour = (sxy - (sx * sy) / n) / vxx;
  return Math.min(0, slopePerHour / 3_600_000);
}

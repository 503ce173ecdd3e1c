// Trapezoid-rule volumes over a time window, on the union of reading times and the window ends.
import { indexAtOrBefore } from './series';

/** Volumes (m³) of Q and of b between from_ms and to_ms: trapezoids in seconds × m³/s. */
export function trapezoidVolumes(
  t: Float64Array,
  q: Float64Array,
  b: ArrayLike<number>,
  from_ms: number,
  to_ms: number,
): { total_m3: number; baseflow_m3: number } {
  let total = 0;
  let base = 0;
  if (!(to_ms > from_ms)) return { total_m3: 0, baseflow_m3: 0 };
  let i = Math.max(0, indexAtOrBefore(t, from_ms));
  let x0 = from_ms;
  let q0 = at(t, q, i, from_ms);
  let b0 = at(t, b, i, from_ms);
  const n = t.length;
  while (x0 < to_ms) {
    const next = i + 1 < n && t[i + 1] < to_ms ? t[i + 1] : to_ms;
    const q1 = next === t[i + 1] ? q[i + 1] : at(t, q, i, next);
    const b1 = next === t[i + 1] ? b[i + 1] : at(t, b, i, next);
    const dt = (next - x0) / 1000;
    total += 0.5 * (q0 + q1) * dt;
    base += 0.5 * (b0 + b1) * dt;
    x0 = next;
    q0 = q1;
    b0 = b1;
    i++;
  }
  return { total_m3: total, baseflow_m3: base };
}

function at(t: Float64Array, y: ArrayLike<number>, i: number, x: number): number {
  if (i >= t.length - 1) return y[t.length - 1];
  return y[i] + ((y[i + 1] - y[i]) * (x - t[i])) / (t[i + 1] - t[i]);
}

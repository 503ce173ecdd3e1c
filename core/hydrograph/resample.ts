// Resampling an irregular record to a regular time step for the digital filters, and mapping back.

/** A regular record: times (UTC ms) t₀ + k·step_ms and discharges (m³/s). */
export interface RegularRecord {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
  step_ms: number;
}

/** Median interval (ms) between consecutive times. */
export function medianInterval_ms(t: Float64Array): number {
  if (t.length < 2) return 0;
  const d = new Float64Array(t.length - 1);
  for (let i = 0; i < d.length; i++) d[i] = t[i + 1] - t[i];
  d.sort();
  return d[d.length >> 1];
}

/**
 * Linear resampling onto a regular grid spanning exactly [t₀, t_last], with the step closest to step_ms
 * that divides the span evenly.
 */
export function resampleRegular(t: Float64Array, q: Float64Array, step_ms: number): RegularRecord {
  const span = t[t.length - 1] - t[0];
  const steps = Math.max(1, Math.round(span / step_ms));
  const step = span / steps;
  const time_ms = new Float64Array(steps + 1);
  const discharge_m3s = new Float64Array(steps + 1);
  let i = 0;
  for (let k = 0; k <= steps; k++) {
    const x = k === steps ? t[t.length - 1] : t[0] + k * step;
    while (i < t.length - 2 && t[i + 1] <= x) i++;
    time_ms[k] = x;
    const f = (x - t[i]) / (t[i + 1] - t[i]);
    discharge_m3s[k] = q[i] + f * (q[i + 1] - q[i]);
  }
  return { time_ms, discharge_m3s, step_ms: step };
}

/** Values of y (on ascending times `from`) at the ascending times `to`, by linear interpolation. */
export function interpolateOnto(from: Float64Array, y: Float64Array, to: Float64Array): Float64Array {
  const out = new Float64Array(to.length);
  let i = 0;
  for (let k = 0; k < to.length; k++) {
    const x = to[k];
    while (i < from.length - 2 && from[i + 1] <= x) i++;
    const f = (x - from[i]) / (from[i + 1] - from[i]);
    out[k] = from.length === 1 ? y[0] : y[i] + f * (y[i + 1] - y[i]);
  }
  return out;
}

// Synthetic hydrographs with exactly known properties, built for the tests (invented values).
import type { Series } from '../../core/hydrograph/index';

export const H = 3_600_000;
export const DAY = 86_400_000;
/** An arbitrary UTC epoch origin so that times look like real ones (2024-03-01T00:00Z). */
export const T0 = Date.UTC(2024, 2, 1);

/** Gamma-shaped pulse Q_p·(τ/t_p)^n·e^{n(1 − τ/t_p)} for τ > 0, else 0 (m³/s; τ, t_p in hours). */
export function pulse(tau_h: number, peak_m3s: number, tp_h: number, n: number): number {
  if (tau_h <= 0) return 0;
  const x = tau_h / tp_h;
  return peak_m3s * Math.pow(x, n) * Math.exp(n * (1 - x));
}

/** Q = Q_b + pulse sampled every step_h from 0 to span_h, times from T0. */
export function gammaSeries(base: number, peak: number, tp_h: number, n: number, step_h: number, span_h: number): Series {
  const count = Math.round(span_h / step_h) + 1;
  const time_ms = new Float64Array(count);
  const discharge_m3s = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    time_ms[i] = T0 + i * step_h * H;
    discharge_m3s[i] = base + pulse(i * step_h, peak, tp_h, n);
  }
  return { time_ms, discharge_m3s };
}

/** A series from hours and discharges. */
export function fromHours(hours: readonly number[], q: readonly number[]): Series {
  return { time_ms: Float64Array.from(hours, (h) => T0 + h * H), discharge_m3s: Float64Array.from(q) };
}

/** Triangle of height peak rising from rise_h to peak_h and falling to end_h, on flow base(t_h), every step_h. */
export function triangleSeries(
  base: (t_h: number) => number,
  peak: number,
  rise_h: number,
  peak_h: number,
  end_h: number,
  step_h: number,
  span_h: number,
): Series {
  const count = Math.round(span_h / step_h) + 1;
  const time_ms = new Float64Array(count);
  const discharge_m3s = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const t = i * step_h;
    let tri = 0;
    if (t > rise_h && t <= peak_h) tri = (peak * (t - rise_h)) / (peak_h - rise_h);
    else if (t > peak_h && t < end_h) tri = (peak * (end_h - t)) / (end_h - peak_h);
    time_ms[i] = T0 + t * H;
    discharge_m3s[i] = base(t) + tri;
  }
  return { time_ms, discharge_m3s };
}

/** Trapezoid integral (m³) of y (m³/s) over times (ms), the test's own oracle. */
export function trapezoid(t: ArrayLike<number>, y: ArrayLike<number>): number {
  let v = 0;
  for (let i = 1; i < t.length; i++) v += ((y[i] + y[i - 1]) / 2) * ((t[i] - t[i - 1]) / 1000);
  return v;
}

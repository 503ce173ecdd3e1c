// Simulated logger records with known answers, for the storm key-point and separation tests (invented values).
//
// The model, stated so that every bound in the tests can be checked against it:
// - baseflow Q_b(t) = Q_b0·e^(−t/K_b), an exponential recession (K_b in days);
// - direct runoff of each burst Q_d(τ) = Q_p·(τ/t_p)^n·e^(n(1 − τ/t_p)) for τ = t − onset > 0, else 0
//   (a gamma-shaped pulse peaking at Q_p, t_p hours after its onset);
// - the true discharge Q = Q_b + Σ Q_d goes through a power-law rating Q = C·(h − e)^b to a stage h;
// - the logger reads h + ε with ε Gaussian (σ_h, a few mm), rounded to its 1 mm resolution, and the
//   discharge of that reading is C·(h_read − e)^b, as the app computes it.
// Every record is drawn from a seed (mulberry32 and Box–Muller, test/support/noise.ts), never Math.random.
import { normalGenerator, uniformGenerator } from './noise';

export const MINUTE_MS = 60_000;
export const HOUR_MS = 3_600_000;
export const DAY_MS = 86_400_000;
/** The records' time origin, 2025-05-01T00:00Z (invented scenario). */
export const ORIGIN_MS = Date.UTC(2025, 4, 1);

/** The rating of the simulated gauge: Q = 7.5·(h − 0.12)^1.7 (m³/s, h in m); exponent as for channel control. */
export const SIM_RATING = { coefficient: 7.5, offset_m: 0.12, exponent: 1.7 } as const;

/** One gamma-shaped burst of direct runoff: onset (hours from the origin), peak (m³/s), time to peak (h), shape n. */
export interface Burst {
  onset_h: number;
  peak_m3s: number;
  tp_h: number;
  n: number;
}

/** A simulated storm: baseflow, bursts, span, step and logger noise. */
export interface StormModel {
  baseflow0_m3s: number;
  baseflowK_days: number;
  bursts: Burst[];
  span_h: number;
  step_min: number;
  /** Standard deviation of the stage noise, m (0 for the noise-free record). */
  stageNoise_m: number;
  /** Logger resolution, m (0.001); 0 for none. */
  resolution_m: number;
}

/** The true discharge (m³/s) of the model at hours t_h after the origin. */
export function trueDischarge(model: StormModel, t_h: number): number {
  let q = model.baseflow0_m3s * Math.exp(-t_h / (24 * model.baseflowK_days));
  for (const b of model.bursts) {
    const tau = t_h - b.onset_h;
    if (tau > 0) q += b.peak_m3s * Math.pow(tau / b.tp_h, b.n) * Math.exp(b.n * (1 - tau / b.tp_h));
  }
  return q;
}

/** Stage (m) of a discharge (m³/s) through SIM_RATING. */
export function stageOf(q_m3s: number): number {
  return SIM_RATING.offset_m + Math.pow(q_m3s / SIM_RATING.coefficient, 1 / SIM_RATING.exponent);
}

/** Discharge (m³/s) of a stage (m) through SIM_RATING; 0 at or below the offset. */
export function dischargeOf(stage_m: number): number {
  const d = stage_m - SIM_RATING.offset_m;
  return d > 0 ? SIM_RATING.coefficient * Math.pow(d, SIM_RATING.exponent) : 0;
}

/** The record the logger would give: times (UTC ms) every step and discharges (m³/s) of the noisy, rounded stage. */
export function loggerRecord(model: StormModel, seed: number): { time_ms: Float64Array; discharge_m3s: Float64Array } {
  const normal = normalGenerator(seed);
  const count = Math.round((model.span_h * 60) / model.step_min) + 1;
  const time_ms = new Float64Array(count);
  const discharge_m3s = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const t_h = (i * model.step_min) / 60;
    time_ms[i] = ORIGIN_MS + i * model.step_min * MINUTE_MS;
    let h = stageOf(trueDischarge(model, t_h)) + model.stageNoise_m * normal();
    if (model.resolution_m > 0) h = Math.round(h / model.resolution_m) * model.resolution_m;
    discharge_m3s[i] = dischargeOf(h);
  }
  return { time_ms, discharge_m3s };
}

/**
 * A single-burst storm drawn from a seed: baseflow 0.5–2 m³/s receding with K_b 10–40 days, a burst of
 * 4–20 m³/s peaking 3–9 h after its onset with shape n 2.5–5, the onset 18–30 h into a record of 4 days
 * (the end of runoff by N for 50 km², 1.81 days after the peak, is always recorded), stage noise 2–4 mm,
 * 1 mm resolution.
 */
export function singleStorm(seed: number, step_min: number): StormModel {
  const u = uniformGenerator(seed ^ 0x5eed);
  const between = (lo: number, hi: number) => lo + (hi - lo) * u();
  return {
    baseflow0_m3s: between(0.5, 2),
    baseflowK_days: between(10, 40),
    bursts: [{ onset_h: between(18, 30), peak_m3s: between(4, 20), tp_h: between(3, 9), n: between(2.5, 5) }],
    span_h: 96,
    step_min,
    stageNoise_m: between(0.002, 0.004),
    resolution_m: 0.001,
  };
}

/** The same model without noise or rounding: the record whose answer the noisy ones are compared to. */
export function noiseFree(model: StormModel): StormModel {
  return { ...model, stageNoise_m: 0, resolution_m: 0 };
}

/** Hours after the onset at which a burst's direct runoff first reaches `share` of its peak (bisection, exact to 1 s). */
export function hoursToShare(burst: Burst, share: number): number {
  let lo = 0;
  let hi = burst.tp_h;
  const f = (tau: number) => Math.pow(tau / burst.tp_h, burst.n) * Math.exp(burst.n * (1 - tau / burst.tp_h)) - share;
  while (hi - lo > 1 / 3600) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Time (hours after the origin) of the highest true discharge, by a fine scan (1 s) around the bursts' peaks. */
export function truePeak_h(model: StormModel): number {
  let best = 0;
  let bestQ = -Infinity;
  for (const b of model.bursts) {
    for (let s = -2 * 3600; s <= 2 * 3600; s++) {
      const t = b.onset_h + b.tp_h + s / 3600;
      const q = trueDischarge(model, t);
      if (q > bestQ) {
        bestQ = q;
        best = t;
      }
    }
  }
  return best;
}

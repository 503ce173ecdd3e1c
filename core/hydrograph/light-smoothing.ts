// Optional light smoothing before a separation: a short centred running mean, with its effect stated.
import { trapezoidVolumes } from './integrate';
import { runningMean } from './noise';
import { medianInterval_ms } from './resample';
import type { PreparedSeries } from './series';
import { stepLabel } from './filters/time-step';

/** Longest span the light smoothing may average over: readings within 30 minutes either side, at most 2. */
const LIGHT_HALF_MS = 30 * 60_000;
const LIGHT_HALF_READINGS = 2;

/** The smoothed discharges (m³/s) and the number of readings averaged, or null with a sentence saying why not. */
export function lightlySmoothed(prepared: PreparedSeries): { discharge_m3s: Float64Array; readings: number } | { discharge_m3s: null; note: string } {
  const t = prepared.time_ms;
  const step = prepared.regular ? t[1] - t[0] : medianInterval_ms(t);
  const half = t.length < 5 ? 0 : Math.min(LIGHT_HALF_READINGS, Math.floor(LIGHT_HALF_MS / step));
  if (half < 1) {
    return {
      discharge_m3s: null,
      note: `Light smoothing was not applied: the readings are ${stepLabel(step).replace('-', ' ')} apart, too far apart to smooth lightly.`,
    };
  }
  return { discharge_m3s: runningMean(prepared.discharge_m3s, half), readings: 2 * half + 1 };
}

/** One sentence stating what the smoothing did: the window, and the baseflow index and peak before and after. */
export function smoothingEffectNote(
  t: Float64Array,
  raw: Float64Array,
  rawBaseflow: ArrayLike<number>,
  smooth: Float64Array,
  smoothBaseflow: ArrayLike<number>,
  readings: number,
): string {
  const from = t[0];
  const to = t[t.length - 1];
  const before = trapezoidVolumes(t, raw, rawBaseflow, from, to);
  const after = trapezoidVolumes(t, raw, smoothBaseflow, from, to);
  let rawPeak = 0;
  let smoothPeak = 0;
  for (let i = 0; i < raw.length; i++) {
    if (raw[i] > rawPeak) rawPeak = raw[i];
    if (smooth[i] > smoothPeak) smoothPeak = smooth[i];
  }
  const span = stepLabel((readings - 1) * (t.length > 1 ? (to - from) / (t.length - 1) : 0)).replace('-', ' ');
  const bfi = (v: { total_m3: number; baseflow_m3: number }) => (v.total_m3 > 0 ? (v.baseflow_m3 / v.total_m3).toFixed(3) : '0');
  return (
    `Light smoothing: each discharge was replaced by the mean of ${readings} readings centred on it (${span}) before ` +
    `separation; the baseflow index of the window went from ${bfi(before)} without smoothing to ${bfi(after)} with it, ` +
    `and the highest discharge the separation saw from ${sig(rawPeak)} to ${sig(smoothPeak)} m³/s. ` +
    `Volumes are still those of the recorded discharges.`
  );
}

function sig(x: number): string {
  return String(Number(x.toPrecision(3)));
}

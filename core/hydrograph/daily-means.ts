// Daily mean discharges of a sub-daily record, and a daily baseflow carried back to the reading times.
import { MS_PER_DAY } from './series';

/** Daily means: one per whole 24-h day from the first reading, time (UTC ms) at the day's middle, mean Q in m³/s. */
export interface DailyMeans {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
}

/**
 * Means (m³/s) over the whole 24-hour days from the first reading (a shorter last day is left out): the
 * trapezoid-rule integral of the readings joined by straight lines over each day, divided by the day.
 */
export function dailyMeans(t: Float64Array, q: Float64Array): DailyMeans {
  const t0 = t[0];
  const days = Math.floor((t[t.length - 1] - t0) / MS_PER_DAY);
  const time_ms = new Float64Array(days);
  const discharge_m3s = new Float64Array(days);
  let i = 0;
  for (let d = 0; d < days; d++) {
    const from = t0 + d * MS_PER_DAY;
    const to = from + MS_PER_DAY;
    while (t[i + 1] <= from) i++;
    let sum = 0;
    let x = from;
    let qx = valueAt(t, q, i, from);
    for (let j = i; x < to; j++) {
      const next = t[j + 1] < to ? t[j + 1] : to;
      const qNext = next === t[j + 1] ? q[j + 1] : valueAt(t, q, j, next);
      sum += ((qx + qNext) / 2) * (next - x);
      x = next;
      qx = qNext;
    }
    time_ms[d] = from + MS_PER_DAY / 2;
    discharge_m3s[d] = sum / MS_PER_DAY;
  }
  return { time_ms, discharge_m3s };
}

function valueAt(t: Float64Array, q: Float64Array, j: number, x: number): number {
  return q[j] + ((q[j + 1] - q[j]) * (x - t[j])) / (t[j + 1] - t[j]);
}

/**
 * Daily baseflow (at the days' middles) carried to the reading times: linear between days, held level
 * before the first and after the last day's middle, kept within 0 ≤ b ≤ Q.
 */
export function dailyToReadings(dayT: Float64Array, dayB: Float64Array, t: Float64Array, q: Float64Array): Float64Array {
  const b = new Float64Array(t.length);
  const last = dayT.length - 1;
  let d = 0;
  for (let i = 0; i < t.length; i++) {
    const x = t[i];
    while (d < last && dayT[d + 1] <= x) d++;
    let v: number;
    if (x <= dayT[0]) v = dayB[0];
    else if (d >= last) v = dayB[last];
    else v = dayB[d] + ((dayB[d + 1] - dayB[d]) * (x - dayT[d])) / (dayT[d + 1] - dayT[d]);
    b[i] = v > q[i] ? q[i] : v > 0 ? v : 0;
  }
  return b;
}

// One discharge per time from a window of readings: at a shared time the logger wins, manual readings averaged.
import { READING_SOURCE_CODES } from '../records/source-codes';

/** A window of readings as parallel arrays: times (UTC ms, ascending), discharges (m³/s, NaN = no rating), sources, flags. */
export interface DischargeReadings {
  time_ms: ArrayLike<number>;
  discharge_m3s: ArrayLike<number>;
  /** Reading source codes (READING_SOURCE_CODES). */
  source: ArrayLike<number>;
  /** 1 where the stage lies outside the rating's gauged range, else 0. */
  extrapolated: ArrayLike<number>;
}

/** What was made of a window's readings: a series ready for the storm core, or why there is none. */
export type SeriesFromReadings =
  | {
      kind: 'ready';
      series: { time_ms: Float64Array; discharge_m3s: Float64Array };
      /** Readings left out because a logger reading had the same time. */
      skipped: number;
      /** Readings used whose stage lies outside the rating's gauged range. */
      extrapolated: number;
    }
  | { kind: 'unrated'; count: number; total: number; firstTime_ms: number }
  | { kind: 'empty' };

/**
 * One discharge (m³/s) per time from a window's readings (times ascending). Where several readings share a
 * time, the logger readings win (averaged if there are several); without a logger reading the manual ones
 * are averaged. Why: the logger record is the continuous series a storm is read from, and a staff check at
 * the same minute checks the logger (its correction is applied at logger import); mixing it in would put
 * a step of a few millimetres into the record. A window with any reading that has no rating in force
 * (NaN discharge) is 'unrated': the storm core would otherwise bridge it as a gap.
 */
export function seriesFromReadings(rows: DischargeReadings): SeriesFromReadings {
  const t = rows.time_ms;
  const q = rows.discharge_m3s;
  const n = t.length;
  if (n === 0) return { kind: 'empty' };
  let unrated = 0;
  let firstUnrated = -1;
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(q[i])) {
      unrated++;
      if (firstUnrated < 0) firstUnrated = i;
    }
  }
  if (unrated > 0) return { kind: 'unrated', count: unrated, total: n, firstTime_ms: t[firstUnrated] };
  const logger = READING_SOURCE_CODES.logger;
  const times = new Float64Array(n);
  const discharges = new Float64Array(n);
  let m = 0;
  let skipped = 0;
  let extrapolated = 0;
  let i = 0;
  while (i < n) {
    let j = i;
    while (j + 1 < n && t[j + 1] === t[i]) j++;
    let loggers = 0;
    for (let k = i; k <= j; k++) if (rows.source[k] === logger) loggers++;
    let sum = 0;
    let chosen = 0;
    for (let k = i; k <= j; k++) {
      if (loggers > 0 && rows.source[k] !== logger) continue;
      sum += q[k];
      extrapolated += rows.extrapolated[k] ? 1 : 0;
      chosen++;
    }
    skipped += j + 1 - i - chosen;
    times[m] = t[i];
    discharges[m] = sum / chosen;
    m++;
    i = j + 1;
  }
  return {
    kind: 'ready',
    series: { time_ms: times.slice(0, m), discharge_m3s: discharges.slice(0, m) },
    skipped,
    extrapolated,
  };
}

// A site's stage record: its spot readings and its logger values (drift-corrected, raw value and
// correction kept) joined in time order, the one join every reader of a site's stage uses (lists, plots,
// storm finding and analysis, the phone's and the office's exports). Typed arrays, no object per value.
import type { LoggerDayBody } from '../records/index';
import { READING_SOURCE_CODES } from '../records/source-codes';
import { sortedIndex } from '../sorted';

/** Milliseconds in a UTC day (the width of a logger-day record). */
const DAY_MS = 86_400_000;

/** Spot readings as parallel arrays, times ascending (UTC ms): stage (m) and source code (READING_SOURCE_CODES). */
export interface SpotSeries {
  time_ms: ArrayLike<number>;
  stage_m: ArrayLike<number>;
  source: ArrayLike<number>;
}

/** A logger day as the join reads it: the record body, with its id, rev and `deleted` when it is a stored record. */
export type StageLoggerDay = LoggerDayBody & { deleted?: boolean; id?: string; rev?: string };

/** A site's stage record in time order: every spot reading and every logger value of the window. */
export interface StageRecord {
  /** UTC ms, ascending; at one time, spot readings first (in their given order), then the logger value. */
  time_ms: Float64Array;
  /** The stage of the record, m above gauge datum: a spot reading as read, a logger value as corrected (raw + correction). */
  stage_m: Float64Array;
  /** The logger's value as read from its file, m (NaN for a spot reading). */
  raw_m: Float64Array;
  /** The drift correction applied to a logger value, m (NaN for a spot reading). */
  correction_m: Float64Array;
  /** Reading source codes (READING_SOURCE_CODES): logger values have the logger's code. */
  source: Uint8Array;
  /** Index of the spot reading in the spots given, or -1 for a logger value. */
  spot: Int32Array;
  /** Index of the logger day (in the days given) a logger value comes from, or -1 for a spot reading. */
  day: Int32Array;
}

interface LoggerPart {
  time_ms: Float64Array;
  raw_m: Float64Array;
  correction_m: Float64Array;
  day: Int32Array;
  n: number;
}

/**
 * The live logger values of the window in time order. Days are taken in day order; two records of one
 * day (imported on two phones under different ids) keep each time once, the earlier record's value.
 */
function loggerPart(days: readonly StageLoggerDay[], from_ms: number, to_ms: number): LoggerPart {
  const order: number[] = [];
  for (let i = 0; i < days.length; i++) {
    const d = days[i];
    if (d.deleted === true) continue;
    const start = d.day * DAY_MS;
    if (start + DAY_MS <= from_ms || start > to_ms) continue;
    order.push(i);
  }
  order.sort((a, b) => days[a].day - days[b].day || a - b);
  let cap = 0;
  for (const i of order) cap += days[i].offset_ms.length;
  const out: LoggerPart = { time_ms: new Float64Array(cap), raw_m: new Float64Array(cap), correction_m: new Float64Array(cap), day: new Int32Array(cap), n: 0 };
  let g = 0;
  while (g < order.length) {
    let h = g + 1;
    while (h < order.length && days[order[h]].day === days[order[g]].day) h++;
    const groupStart = out.n;
    for (let m = g; m < h; m++) {
      const i = order[m];
      const d = days[i];
      const start = d.day * DAY_MS;
      const a = sortedIndex(d.offset_ms, from_ms - start, false);
      const b = sortedIndex(d.offset_ms, to_ms - start, true);
      const firstOfRecord = out.n;
      for (let k = a; k < b; k++) {
        const t = start + d.offset_ms[k];
        if (m > g && held(out, groupStart, firstOfRecord, t)) continue;
        out.time_ms[out.n] = t;
        out.raw_m[out.n] = d.raw_m[k];
        out.correction_m[out.n] = d.correction_m[k];
        out.day[out.n] = i;
        out.n++;
      }
      // A second record of the day: put the group back in time order (insertion keeps the earlier value first).
      if (m > g) sortGroup(out, groupStart);
    }
    g = h;
  }
  return out;
}

/** Whether out holds time t among its entries from..to (ascending there). */
function held(out: LoggerPart, from: number, to: number, t: number): boolean {
  const at = sortedIndex(out.time_ms, t, false, from, to);
  return at < to && out.time_ms[at] === t;
}

/** Sorts out's entries from `from` to the end by time (stable insertion sort; groups are one day). */
function sortGroup(out: LoggerPart, from: number): void {
  for (let i = from + 1; i < out.n; i++) {
    const t = out.time_ms[i];
    if (t >= out.time_ms[i - 1]) continue;
    const raw = out.raw_m[i];
    const corr = out.correction_m[i];
    const day = out.day[i];
    let j = i - 1;
    while (j >= from && out.time_ms[j] > t) {
      out.time_ms[j + 1] = out.time_ms[j];
      out.raw_m[j + 1] = out.raw_m[j];
      out.correction_m[j + 1] = out.correction_m[j];
      out.day[j + 1] = out.day[j];
      j--;
    }
    out.time_ms[j + 1] = t;
    out.raw_m[j + 1] = raw;
    out.correction_m[j + 1] = corr;
    out.day[j + 1] = day;
  }
}

/**
 * The stage record of a site for from_ms ≤ time ≤ to_ms (UTC ms; ±Infinity for no bound): the spot
 * readings (times ascending) and the live logger days joined in time order, spot readings first at a
 * shared time. Throws a RangeError for a window that ends before it starts or spots out of order.
 */
export function joinStageRecord(spots: SpotSeries, days: readonly StageLoggerDay[], from_ms: number, to_ms: number): StageRecord {
  if (Number.isNaN(from_ms) || Number.isNaN(to_ms) || !(from_ms <= to_ms)) {
    throw new RangeError(`joinStageRecord needs a window with from_ms ≤ to_ms (UTC ms); got ${from_ms} to ${to_ms}`);
  }
  const st = spots.time_ms;
  for (let i = 1; i < st.length; i++) {
    if (!(st[i] >= st[i - 1])) throw new RangeError(`joinStageRecord needs spot readings in time order; reading ${i} is earlier than the one before`);
  }
  const sa = sortedIndex(st, from_ms, false);
  const sb = sortedIndex(st, to_ms, true);
  const logger = loggerPart(days, from_ms, to_ms);
  const n = sb - sa + logger.n;
  const out: StageRecord = {
    time_ms: new Float64Array(n), stage_m: new Float64Array(n), raw_m: new Float64Array(n), correction_m: new Float64Array(n),
    source: new Uint8Array(n), spot: new Int32Array(n), day: new Int32Array(n),
  };
  const code = READING_SOURCE_CODES.logger;
  // One side only (a site with spot readings or a logger, not both, in this window): whole-array copies.
  if (logger.n === 0) return spotsOnly(out, spots, sa, sb);
  if (sb === sa) return loggerOnly(out, logger, code);
  let i = sa;
  let j = 0;
  for (let k = 0; k < n; k++) {
    if (j >= logger.n || (i < sb && st[i] <= logger.time_ms[j])) {
      out.time_ms[k] = st[i];
      out.stage_m[k] = spots.stage_m[i];
      out.raw_m[k] = NaN;
      out.correction_m[k] = NaN;
      out.source[k] = spots.source[i];
      out.spot[k] = i;
      out.day[k] = -1;
      i++;
    } else {
      out.time_ms[k] = logger.time_ms[j];
      out.raw_m[k] = logger.raw_m[j];
      out.correction_m[k] = logger.correction_m[j];
      out.stage_m[k] = logger.raw_m[j] + logger.correction_m[j];
      out.source[k] = code;
      out.spot[k] = -1;
      out.day[k] = logger.day[j];
      j++;
    }
  }
  return out;
}

/** The record of spot readings sa..sb − 1 alone, into out (sized for them). */
function spotsOnly(out: StageRecord, spots: SpotSeries, sa: number, sb: number): StageRecord {
  copyRange(out.time_ms, spots.time_ms, sa, sb);
  copyRange(out.stage_m, spots.stage_m, sa, sb);
  copyRange(out.source, spots.source, sa, sb);
  out.raw_m.fill(NaN);
  out.correction_m.fill(NaN);
  out.day.fill(-1);
  for (let k = 0; k < sb - sa; k++) out.spot[k] = sa + k;
  return out;
}

/** The record of logger values alone, into out (sized for them). */
function loggerOnly(out: StageRecord, logger: LoggerPart, code: number): StageRecord {
  const n = logger.n;
  out.time_ms.set(logger.time_ms.subarray(0, n));
  out.raw_m.set(logger.raw_m.subarray(0, n));
  out.correction_m.set(logger.correction_m.subarray(0, n));
  out.day.set(logger.day.subarray(0, n));
  for (let k = 0; k < n; k++) out.stage_m[k] = logger.raw_m[k] + logger.correction_m[k];
  out.source.fill(code);
  out.spot.fill(-1);
  return out;
}

/** Copies source[a..b) to the start of target: one block copy from a typed array, else value by value. */
function copyRange(target: Float64Array | Uint8Array, source: ArrayLike<number>, a: number, b: number): void {
  if (source instanceof Float64Array || source instanceof Uint8Array) target.set(source.subarray(a, b));
  else for (let i = a; i < b; i++) target[i - a] = source[i];
}

/** Spot readings (any order) sorted by time, then id, with their arrays for joinStageRecord. */
export function spotSeriesOf<R extends { id: string; time_ms: number; stage_m: number; source: keyof typeof READING_SOURCE_CODES }>(
  readings: readonly R[],
): { readings: R[]; spots: SpotSeries } {
  const sorted = [...readings].sort((a, b) => a.time_ms - b.time_ms || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const n = sorted.length;
  const spots = { time_ms: new Float64Array(n), stage_m: new Float64Array(n), source: new Uint8Array(n) };
  sorted.forEach((r, i) => {
    spots.time_ms[i] = r.time_ms;
    spots.stage_m[i] = r.stage_m;
    spots.source[i] = READING_SOURCE_CODES[r.source];
  });
  return { readings: sorted, spots };
}

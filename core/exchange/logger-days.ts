// A corrected logger record cut into per-site, per-UTC-day records of compact arrays (the 'logger-day'
// sync kind), merged with a day already stored without doubling a time, and read back as stages.
import { cleanText, type LoggerDayBody, type LoggerDayCheck } from '../records/index';

/** Milliseconds in a UTC day: the width of one logger-day record. */
export const LOGGER_DAY_MS = 86_400_000;

/** A logger record to store: times (UTC ms, strictly ascending), raw values and corrections (m). */
export interface CorrectedLogger {
  time_ms: ArrayLike<number>;
  raw_m: ArrayLike<number>;
  correction_m: ArrayLike<number>;
}

/** Where a logger record came from: site, file name, the checks used and a note. */
export interface LoggerDayContext {
  siteId: string;
  fileName: string;
  checks: readonly LoggerDayCheck[];
  note?: string;
}

/** One 32-bit round of a string hash (MurmurHash3's finaliser over a multiplicative mix). */
function hash32(text: string, seed: number): number {
  let h = seed >>> 0;
  for (let i = 0; i < text.length; i++) {
    h = Math.imul(h ^ text.charCodeAt(i), 0x9e3779b1);
    h = (h << 13) | (h >>> 19);
  }
  h ^= text.length;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  return (h ^ (h >>> 16)) >>> 0;
}

/**
 * The id of the logger-day record of a site and UTC day: a UUID (version 8, name-based) derived from
 * both, so two phones that import the same day write the same record and sync merges it as one.
 */
export function loggerDayId(siteId: string, day: number): string {
  const name = `freshet-logger-day\u0000${siteId}\u0000${day}`;
  const hex = [0x243f6a88, 0x85a308d3, 0x13198a2e, 0x03707344].map((s) => hash32(name, s).toString(16).padStart(8, '0')).join('');
  const variant = ((parseInt(hex[16], 16) & 0x3) | 0x8).toString(16);
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-8${hex.slice(13, 16)}-${variant}${hex.slice(17, 20)}-${hex.slice(20, 32)}`;
}

/** The record cut into one body per UTC day (in day order); times must be whole ms and strictly ascending. */
export function splitLoggerDays(record: CorrectedLogger, context: LoggerDayContext): LoggerDayBody[] {
  const n = record.time_ms.length;
  if (record.raw_m.length !== n || record.correction_m.length !== n) {
    throw new RangeError(`splitLoggerDays needs one raw value and one correction per time; got ${n} times, ${record.raw_m.length} values, ${record.correction_m.length} corrections`);
  }
  const out: LoggerDayBody[] = [];
  // A file's name comes from the phone's file system, not from the user's typing: cleaned under the text
  // rule (core/records/text.ts) rather than refused, so an odd name never stops an import.
  const fileName = cleanText(context.fileName).text;
  let current: LoggerDayBody | undefined;
  let prev = -Infinity;
  for (let i = 0; i < n; i++) {
    const t = record.time_ms[i];
    if (!Number.isInteger(t) || t <= prev) throw new RangeError(`splitLoggerDays needs whole-ms times in strictly ascending order; time ${i} is ${t} after ${prev}`);
    prev = t;
    const day = Math.floor(t / LOGGER_DAY_MS);
    if (!current || current.day !== day) {
      current = {
        siteId: context.siteId, day, offset_ms: [], raw_m: [], correction_m: [],
        checks: context.checks.map((c) => ({ ...c })), fileName, note: context.note ?? '',
      };
      out.push(current);
    }
    current.offset_ms.push(t - day * LOGGER_DAY_MS);
    current.raw_m.push(record.raw_m[i]);
    current.correction_m.push(record.correction_m[i]);
  }
  return out;
}

/** What merging a new day into a stored one gives: the merged body and the times (UTC ms) already there. */
export interface LoggerDayMerge {
  body: LoggerDayBody;
  /** Times of the incoming day already held by the stored day: kept as stored, not doubled. */
  repeated_ms: number[];
}

/**
 * Merges an incoming day into the stored day of the same site and day: stored values stay (a time
 * already held is reported in repeated_ms, not doubled), new times are added in order. The file name,
 * note and checks become the incoming ones when it adds anything.
 */
export function mergeLoggerDay(stored: LoggerDayBody, incoming: LoggerDayBody): LoggerDayMerge {
  if (stored.siteId !== incoming.siteId || stored.day !== incoming.day) {
    throw new RangeError(`mergeLoggerDay needs two records of the same site and day; got day ${stored.day} and day ${incoming.day}`);
  }
  const body: LoggerDayBody = { ...incoming, offset_ms: [], raw_m: [], correction_m: [] };
  const repeated_ms: number[] = [];
  const a = stored.offset_ms;
  const b = incoming.offset_ms;
  let i = 0;
  let j = 0;
  while (i < a.length || j < b.length) {
    if (j >= b.length || (i < a.length && a[i] <= b[j])) {
      if (j < b.length && a[i] === b[j]) {
        repeated_ms.push(stored.day * LOGGER_DAY_MS + b[j]);
        j++;
      }
      body.offset_ms.push(a[i]);
      body.raw_m.push(stored.raw_m[i]);
      body.correction_m.push(stored.correction_m[i]);
      i++;
    } else {
      body.offset_ms.push(b[j]);
      body.raw_m.push(incoming.raw_m[j]);
      body.correction_m.push(incoming.correction_m[j]);
      j++;
    }
  }
  if (body.offset_ms.length === a.length) return { body: stored, repeated_ms };
  return { body, repeated_ms };
}

/** A logger day as arrays: times (UTC ms), corrected stages (raw + correction, m) and the raw values (m). */
export function loggerDayStages(day: LoggerDayBody): { time_ms: Float64Array; stage_m: Float64Array; raw_m: Float64Array } {
  const n = day.offset_ms.length;
  const time_ms = new Float64Array(n);
  const stage_m = new Float64Array(n);
  const raw_m = new Float64Array(n);
  const start = day.day * LOGGER_DAY_MS;
  for (let i = 0; i < n; i++) {
    time_ms[i] = start + day.offset_ms[i];
    raw_m[i] = day.raw_m[i];
    stage_m[i] = day.raw_m[i] + day.correction_m[i];
  }
  return { time_ms, stage_m, raw_m };
}

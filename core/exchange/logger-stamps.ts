// Reading one logger time stamp: its wall-clock fields in the chosen format and an offset if the stamp
// carries one; then the UTC instants a wall time can mean in a zone that changes its clocks.
import { wallTimeAt, zoneOffset_min } from '../time/index';
import type { LoggerTimeFormat } from './logger-mapping';

/** A stamp as written: naive wall time as if it were UTC (ms) and the offset written in it, if any (minutes east). */
export interface ParsedStamp {
  naive_ms: number;
  offset_min?: number;
}

const YMD = /^(\d{4})[-/](\d{1,2})[-/](\d{1,2})(?:[T ]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,3})\d*)?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const DMY = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})(?:[T ]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,3})\d*)?)?)?$/;

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/**
 * Reads a stamp in `format`; returns a plain sentence saying what is wrong (and what is expected) when it
 * cannot be read. Seconds and fractions are optional; a date alone means midnight.
 */
export function parseStamp(text: string, format: LoggerTimeFormat): ParsedStamp | string {
  const s = text.trim();
  let y: number, mo: number, d: number, rest: (string | undefined)[], zone: string | undefined;
  if (format === 'year-month-day') {
    const m = YMD.exec(s);
    if (!m) return `"${s}" is not a time written as year-month-day hour:minute (e.g. 2026-03-01 14:15)`;
    [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
    rest = m.slice(4, 8);
    zone = m[8];
  } else {
    const m = DMY.exec(s);
    const example = format === 'day-month-year' ? '01/03/2026 14:15' : '03/01/2026 14:15';
    if (!m) return `"${s}" is not a time written as ${format.replace(/-/g, '/')} hour:minute (e.g. ${example})`;
    const a = Number(m[1]);
    const b = Number(m[2]);
    [d, mo] = format === 'day-month-year' ? [a, b] : [b, a];
    y = Number(m[3]);
    rest = m.slice(4, 8);
  }
  const [hh, mi, ss] = rest.slice(0, 3).map((v) => (v === undefined ? 0 : Number(v)));
  const ms = rest[3] === undefined ? 0 : Number(rest[3].padEnd(3, '0'));
  if (mo < 1 || mo > 12 || d < 1 || d > daysInMonth(y, mo) || hh > 23 || mi > 59 || ss > 59) {
    return `"${s}" is not a real date and time`;
  }
  const naive_ms = Date.UTC(y, mo - 1, d, hh, mi, ss, ms);
  if (zone === undefined) return { naive_ms };
  if (zone.toUpperCase() === 'Z') return { naive_ms, offset_min: 0 };
  const digits = zone.replace(':', '');
  const sign = digits[0] === '-' ? -1 : 1;
  const oh = Number(digits.slice(1, 3));
  const om = digits.length > 3 ? Number(digits.slice(3, 5)) : 0;
  if (oh > 14 || om > 59) return `"${s}" has an impossible UTC offset ${zone}`;
  return { naive_ms, offset_min: sign * (oh * 60 + om) };
}

const DAY_MS = 86_400_000;

/**
 * Resolves naive wall times (as if UTC, ms) in an IANA zone to the UTC instants that show them: one in
 * ordinary times, two in the repeated hour when the clocks go back (earlier first), none in the hour
 * skipped when they go forward. Days without a clock change are cached, so a long file costs a few
 * zone look-ups a day.
 */
export function zoneResolver(timeZone: string): (naive_ms: number) => number[] {
  zoneOffset_min(0, timeZone); // throws a RangeError for an unknown zone name
  const steadyOffset = new Map<number, number | null>();
  return (naive_ms) => {
    const day = Math.floor(naive_ms / DAY_MS);
    let steady = steadyOffset.get(day);
    if (steady === undefined) {
      // The instants that can show a wall time of this day lie within a day either side of it.
      const probes = [day - 1, day - 0.5, day, day + 0.5, day + 1, day + 1.5, day + 2].map((x) => zoneOffset_min(x * DAY_MS, timeZone));
      steady = probes.every((o) => o === probes[0]) ? probes[0] : null;
      steadyOffset.set(day, steady);
    }
    if (steady !== null) return [naive_ms - steady * 60_000];
    const offsets = new Set<number>();
    for (const dt of [-DAY_MS, -DAY_MS / 2, 0, DAY_MS / 2, DAY_MS]) offsets.add(zoneOffset_min(naive_ms + dt, timeZone));
    const out: number[] = [];
    for (const off of offsets) {
      const t = naive_ms - off * 60_000;
      const w = wallTimeAt(t, timeZone);
      const shown = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) + (naive_ms % 1000);
      if (shown === naive_ms && !out.includes(t)) out.push(t);
    }
    return out.sort((a, b) => a - b);
  };
}

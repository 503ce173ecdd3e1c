// Reading one logger time stamp: its wall-clock fields in the chosen format and an offset if the stamp
// carries one; then the UTC instants a wall time can mean in a zone that changes its clocks.
import { daysInMonth, utcOfCivil, wallTimeAt, zoneOffset_min } from '../time/index';
import type { LoggerTimeFormat } from './logger-mapping';

/** A stamp as written: naive wall time as if it were UTC (ms) and the offset written in it, if any (minutes east). */
export interface ParsedStamp {
  naive_ms: number;
  offset_min?: number;
}

const YMD_DATE = /^(\d{4})[-/](\d{1,2})[-/](\d{1,2})$/;
const DMY_DATE = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/;
const TIME = /^(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,3})\d*)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

/** A reader of stamps in one format; it remembers the last date seen, since a logger writes many stamps a day. */
export function stampParser(format: LoggerTimeFormat): (text: string) => ParsedStamp | string {
  const example = format === 'year-month-day' ? '2026-03-01 14:15' : format === 'day-month-year' ? '01/03/2026 14:15' : '03/01/2026 14:15';
  const expected = `a time written as ${format === 'year-month-day' ? 'year-month-day' : format.replace(/-/g, '/')} hour:minute (e.g. ${example})`;
  let lastDate = '';
  let lastDay_ms: number | string = '';
  const dateOf = (d: string): number | string => {
    let y: number, mo: number, day: number;
    if (format === 'year-month-day') {
      const m = YMD_DATE.exec(d);
      if (!m) return 'format';
      [y, mo, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
    } else {
      const m = DMY_DATE.exec(d);
      if (!m) return 'format';
      const a = Number(m[1]);
      const b = Number(m[2]);
      [day, mo] = format === 'day-month-year' ? [a, b] : [b, a];
      y = Number(m[3]);
    }
    if (mo < 1 || mo > 12 || day < 1 || day > daysInMonth(y, mo)) return 'real';
    return utcOfCivil(y, mo, day);
  };
  return (text) => {
    const s = text.trim();
    const cut = s.search(/[T ]/);
    const datePart = cut < 0 ? s : s.slice(0, cut);
    const timePart = cut < 0 ? '' : s.slice(cut + 1).trimStart();
    if (datePart !== lastDate) {
      lastDate = datePart;
      lastDay_ms = dateOf(datePart);
    }
    if (lastDay_ms === 'format') return `"${s}" is not ${expected}`;
    if (lastDay_ms === 'real') return `"${s}" is not a real date and time`;
    if (timePart === '') return { naive_ms: lastDay_ms as number };
    const t = TIME.exec(timePart);
    if (!t || (format !== 'year-month-day' && t[5] !== undefined)) return `"${s}" is not ${expected}`;
    const hh = Number(t[1]);
    const mi = Number(t[2]);
    const ss = t[3] === undefined ? 0 : Number(t[3]);
    const ms = t[4] === undefined ? 0 : Number(t[4].padEnd(3, '0'));
    if (hh > 23 || mi > 59 || ss > 59) return `"${s}" is not a real date and time`;
    const naive_ms = (lastDay_ms as number) + ((hh * 60 + mi) * 60 + ss) * 1000 + ms;
    const zone = t[5];
    if (zone === undefined) return { naive_ms };
    if (zone.toUpperCase() === 'Z') return { naive_ms, offset_min: 0 };
    const digits = zone.replace(':', '');
    const sign = digits[0] === '-' ? -1 : 1;
    const oh = Number(digits.slice(1, 3));
    const om = digits.length > 3 ? Number(digits.slice(3, 5)) : 0;
    if (oh > 14 || om > 59) return `"${s}" has an impossible UTC offset ${zone}`;
    return { naive_ms, offset_min: sign * (oh * 60 + om) };
  };
}

/**
 * Reads a stamp in `format`; returns a plain sentence saying what is wrong (and what is expected) when it
 * cannot be read. Seconds and fractions are optional; a date alone means midnight.
 */
export function parseStamp(text: string, format: LoggerTimeFormat): ParsedStamp | string {
  return stampParser(format)(text);
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
      const shown = utcOfCivil(w.year, w.month, w.day, w.hour, w.minute, w.second) + (naive_ms % 1000);
      if (shown === naive_ms && !out.includes(t)) out.push(t);
    }
    return out.sort((a, b) => a - b);
  };
}

// ISO 8601 times with a zone's UTC offset, fast enough for whole records: the zone's offset is looked
// up about twice per UTC day (through core/time's Intl-based wallTimeAt, which costs tens of
// microseconds a call) and the text is built from UTC fields.
import { utcOfCivil, wallTimeAt } from '../time/index';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
const pad2 = (n: number) => (n < 10 ? `0${n}` : String(n));

/** The zone's offset from UTC at whole-second instant t (UTC ms), in seconds (old local mean times have seconds). */
function offset_s(t: number, timeZone: string): number {
  const w = wallTimeAt(t, timeZone);
  return (utcOfCivil(w.year, w.month, w.day, w.hour, w.minute, w.second) - t) / 1000;
}

/**
 * A formatter for one IANA time zone: time_ms (UTC ms) → "2026-12-01T10:15:00+13:00", the same text as
 * core/time's toIsoWithOffset. A span (a UTC day, else its hour) whose offset is the same at both ends
 * uses that offset throughout (no zone changes its offset twice within a day); an hour with a change
 * asks the zone for each instant. Fractions of a second are dropped, as toIsoWithOffset does.
 */
export function isoWithOffsetFormatter(timeZone: string): (time_ms: number) => string {
  const days = new Map<number, number | null>();
  const hours = new Map<number, number | null>();
  const steady = (spans: Map<number, number | null>, key: number, start: number, length: number): number | null => {
    let off = spans.get(key);
    if (off === undefined) {
      const a = offset_s(start, timeZone);
      off = a === offset_s(start + length - 1000, timeZone) ? a : null;
      spans.set(key, off);
    }
    return off;
  };
  return (time_ms: number): string => {
    if (!Number.isFinite(time_ms)) throw new RangeError(`A time must be a finite number of UTC ms; got ${time_ms}`);
    const t = Math.floor(time_ms / 1000) * 1000;
    const day = Math.floor(t / DAY_MS);
    const hour = Math.floor(t / HOUR_MS);
    const o = steady(days, day, day * DAY_MS, DAY_MS) ?? steady(hours, hour, hour * HOUR_MS, HOUR_MS) ?? offset_s(t, timeZone);
    const d = new Date(t + o * 1000);
    const y = d.getUTCFullYear();
    // The offset is written to the minute, as toIsoWithOffset does (ISO 8601 has no seconds in an offset).
    const m = Math.round(o / 60);
    const a = Math.abs(m);
    return `${y < 0 || y > 9999 ? String(y) : String(y).padStart(4, '0')}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())}T${pad2(d.getUTCHours())}:${pad2(d.getUTCMinutes())}:${pad2(d.getUTCSeconds())}${m < 0 ? '-' : '+'}${pad2(Math.floor(a / 60))}:${pad2(a % 60)}`;
  };
}

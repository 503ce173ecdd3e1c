// Wall-clock time in a site's IANA time zone, for showing and entering times. Inside, times are UTC
// epoch milliseconds; the zone rules come from the platform's Intl time-zone data.
import { MS_PER_DAY } from './day';

/** A wall-clock time in some zone: year, month 1–12, day, hour 0–23, minute, second. */
export interface WallTime {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat('en-GB', {
        timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit',
        hour: '2-digit', minute: '2-digit', second: '2-digit',
      });
    } catch {
      throw new RangeError(`Unknown time zone "${timeZone}"; use an IANA name such as "Europe/Oslo" or "UTC"`);
    }
    formatters.set(timeZone, f);
  }
  return f;
}

/** The wall-clock time at UTC instant time_ms in timeZone. */
export function wallTimeAt(time_ms: number, timeZone: string): WallTime {
  if (!Number.isFinite(time_ms)) throw new RangeError(`wallTimeAt needs a finite time in UTC ms; got ${time_ms}`);
  const parts = formatterFor(timeZone).formatToParts(new Date(time_ms));
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  return { year: get('year'), month: get('month'), day: get('day'), hour: get('hour'), minute: get('minute'), second: get('second') };
}

/** The zone's offset from UTC at instant time_ms, in minutes (east positive: +780 for UTC+13). */
export function zoneOffset_min(time_ms: number, timeZone: string): number {
  const w = wallTimeAt(time_ms, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return Math.round((asUtc - Math.floor(time_ms / 1000) * 1000) / 60_000);
}

/**
 * The UTC instant (ms) of a wall-clock time in timeZone. In a spring-forward gap the time is read
 * with the offset from before the change (so 02:30 in a skipped hour becomes 03:30); in an autumn
 * overlap the earlier of the two instants is returned.
 */
export function instantOf(wall: WallTime, timeZone: string): number {
  const fields = [wall.year, wall.month, wall.day, wall.hour, wall.minute, wall.second];
  if (!fields.every(Number.isFinite)) throw new RangeError('instantOf needs a complete wall-clock time (year, month, day, hour, minute, second)');
  const naive = Date.UTC(wall.year, wall.month - 1, wall.day, wall.hour, wall.minute, wall.second);
  // Try the offsets in force a day either side of the naive guess; keep the earliest that round-trips.
  const candidates = [...new Set([zoneOffset_min(naive - MS_PER_DAY, timeZone), zoneOffset_min(naive, timeZone), zoneOffset_min(naive + MS_PER_DAY, timeZone)])]
    .map((off) => naive - off * 60_000)
    .sort((a, b) => a - b);
  for (const t of candidates) {
    const back = wallTimeAt(t, timeZone);
    if (back.year === wall.year && back.month === wall.month && back.day === wall.day && back.hour === wall.hour && back.minute === wall.minute) return t;
  }
  // In a gap: no instant shows this wall time; use the offset from before the change.
  return naive - zoneOffset_min(naive - MS_PER_DAY, timeZone) * 60_000;
}

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** "YYYY-MM-DDTHH:mm" in timeZone, as an <input type="datetime-local"> holds it. */
export function toLocalInput(time_ms: number, timeZone: string): string {
  const w = wallTimeAt(time_ms, timeZone);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

/** Parses "YYYY-MM-DDTHH:mm[:ss]" as a wall-clock time in timeZone and returns UTC ms. */
export function fromLocalInput(text: string, timeZone: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(text.trim());
  if (!m) throw new RangeError(`A date and time is needed as YYYY-MM-DDTHH:mm; got "${text}"`);
  const [year, month, day, hour, minute, second] = m.slice(1).map((v) => Number(v ?? 0));
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 23 || minute > 59 || second > 59) {
    throw new RangeError(`"${text}" is not a real date and time`);
  }
  return instantOf({ year, month, day, hour, minute, second }, timeZone);
}

/** ISO 8601 with the zone's offset at that instant, e.g. "2026-12-01T10:15:00+13:00". */
export function toIsoWithOffset(time_ms: number, timeZone: string): string {
  const w = wallTimeAt(time_ms, timeZone);
  const off = zoneOffset_min(time_ms, timeZone);
  const sign = off < 0 ? '-' : '+';
  const a = Math.abs(off);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}${sign}${pad(Math.floor(a / 60))}:${pad(a % 60)}`;
}

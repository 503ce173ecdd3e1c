// Wall-clock time in a site's IANA time zone, for showing and entering times. Inside, times are UTC
// epoch milliseconds; the zone rules come from the platform's Intl time-zone data.
import { utcOfCivil } from './civil';
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
  const asUtc = utcOfCivil(w.year, w.month, w.day, w.hour, w.minute, w.second);
  return Math.round((asUtc - Math.floor(time_ms / 1000) * 1000) / 60_000);
}

/**
 * What a wall-clock time in a zone means: one instant (UTC ms); two (the hour repeated when clocks go
 * back: both instants show this wall time, earlier first); or none (the hour skipped when clocks go
 * forward: `candidates_ms` reads it with the offset after and before the change, earlier first, so the
 * user can say which was meant). Nothing is shifted silently.
 */
export type WallTimeAnswer =
  | { kind: 'one'; time_ms: number }
  | { kind: 'repeated'; candidates_ms: [number, number] }
  | { kind: 'gap'; candidates_ms: [number, number] };

/** Every instant (UTC ms) at which timeZone shows the wall time, or the gap it falls in. */
export function resolveWallTime(wall: WallTime, timeZone: string): WallTimeAnswer {
  const fields = [wall.year, wall.month, wall.day, wall.hour, wall.minute, wall.second];
  if (!fields.every(Number.isInteger)) throw new RangeError('A complete date and time is needed: year, month, day, hour and minute');
  const naive = utcOfCivil(wall.year, wall.month, wall.day, wall.hour, wall.minute, wall.second);
  // The offsets in force a day either side of the naive guess cover every change of a zone's offset
  // (the largest on record, Pacific/Apia skipping 30 December 2011, is one day).
  const offsets = [...new Set([zoneOffset_min(naive - MS_PER_DAY, timeZone), zoneOffset_min(naive, timeZone), zoneOffset_min(naive + MS_PER_DAY, timeZone)])];
  const candidates = [...new Set(offsets.map((off) => naive - off * 60_000))].sort((a, b) => a - b);
  const shows = candidates.filter((t) => {
    const back = wallTimeAt(t, timeZone);
    return back.year === wall.year && back.month === wall.month && back.day === wall.day && back.hour === wall.hour && back.minute === wall.minute;
  });
  if (shows.length === 1) return { kind: 'one', time_ms: shows[0] };
  if (shows.length >= 2) return { kind: 'repeated', candidates_ms: [shows[0], shows[shows.length - 1]] };
  return { kind: 'gap', candidates_ms: [candidates[0], candidates[candidates.length - 1]] };
}

/**
 * The UTC instant (ms) of a wall-clock time in timeZone. In an autumn overlap the earlier of the two
 * instants is returned (use resolveWallTime to ask which); a time in a spring-forward gap is refused.
 */
export function instantOf(wall: WallTime, timeZone: string): number {
  const a = resolveWallTime(wall, timeZone);
  if (a.kind === 'gap') throw new RangeError(gapSentence(wall, a.candidates_ms, timeZone));
  return a.kind === 'one' ? a.time_ms : a.candidates_ms[0];
}

/** The plain sentence for a wall time that does not exist in timeZone, naming the two times it may mean. */
export function gapSentence(wall: WallTime, candidates_ms: [number, number], timeZone: string): string {
  const typed = `${pad(wall.year, 4)}-${pad(wall.month)}-${pad(wall.day)} ${pad(wall.hour)}:${pad(wall.minute)}`;
  const [a, b] = candidates_ms.map((t) => toLocalInput(t, timeZone).slice(11));
  return `${typed} does not exist in ${timeZone}: the clocks went forward at that hour. Did you mean ${b} (on a watch not yet put forward) or ${a}?`;
}

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** "YYYY-MM-DDTHH:mm" in timeZone, as an <input type="datetime-local"> holds it. */
export function toLocalInput(time_ms: number, timeZone: string): string {
  const w = wallTimeAt(time_ms, timeZone);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

/** ISO 8601 with the zone's offset at that instant, e.g. "2026-12-01T10:15:00+13:00". */
export function toIsoWithOffset(time_ms: number, timeZone: string): string {
  const w = wallTimeAt(time_ms, timeZone);
  const off = zoneOffset_min(time_ms, timeZone);
  const sign = off < 0 ? '-' : '+';
  const a = Math.abs(off);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}${sign}${pad(Math.floor(a / 60))}:${pad(a % 60)}`;
}

// Times typed in a site's zone ("YYYY-MM-DDTHH:mm", as <input type="datetime-local"> holds them): read
// strictly (no 31 February, no year 0070 turned into 1970) and answered honestly (a skipped or repeated
// wall time is reported, never shifted).
import { daysInMonth } from './civil';
import { gapSentence, resolveWallTime, type WallTime, type WallTimeAnswer } from './zoned';

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** The wall time in "YYYY-MM-DDTHH:mm[:ss]"; throws a RangeError in plain words for anything else or an impossible date. */
export function parseLocalInput(text: string): WallTime {
  const shown = text.length > 40 ? `${text.slice(0, 36)}…` : text;
  const m = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2}))?$/.exec(text.trim());
  if (!m) throw new RangeError(`A date and time is needed as YYYY-MM-DD HH:mm; got "${shown}"`);
  const [year, month, day, hour, minute, second] = m.slice(1).map((v) => Number(v ?? 0));
  if (year < 1) throw new RangeError(`"${shown}" has year 0000; type the year in full, like 2026`);
  if (month < 1 || month > 12) throw new RangeError(`"${shown}" is not a real date: the month must be 01 to 12`);
  const days = daysInMonth(year, month);
  if (day < 1 || day > days) throw new RangeError(`"${shown}" is not a real date: ${MONTHS[month - 1]} ${year} has ${days} days`);
  if (hour > 23 || minute > 59 || second > 59) throw new RangeError(`"${shown}" is not a real time of day: use 00:00 to 23:59`);
  return { year, month, day, hour, minute, second };
}

/** What a typed wall time means in timeZone: one instant, two (repeated hour) or a gap (skipped hour), in UTC ms. */
export function readLocalInput(text: string, timeZone: string): WallTimeAnswer {
  return resolveWallTime(parseLocalInput(text), timeZone);
}

/**
 * Parses "YYYY-MM-DDTHH:mm[:ss]" as a wall-clock time in timeZone and returns UTC ms. A time in the
 * repeated hour gives the earlier instant (for windows and ranges; forms that store a time ask with
 * readLocalInput); a time the clocks skipped is refused with a sentence naming the two it may mean.
 */
export function fromLocalInput(text: string, timeZone: string): number {
  const wall = parseLocalInput(text);
  const a = resolveWallTime(wall, timeZone);
  if (a.kind === 'gap') throw new RangeError(gapSentence(wall, a.candidates_ms, timeZone));
  return a.kind === 'one' ? a.time_ms : a.candidates_ms[0];
}

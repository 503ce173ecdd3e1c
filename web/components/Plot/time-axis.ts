// The app's own time labels for plots: 24-hour clock, day-month dates, months and years in the site's
// zone, never the chart library's defaults. The finer part of a label comes first; the coarser part
// (day, year) is written under the first tick and under each tick where it changes.
import { wallTimeAt, type WallTime } from '../../../core';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const pad = (n: number) => String(n).padStart(2, '0');
const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

/** A day label such as "3 Dec" for a UTC ms time in the zone. */
export function dayLabel(time_ms: number, timeZone: string): string {
  const w = wallTimeAt(time_ms, timeZone);
  return `${w.day} ${MONTHS[w.month - 1]}`;
}

/** A clock label "14:05" (24-hour) for a UTC ms time in the zone. */
export function clockLabel(time_ms: number, timeZone: string): string {
  const w = wallTimeAt(time_ms, timeZone);
  return `${pad(w.hour)}:${pad(w.minute)}`;
}

/** How finely ticks step_ms apart are labelled: seconds, clock, days, months or years. */
export type TickGrain = 'second' | 'minute' | 'day' | 'month' | 'year';

/**
 * The grain for ticks step_ms (UTC ms) apart. Steps a little short of a day, month or year still count
 * as one (a day with a daylight-saving change is 23 h; a month is 28–31 days).
 */
export function tickGrain(step_ms: number): TickGrain {
  if (step_ms >= 360 * DAY_MS) return 'year';
  if (step_ms >= 28 * DAY_MS) return 'month';
  if (step_ms >= DAY_MS - HOUR_MS) return 'day';
  if (step_ms >= 60_000) return 'minute';
  return 'second';
}

/** The fine and coarse parts of one tick's label at a grain. */
function parts(w: WallTime, grain: TickGrain): [string, string] {
  switch (grain) {
    case 'second':
      return [`${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}`, `${w.day} ${MONTHS[w.month - 1]}`];
    case 'minute':
      return [`${pad(w.hour)}:${pad(w.minute)}`, `${w.day} ${MONTHS[w.month - 1]}`];
    case 'day':
      return [`${w.day} ${MONTHS[w.month - 1]}`, String(w.year)];
    case 'month':
      return [MONTHS[w.month - 1], String(w.year)];
    case 'year':
      return [String(w.year), ''];
  }
}

/**
 * Tick labels for times (UTC ms) spaced step_ms apart, in the zone: the clock for steps under a day (with
 * seconds under a minute), the day and month for daily steps, the month for monthly steps, the year for
 * yearly ones. The coarser part (the date under the clock, the year under a day or month) is added on a
 * second line under the first tick and under each tick where it changes.
 */
export function timeTickLabels(ticks_ms: readonly number[], step_ms: number, timeZone: string): string[] {
  const grain = tickGrain(step_ms);
  let last: string | undefined;
  return ticks_ms.map((t) => {
    if (!Number.isFinite(t)) return '';
    const [fine, coarse] = parts(wallTimeAt(t, timeZone), grain);
    const label = coarse === '' || coarse === last ? fine : `${fine}\n${coarse}`;
    last = coarse;
    return label;
  });
}

/** An axis number with no more decimals than its tick spacing needs (spacing in the same unit). */
export function numberTickLabel(v: number, spacing: number): string {
  if (v === 0) return '0';
  let decimals = 0;
  // The fewest decimals that write the spacing exactly (2.5 needs one, 0.05 two).
  while (decimals < 6 && Math.abs(spacing * 10 ** decimals - Math.round(spacing * 10 ** decimals)) > 1e-6 * Math.max(1, spacing * 10 ** decimals)) decimals++;
  const abs = Math.abs(v);
  return abs >= 1000 && decimals === 0 ? Math.round(v).toLocaleString('en') : v.toFixed(decimals);
}

// The app's own time labels for plots: 24-hour clock and day-month dates in the site's zone, never the
// chart library's defaults.
import { wallTimeAt } from '../../../core';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const pad = (n: number) => String(n).padStart(2, '0');

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

/**
 * Tick labels for times (UTC ms) spaced step_ms apart: dates alone for steps of a day or more; otherwise
 * the clock, with the date under the first tick and under each tick that starts a new day.
 */
export function timeTickLabels(ticks_ms: readonly number[], step_ms: number, timeZone: string): string[] {
  if (step_ms >= 86_400_000 - 3_600_000) return ticks_ms.map((t) => dayLabel(t, timeZone));
  let lastDay = '';
  return ticks_ms.map((t) => {
    const day = dayLabel(t, timeZone);
    const clock = clockLabel(t, timeZone);
    const label = day === lastDay ? clock : `${clock}\n${day}`;
    lastDay = day;
    return label;
  });
}

/** An axis number with no more decimals than its tick spacing needs (spacing in the same unit). */
export function numberTickLabel(v: number, spacing: number): string {
  if (v === 0) return '0';
  const decimals = spacing > 0 ? Math.max(0, Math.min(6, -Math.floor(Math.log10(spacing) + 1e-9))) : 2;
  const abs = Math.abs(v);
  return abs >= 1000 && decimals === 0 ? Math.round(v).toLocaleString('en') : v.toFixed(decimals);
}

// The moments a zone's clocks change (daylight saving on or off, or a change of standard offset) within
// a span, found from the platform's IANA time-zone data: one probe every 6 hours, then bisection to the ms.
import { zoneOffset_min } from './zoned';

/** A clock change: the UTC instant it takes effect (ms) and the zone's offset before and after (minutes east). */
export interface ClockChange {
  at_ms: number;
  before_min: number;
  after_min: number;
}

const STEP_MS = 6 * 3_600_000;

/** The clock changes of timeZone with from_ms < at_ms ≤ to_ms (UTC ms), oldest first. */
export function clockChanges(timeZone: string, from_ms: number, to_ms: number): ClockChange[] {
  if (!Number.isFinite(from_ms) || !Number.isFinite(to_ms) || to_ms < from_ms) {
    throw new RangeError(`clockChanges needs a finite span with from_ms ≤ to_ms (UTC ms); got ${from_ms} to ${to_ms}`);
  }
  const out: ClockChange[] = [];
  let t = from_ms;
  let off = zoneOffset_min(t, timeZone);
  while (t < to_ms) {
    const next = Math.min(to_ms, t + STEP_MS);
    const nextOff = zoneOffset_min(next, timeZone);
    if (nextOff !== off) {
      // The change lies in (t, next]: bisect to the first ms with the new offset.
      let lo = t;
      let hi = next;
      while (hi - lo > 1) {
        const mid = Math.floor((lo + hi) / 2);
        if (zoneOffset_min(mid, timeZone) === off) lo = mid;
        else hi = mid;
      }
      out.push({ at_ms: hi, before_min: off, after_min: nextOff });
    }
    t = next;
    off = nextOff;
  }
  return out;
}

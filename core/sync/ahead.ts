// Revisions dated ahead of the receiver's clock: a phone with a wrong date writes revisions that would win
// every later comparison. Merge still applies them (every replica must reach the same state whatever
// its clock), but flags them so a person sees what they replaced.
import { parseRev } from '../records/hlc';

/**
 * How far a revision may run ahead of the receiver's clock before it is flagged, ms: 10 minutes, well
 * above the skew of clocks kept by network time (common practice) and well below a wrong date or zone.
 */
export const AHEAD_TOLERANCE_MS = 10 * 60_000;

/** True when the revision's wall time is more than tolerance_ms ahead of now_ms (both UTC ms). */
export function isAhead(rev: string, now_ms: number, tolerance_ms: number = AHEAD_TOLERANCE_MS): boolean {
  if (!Number.isFinite(now_ms)) throw new RangeError(`isAhead needs the receiver's clock in UTC ms; got ${now_ms}`);
  return parseRev(rev).wall_ms > now_ms + tolerance_ms;
}

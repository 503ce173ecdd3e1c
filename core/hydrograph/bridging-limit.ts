// The bridging limit of DOMAIN.md §4: the longest gap inside a record that is bridged rather than ending it,
// and the record's usual step it is counted in (also the measure of a logger file's holes, logger-gaps.ts).

const HOUR_MS = 3_600_000;
/** The bridging limit is at least this long, ms (1 h). */
export const BRIDGING_LIMIT_MIN_MS = HOUR_MS;
/** The bridging limit is never longer than this, ms (6 h). */
export const BRIDGING_LIMIT_MAX_MS = 6 * HOUR_MS;
/** The bridging limit spans this many of the record's usual steps (before the bounds above). */
export const BRIDGING_LIMIT_STEPS = 12;

/** The record's usual step, ms: the median of its steps (the lower middle one of an even count; 0 with fewer than two values). */
export function usualStep_ms(time_ms: ArrayLike<number>): number {
  const n = time_ms.length;
  if (n < 2) return 0;
  const steps = new Float64Array(n - 1);
  for (let i = 1; i < n; i++) steps[i - 1] = time_ms[i] - time_ms[i - 1];
  steps.sort();
  return steps[(steps.length - 1) >> 1];
}

/**
 * The bridging limit (ms) of a record whose usual step is usualStep_ms (ms): max(12 × step, 1 h), never
 * more than 6 h (5-minute data: 1 h; 15-minute data: 3 h; hourly data: 6 h). Our rule, DOMAIN.md §4.
 */
export function bridgingLimit_ms(usualStep_ms: number): number {
  if (typeof usualStep_ms !== 'number' || !(usualStep_ms > 0) || !Number.isFinite(usualStep_ms)) {
    throw new RangeError(`bridgingLimit_ms needs the record's usual step as a time above 0 ms; got ${String(usualStep_ms)}`);
  }
  return Math.min(BRIDGING_LIMIT_MAX_MS, Math.max(BRIDGING_LIMIT_STEPS * usualStep_ms, BRIDGING_LIMIT_MIN_MS));
}

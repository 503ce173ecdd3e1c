// The walks from the peak that bound one storm on a noisy record: back to its rise start, on to its end or
// the next storm. Rules and tolerances as DOMAIN.md §4 "key points on field records (noise)" states them.

/** Share of the rise, and multiple of the noise σ, within which a reading is at the pre-event level. */
export const RISE_START_SHARE = 0.01;
export const RISE_START_SIGMAS = 4;
/** Share of the rise, and multiple of σ, a re-rise must exceed to count as another storm or burst. */
export const RE_RISE_SHARE = 0.05;
export const RE_RISE_SIGMAS = 6;
/** A dip that stays more than this share of the rise above the pre-event level does not split a storm. */
export const BURST_DIP_SHARE = 0.25;
/** A storm must stand at least this many σ above its pre-event level. */
export const STORM_SIGMAS = 10;

/** Where the storm starts: the pre-event level (m³/s), the reading it was found at, the rise start, bursts merged. */
export interface RiseWalk {
  level_m3s: number;
  levelIndex: number;
  riseStart: number;
  burstsBefore: number;
}

/**
 * Walks back from the peak over the whole rising limb (on the lightly smoothed copy `s`): a dip followed,
 * going back, by an earlier rise is the edge of the storm only when the dip is within a quarter of the rise
 * of the lowest flow before the peak; otherwise that earlier rise is a burst of the same storm. The rise
 * start is then the last raw reading before the peak within max(1 % of the rise, 4σ) of the level.
 */
export function walkBack(q: Float64Array, s: Float64Array, peak: number, sigma: number): RiseWalk {
  let base = s[peak];
  for (let i = 0; i < peak; i++) if (s[i] < base) base = s[i];
  const peakQ = q[peak];
  let low = s[peak];
  let lowIndex = peak;
  let bursts = 0;
  let climbing = false;
  for (let i = peak - 1; i >= 0; i--) {
    const v = s[i];
    if (v < low) {
      low = v;
      lowIndex = i;
      climbing = false;
      continue;
    }
    if (climbing || !(v > low + Math.max(RE_RISE_SHARE * (peakQ - low), RE_RISE_SIGMAS * sigma))) continue;
    if (low - base <= BURST_DIP_SHARE * (peakQ - base)) break;
    bursts++;
    climbing = true;
  }
  const tolerance = Math.max(RISE_START_SHARE * (peakQ - low), RISE_START_SIGMAS * sigma);
  let rise = Math.min(lowIndex, peak - 1);
  for (let i = peak - 1; i >= lowIndex; i--) {
    if (q[i] <= low + tolerance) {
      rise = i;
      break;
    }
  }
  return { level_m3s: low, levelIndex: lowIndex, riseStart: rise, burstsBefore: bursts };
}

/** Where the storm ends: the last reading of its falling limb, the last burst's peak, bursts merged, next storm found. */
export interface FallWalk {
  fallEnd: number;
  lastPeak: number;
  burstsAfter: number;
  nextStorm: boolean;
}

/**
 * Walks on from the peak (on `s`): a re-rise beyond max(5 % of the rise, 6σ) from a dip within a quarter of
 * the rise of the pre-event level is the next storm, and the falling limb ends at that dip; a re-rise from a
 * higher dip is another burst of this storm, and the end of runoff is then counted from its peak.
 */
export function walkOn(q: Float64Array, s: Float64Array, peak: number, level_m3s: number, sigma: number): FallWalk {
  const n = s.length;
  const rise = q[peak] - level_m3s;
  const reRise = Math.max(RE_RISE_SHARE * rise, RE_RISE_SIGMAS * sigma);
  const dipLimit = level_m3s + BURST_DIP_SHARE * rise;
  let falling = true;
  let trough = peak;
  let top = peak;
  let burstFrom = peak;
  let lastPeak = peak;
  let bursts = 0;
  for (let i = peak + 1; i < n; i++) {
    const v = s[i];
    if (falling) {
      if (v <= s[trough]) trough = i;
      else if (v > s[trough] + reRise) {
        if (s[trough] <= dipLimit) return { fallEnd: trough, lastPeak, burstsAfter: bursts, nextStorm: true };
        falling = false;
        top = i;
        burstFrom = trough;
      }
    } else if (v >= s[top]) top = i;
    else if (v < s[top] - reRise) {
      falling = true;
      trough = i;
      lastPeak = highestBetween(q, burstFrom, i);
      bursts++;
    }
  }
  if (!falling) {
    lastPeak = highestBetween(q, burstFrom, n - 1);
    bursts++;
  }
  return { fallEnd: n - 1, lastPeak, burstsAfter: bursts, nextStorm: false };
}

/** Index of the highest raw reading from `from` to `until` (inclusive): a burst's peak, from its dip on. */
function highestBetween(q: Float64Array, from: number, until: number): number {
  let best = from;
  for (let i = from + 1; i <= until; i++) if (q[i] > q[best]) best = i;
  return best;
}

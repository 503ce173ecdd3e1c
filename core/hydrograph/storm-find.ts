// The storms in a site's stage record, newest first, found only where the record is continuous
// (DOMAIN.md §4, gaps and spot readings): the record is cut at every gap longer than the bridging limit,
// each continuous stretch is searched for storms (key points on the whole stretch, then again on the parts
// before and after each storm found), and each storm's figures are those of the analysis it opens: its
// window, its key points found again there, and the method given.
import { bridgingLimit_ms, usualStep_ms } from './bridging-limit';
import { findEventPointsDetailed, runoffDuration_days } from './key-points';
import { usesKeyPoints, type SeparationMethod } from './methods';
import { separateBaseflowDetailed } from './separate';
import { summarizeEvent } from './summary';
import type { EventPoints } from './series';
import { sortedIndex } from '../sorted';

/** A discharge record: times (UTC ms, ascending) and discharges (m³/s), as typed arrays. */
export interface StormSearchSeries {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
}

/** A storm found: key points (UTC ms) and figures of its analysis window, which it opens. */
export interface StormFound {
  points: EventPoints;
  /** The analysis window it opens (UTC ms, whole minutes), inside one continuous stretch of the record. */
  window: { from_ms: number; to_ms: number };
  peak_m3s: number;
  duration_days: number;
  /** Direct runoff volume by the method given, from rise start to end of runoff, m³. */
  volume_m3: number;
  /** The same as a depth over the catchment, mm (with an area only). */
  depth_mm?: number;
}

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;

/** Fewest readings a stretch of record needs to be searched for a storm (three hours of 15-minute values). */
export const MIN_STORM_READINGS = 12;
/**
 * A rise counts as a storm when its peak is at least this many times the flow at its start (our choice:
 * it keeps day-to-day wobbles of a low flow out of the list).
 */
export const STORM_PEAK_RATIO = 1.5;
/** At most this many storms are listed. */
export const MAX_STORMS = 12;


/** The continuous stretches of a record (index ranges [a, b), b exclusive): no step inside longer than limit_ms. */
export function continuousStretches(time_ms: ArrayLike<number>, limit_ms: number): [number, number][] {
  const out: [number, number][] = [];
  const n = time_ms.length;
  let a = 0;
  for (let i = 1; i <= n; i++) {
    if (i === n || time_ms[i] - time_ms[i - 1] > limit_ms) {
      if (n > 0) out.push([a, i]);
      a = i;
    }
  }
  return out;
}

/**
 * The window to analyse a storm in (UTC ms): from well before its rise (filters settle on the flow before
 * the storm) to a while after its end, in whole minutes, kept inside the stretch of record [first_ms, last_ms].
 */
export function stormWindow(points: EventPoints, area_km2: number | undefined, stretch: { first_ms: number; last_ms: number }) {
  const length = points.runoffEnd_ms - points.riseStart_ms;
  const before = Math.max(3 * DAY_MS, length);
  const after = Math.max(DAY_MS, 0.5 * length, area_km2 === undefined ? 0 : 0.5 * runoffDuration_days(area_km2) * DAY_MS);
  // Whole minutes, so the window reads back exactly from the minute fields that show it.
  return {
    from_ms: Math.max(stretch.first_ms, Math.floor((points.riseStart_ms - before) / MINUTE_MS) * MINUTE_MS),
    to_ms: Math.min(stretch.last_ms, Math.ceil((points.runoffEnd_ms + after) / MINUTE_MS) * MINUTE_MS),
  };
}

function sub(s: StormSearchSeries, a: number, b: number): StormSearchSeries {
  return { time_ms: s.time_ms.subarray(a, b), discharge_m3s: s.discharge_m3s.subarray(a, b) };
}

/** Key points of a series, or undefined where the core finds no storm (a RangeError). */
function pointsOf(s: StormSearchSeries, area_km2: number | undefined): EventPoints | undefined {
  try {
    return findEventPointsDetailed(s, area_km2 === undefined ? undefined : { area_km2 }).points;
  } catch (e) {
    if (e instanceof RangeError) return undefined;
    throw e;
  }
}

/** The storm's figures in its window, as the analysis it opens gives them (undefined when it gives none). */
function figures(s: StormSearchSeries, method: SeparationMethod, area_km2: number | undefined): { points: EventPoints; volume_m3: number; depth_mm?: number } | undefined {
  const points = pointsOf(s, area_km2);
  if (!points) return undefined;
  try {
    const separated = usesKeyPoints(method.kind) ? separateBaseflowDetailed(s, method, { points, area_km2 }) : separateBaseflowDetailed(s, method, { area_km2 });
    const nodes = separated.baseflowAtPoints;
    const summary = summarizeEvent(s, separated.baseflow, { area_km2, from_ms: points.riseStart_ms, to_ms: points.runoffEnd_ms, ...(nodes ? { baseflowAtPoints: nodes } : {}) });
    return { points, volume_m3: summary.directVolume_m3, ...(summary.runoffDepth_mm !== undefined ? { depth_mm: summary.runoffDepth_mm } : {}) };
  } catch (e) {
    if (e instanceof RangeError) return undefined;
    throw e;
  }
}

/**
 * Storms in a record (times ascending; any mix of logger values and spot readings), newest peak first, at
 * most MAX_STORMS. Only continuous stretches are searched (no step longer than the bridging limit of the
 * record's usual step), so a storm never spans a longer gap and scattered spot readings are never one.
 * Each storm's points and figures are those found in its window with `method` (what the analysis shows
 * when the storm is opened with that method and its points as found).
 */
export function findStorms(series: StormSearchSeries, options: { area_km2?: number; method: SeparationMethod }): StormFound[] {
  const { area_km2, method } = options;
  const step_ms = usualStep_ms(series.time_ms);
  if (!(step_ms > 0)) return [];
  const limit = bridgingLimit_ms(step_ms);
  const found: StormFound[] = [];
  for (const [sa, sb] of continuousStretches(series.time_ms, limit)) {
    const stretch = { first_ms: series.time_ms[sa], last_ms: series.time_ms[sb - 1] };
    const parts: [number, number][] = [[sa, sb]];
    while (parts.length > 0 && found.length < MAX_STORMS * 2) {
      const [a, b] = parts.pop()!;
      if (b - a < MIN_STORM_READINGS) continue;
      const p = pointsOf(sub(series, a, b), area_km2);
      if (!p) continue;
      const rise = a + Math.min(b - a - 1, sortedIndex(series.time_ms.subarray(a, b), p.riseStart_ms, false));
      const end = a + Math.min(b - a - 1, sortedIndex(series.time_ms.subarray(a, b), p.runoffEnd_ms, false));
      const peak = a + Math.min(b - a - 1, sortedIndex(series.time_ms.subarray(a, b), p.peak_ms, false));
      parts.push([a, rise]);
      parts.push([end + 1, b]);
      if (!(series.discharge_m3s[peak] >= STORM_PEAK_RATIO * series.discharge_m3s[rise]) || end <= rise) continue;
      const window = stormWindow(p, area_km2, stretch);
      const wa = sortedIndex(series.time_ms, window.from_ms, false);
      const wb = sortedIndex(series.time_ms, window.to_ms, true);
      const f = figures(sub(series, wa, wb), method, area_km2);
      if (!f) continue;
      const q = series.discharge_m3s.subarray(wa, wb);
      const at = sortedIndex(series.time_ms.subarray(wa, wb), f.points.peak_ms, false);
      found.push({
        points: f.points, window, peak_m3s: q[Math.min(at, q.length - 1)],
        duration_days: (f.points.runoffEnd_ms - f.points.riseStart_ms) / DAY_MS,
        volume_m3: f.volume_m3, ...(f.depth_mm !== undefined ? { depth_mm: f.depth_mm } : {}),
      });
    }
  }
  // One storm found from two parts of a stretch opens the same window: keep it once.
  const seen = new Set<string>();
  return found
    .sort((x, y) => y.points.peak_ms - x.points.peak_ms)
    .filter((s) => {
      const key = `${s.window.from_ms}-${s.window.to_ms}-${s.points.peak_ms}`;
      if (seen.has(key)) return false;
      seen.add(key);
      return true;
    })
    .slice(0, MAX_STORMS);
}

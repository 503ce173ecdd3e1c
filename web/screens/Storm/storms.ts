// The storms in a site's recent record, newest first: the core's key points found on the whole record,
// then again on the parts before and after each storm found, until no part holds another.
import { runoffDuration_days, type EventPoints } from '../../../core';
import { analyse, findPoints, type StormSeries } from './analysis';

/** A storm found in the record: its key points (UTC ms), peak (m³/s), length (days) and direct runoff. */
export interface StormFound {
  points: EventPoints;
  peak_m3s: number;
  duration_days: number;
  /** Direct runoff volume under a straight line from rise start to end of runoff, m³. */
  volume_m3: number;
  /** The same as a depth over the catchment, mm (with an area only). */
  depth_mm?: number;
}

const MINUTE_MS = 60_000;

/** Fewest readings a part of the record needs to be searched for a storm. */
const MIN_READINGS = 12;
/**
 * A rise counts as a storm when its peak is at least this many times the flow at its start (our choice:
 * it keeps day-to-day wobbles of a low flow out of the list).
 */
export const STORM_PEAK_RATIO = 1.5;
/** At most this many storms are listed. */
export const MAX_STORMS = 12;

function part(series: StormSeries, a: number, b: number): StormSeries {
  return {
    time_ms: series.time_ms.subarray(a, b),
    discharge_m3s: series.discharge_m3s.subarray(a, b),
    stage_m: series.stage_m.subarray(a, b),
    extrapolated: series.extrapolated.subarray(a, b),
  };
}

function indexOf(t: Float64Array, at_ms: number): number {
  let i = 0;
  while (i < t.length - 1 && t[i] < at_ms) i++;
  return i;
}

/** Storms in the series (times ascending), newest peak first, at most MAX_STORMS. */
export function findStorms(series: StormSeries, area_km2: number | undefined): StormFound[] {
  const found: StormFound[] = [];
  const parts: [number, number][] = [[0, series.time_ms.length]];
  while (parts.length > 0 && found.length < MAX_STORMS) {
    const [a, b] = parts.pop()!;
    if (b - a < MIN_READINGS) continue;
    const s = part(series, a, b);
    const r = findPoints(s, area_km2);
    if (!r.ok) continue;
    const p = r.value.points;
    const rise = indexOf(s.time_ms, p.riseStart_ms);
    const end = indexOf(s.time_ms, p.runoffEnd_ms);
    const peak = indexOf(s.time_ms, p.peak_ms);
    parts.push([a, a + rise]);
    parts.push([a + end + 1, b]);
    if (!(s.discharge_m3s[peak] >= STORM_PEAK_RATIO * s.discharge_m3s[rise]) || end <= rise) continue;
    const result = analyse(s, p, { kind: 'straight-line' }, area_km2, undefined);
    if (!result.ok) continue;
    const storm: StormFound = {
      points: p,
      peak_m3s: s.discharge_m3s[peak],
      duration_days: (p.runoffEnd_ms - p.riseStart_ms) / 86_400_000,
      volume_m3: result.value.summary.directVolume_m3,
    };
    if (result.value.summary.runoffDepth_mm !== undefined) storm.depth_mm = result.value.summary.runoffDepth_mm;
    found.push(storm);
  }
  return found.sort((x, y) => y.points.peak_ms - x.points.peak_ms);
}

/**
 * The readings window to analyse a storm in (UTC ms): from well before its rise (filters settle on the
 * flow before the storm) to a while after its end, in whole minutes, kept inside the record.
 */
export function stormWindow(points: EventPoints, area_km2: number | undefined, record: { first_ms: number; last_ms: number }) {
  const day = 86_400_000;
  const length = points.runoffEnd_ms - points.riseStart_ms;
  const before = Math.max(3 * day, length);
  const after = Math.max(day, 0.5 * length, area_km2 === undefined ? 0 : 0.5 * runoffDuration_days(area_km2) * day);
  // Whole minutes, so the window reads back exactly from the minute fields that show it.
  return {
    from_ms: Math.max(record.first_ms, Math.floor((points.riseStart_ms - before) / MINUTE_MS) * MINUTE_MS),
    to_ms: Math.min(record.last_ms, Math.ceil((points.runoffEnd_ms + after) / MINUTE_MS) * MINUTE_MS),
  };
}

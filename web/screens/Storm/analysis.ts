// Glue between the stored series and the core's storm functions: one discharge per time, the method the
// user picked as a core SeparationMethod, and the whole analysis as one result or one plain error.
import {
  seriesFromReadings as coreSeriesFromReadings,
  findEventPointsDetailed,
  separateBaseflowDetailed,
  summarizeEvent,
  type EventPoints,
  type EventSummary,
  type SeparationMethod,
  type SeparationResult,
  type SeriesFromReadings as CoreSeriesFromReadings,
} from '../../../core';
import type { SeriesWithDischarge } from '../../db';
import { plainError } from '../../plain-words';
import { METHOD_KINDS, METHOD_LABELS } from '../../components/SeparationPicker';
import { usesKeyPoints } from './method-choice';

/** A discharge record ready for the core: times (UTC ms, ascending) and discharges (m³/s). */
export interface StormSeries {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
  /** Stage (m) of the same readings, averaged as the discharges are. */
  stage_m: Float64Array;
  /** 1 where the discharge is extrapolated beyond the rating's gauged range, else 0. */
  extrapolated: Uint8Array;
}

/** What was made of the stored readings of a window: the storm series, or why there is none. */
export type SeriesFromReadings =
  | { kind: 'ready'; series: StormSeries; skipped: number; extrapolated: number }
  | Exclude<CoreSeriesFromReadings, { kind: 'ready' }>;

/**
 * One reading per time from a window's stored series, by the core's rule (logger wins at a shared time,
 * manual readings averaged). The stages and the extrapolated flags go through the same rule, so the stage
 * shown beside a discharge is the one that made it.
 */
export function seriesFromReadings(rows: SeriesWithDischarge): SeriesFromReadings {
  const made = coreSeriesFromReadings(rows);
  if (made.kind !== 'ready') return made;
  const stages = coreSeriesFromReadings({ ...rows, discharge_m3s: rows.stage_m });
  const flags = coreSeriesFromReadings({ ...rows, discharge_m3s: Float64Array.from(rows.extrapolated) });
  if (stages.kind !== 'ready' || flags.kind !== 'ready') throw new Error('The stages of a window could not be lined up with its discharges.');
  const extrapolated = Uint8Array.from(flags.series.discharge_m3s, (f) => (f > 0 ? 1 : 0));
  return {
    kind: 'ready',
    series: { ...made.series, stage_m: stages.series.discharge_m3s, extrapolated },
    skipped: made.skipped,
    extrapolated: made.extrapolated,
  };
}

/** A computation that either gave a value or stopped with a plain sentence (from a core RangeError). */
export type Outcome<T> = { ok: true; value: T } | { ok: false; message: string };

/**
 * A core message made fit for the screen: method kinds become their plain names; a message that still
 * holds a function or field name, or a raw millisecond time, is replaced by a plain sentence.
 */
export function plainMessage(err: unknown): string {
  return plainError(err, { terms: METHOD_TERMS, fallback: STORM_FALLBACK });
}

/** Method kinds in core messages, as the screen names them. */
const METHOD_TERMS: Record<string, string> = Object.fromEntries(METHOD_KINDS.map((k) => [k, METHOD_LABELS[k].toLowerCase()]));
const STORM_FALLBACK = 'These key points or settings do not give a storm the methods can work with. Move the points or reset them.';

/** Runs fn, turning a RangeError into a plain message; other errors are bugs and propagate. */
export function attempt<T>(fn: () => T): Outcome<T> {
  try {
    return { ok: true, value: fn() };
  } catch (e) {
    if (e instanceof RangeError) return { ok: false, message: plainMessage(e) };
    throw e;
  }
}

/** Key points found by the core (UTC ms) with its notes. */
export function findPoints(series: StormSeries, area_km2: number | undefined): Outcome<{ points: EventPoints; notes: string[] }> {
  return attempt(() => findEventPointsDetailed(series, area_km2 === undefined ? undefined : { area_km2 }));
}

/** Everything the results show: baseflow (m³/s per reading), the summary and the notes of every step. */
export interface StormResult {
  method: SeparationMethod;
  baseflow_m3s: Float64Array;
  summary: EventSummary;
  notes: string[];
  /** Why this method's volume stays out of the range's spread on this storm (daily-only, restarted in it). */
  leftOut?: string;
}

// Baseflow of the methods that do not use the key points depends only on the series and the method, so a
// key point dragged across the plot reuses it instead of filtering the whole window again.
const filtered = new WeakMap<StormSeries, Map<string, SeparationResult>>();

/** Baseflow (m³/s per reading) with the core's notes; filter and minima results are kept per series. */
export function baseflowOf(series: StormSeries, points: EventPoints, method: SeparationMethod, area_km2: number | undefined): SeparationResult {
  if (usesKeyPoints(method.kind)) return separateBaseflowDetailed(series, method, { points, area_km2 });
  let cache = filtered.get(series);
  if (!cache) filtered.set(series, (cache = new Map()));
  const key = JSON.stringify([method, area_km2]);
  let hit = cache.get(key);
  if (!hit) {
    const r = separateBaseflowDetailed(series, method, { area_km2 });
    hit = { baseflow: r.baseflow, notes: r.notes, ...(r.restarts && { restarts: r.restarts }), ...(r.dailyOnly && { dailyOnly: r.dailyOnly }) };
    cache.set(key, hit);
  }
  return hit;
}

/** Separates baseflow and summarises the event from the rise start to the end of runoff (m³, mm, m³/s). */
export function analyse(
  series: StormSeries,
  points: EventPoints,
  method: SeparationMethod,
  area_km2: number | undefined,
  rainfall_mm: number | undefined,
): Outcome<StormResult> {
  return attempt(() => {
    const separated = baseflowOf(series, points, method, area_km2);
    // The baseflow at the key points joins the trapezoid where the line bends (key-point methods only).
    const nodes = separated.baseflowAtPoints;
    const summary = summarizeEvent(series, separated.baseflow, {
      area_km2,
      rainfall_mm,
      from_ms: points.riseStart_ms,
      to_ms: points.runoffEnd_ms,
      ...(nodes ? { baseflowAtPoints: nodes } : {}),
    });
    const notes = [...new Set([...separated.notes, ...summary.notes])];
    const restartedInside = (separated.restarts ?? []).some((g) => g.to_ms > points.riseStart_ms && g.from_ms < points.runoffEnd_ms);
    const leftOut = separated.dailyOnly ?? (restartedInside ? 'it restarted after a gap too long to bridge inside the storm, so its baseflow there does not follow the flow before the gap.' : undefined);
    return { method, baseflow_m3s: separated.baseflow, summary, notes, ...(leftOut && { leftOut }) };
  });
}

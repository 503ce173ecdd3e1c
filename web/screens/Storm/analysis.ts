// Glue between stored readings and the core's storm functions: one discharge per time, the method the
// user picked as a core SeparationMethod, and the whole analysis as one result or one plain error.
import {
  BFI_MAX_PRESETS,
  defaultChapmanMaxwell,
  defaultEckhardt,
  defaultLyneHollick,
  defaultSmoothedMinima,
  findEventPointsDetailed,
  inflectionByNewtonPolynomial,
  localMinimumInterval_days,
  separateBaseflowDetailed,
  summarizeEvent,
  type EventPoints,
  type EventSummary,
  type SeparationMethod,
} from '../../../core';
import type { ReadingWithDischarge } from '../../db';
import type { MethodChoice, MethodKind } from '../../components/SeparationPicker';

/** A discharge record ready for the core: times (UTC ms, ascending) and discharges (m³/s). */
export interface StormSeries {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
}

/** What was made of the stored readings of a window. */
export type SeriesFromReadings =
  | {
      kind: 'ready';
      series: StormSeries;
      /** Readings left out because a logger reading had the same time. */
      skipped: number;
      /** Readings whose stage lies outside the rating's gauged range. */
      extrapolated: number;
    }
  | { kind: 'unrated'; count: number; total: number; firstTime_ms: number }
  | { kind: 'empty' };

/**
 * One discharge (m³/s) per time from readings in time order. Where several readings share a time, the
 * logger readings win (averaged if there are several); without a logger reading the manual ones are
 * averaged. Why: the logger record is the continuous series a storm is read from, and a staff check at
 * the same minute checks the logger (its correction is applied at logger import); mixing it in would put
 * a step of a few millimetres into the record.
 */
export function seriesFromReadings(rows: readonly ReadingWithDischarge[]): SeriesFromReadings {
  if (rows.length === 0) return { kind: 'empty' };
  const unrated = rows.filter((r) => r.discharge_m3s === null);
  if (unrated.length > 0) {
    return { kind: 'unrated', count: unrated.length, total: rows.length, firstTime_ms: unrated[0].reading.time_ms };
  }
  const times: number[] = [];
  const discharges: number[] = [];
  let skipped = 0;
  let extrapolated = 0;
  let i = 0;
  while (i < rows.length) {
    let j = i;
    while (j + 1 < rows.length && rows[j + 1].reading.time_ms === rows[i].reading.time_ms) j++;
    const group = rows.slice(i, j + 1);
    const loggers = group.filter((r) => r.reading.source === 'logger');
    const chosen = loggers.length > 0 ? loggers : group;
    skipped += group.length - chosen.length;
    extrapolated += chosen.filter((r) => r.extrapolated).length;
    times.push(rows[i].reading.time_ms);
    discharges.push(chosen.reduce((sum, r) => sum + (r.discharge_m3s ?? 0), 0) / chosen.length);
    i = j + 1;
  }
  return {
    kind: 'ready',
    series: { time_ms: Float64Array.from(times), discharge_m3s: Float64Array.from(discharges) },
    skipped,
    extrapolated,
  };
}

/** True for the methods that draw baseflow between the key points (the others filter the whole window). */
export function usesKeyPoints(kind: MethodKind): boolean {
  return kind === 'variable-slope' || kind === 'constant-discharge' || kind === 'straight-line' || kind === 'concave';
}

/** The core method for a pick, with every parameter written out so a saved analysis can be repeated. */
export function methodFor(choice: MethodChoice, area_km2: number | undefined): SeparationMethod {
  switch (choice.kind) {
    case 'variable-slope':
    case 'constant-discharge':
    case 'straight-line':
    case 'concave':
      return { kind: choice.kind };
    case 'lyne-hollick':
      return { kind: 'lyne-hollick', alpha: defaultLyneHollick.alpha, passes: defaultLyneHollick.passes };
    case 'chapman-maxwell':
      return { kind: 'chapman-maxwell', recession: defaultChapmanMaxwell.recession };
    case 'eckhardt':
      return { kind: 'eckhardt', bfiMax: BFI_MAX_PRESETS[choice.bfiPreset], recession: defaultEckhardt.recession };
    case 'smoothed-minima':
      return { kind: 'smoothed-minima', block_days: defaultSmoothedMinima.block_days, factor: defaultSmoothedMinima.factor };
    case 'local-minimum':
      // Without an area the core says what it needs; with one, the interval is written out.
      return area_km2 === undefined ? { kind: 'local-minimum' } : { kind: 'local-minimum', interval_days: localMinimumInterval_days(area_km2) };
    default: {
      const unknown: never = choice.kind;
      throw new RangeError(`No separation method called ${String(unknown)}`);
    }
  }
}

/** A computation that either gave a value or stopped with a plain sentence (from a core RangeError). */
export type Outcome<T> = { ok: true; value: T } | { ok: false; message: string };

/** Runs fn, turning a RangeError into a plain message; other errors are bugs and propagate. */
export function attempt<T>(fn: () => T): Outcome<T> {
  try {
    return { ok: true, value: fn() };
  } catch (e) {
    if (e instanceof RangeError) return { ok: false, message: e.message };
    throw e;
  }
}

/** Key points found by the core (UTC ms) with its notes. */
export function findPoints(series: StormSeries, area_km2: number | undefined): Outcome<{ points: EventPoints; notes: string[] }> {
  return attempt(() => findEventPointsDetailed(series, area_km2 === undefined ? undefined : { area_km2 }));
}

/** The Newton-polynomial inflection (UTC ms) between the peak and the end of runoff, as a cross-check. */
export function polynomialInflection(series: StormSeries, points: EventPoints): Outcome<number> {
  return attempt(() => inflectionByNewtonPolynomial(series, points.peak_ms, points.runoffEnd_ms).inflection_ms);
}

/** Everything the results show: baseflow (m³/s per reading), the summary and the notes of every step. */
export interface StormResult {
  method: SeparationMethod;
  baseflow_m3s: Float64Array;
  summary: EventSummary;
  notes: string[];
}

/** Separates baseflow and summarises the event from the rise start to the end of runoff. */
export function analyse(
  series: StormSeries,
  points: EventPoints,
  choice: MethodChoice,
  area_km2: number | undefined,
  rainfall_mm: number | undefined,
): Outcome<StormResult> {
  return attempt(() => {
    const method = methodFor(choice, area_km2);
    const separated = separateBaseflowDetailed(series, method, { points, area_km2 });
    const summary = summarizeEvent(series, separated.baseflow, {
      area_km2,
      rainfall_mm,
      from_ms: points.riseStart_ms,
      to_ms: points.runoffEnd_ms,
    });
    const notes = [...new Set([...separated.notes, ...summary.notes])];
    return { method, baseflow_m3s: separated.baseflow, summary, notes };
  });
}

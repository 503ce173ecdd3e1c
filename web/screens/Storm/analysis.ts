// Glue between the stored series and the core's storm functions: one discharge per time, the method the
// user picked as a core SeparationMethod, and the whole analysis as one result or one plain error.
import {
  findEventPointsDetailed,
  inflectionByNewtonPolynomial,
  methodWithDefaults,
  separateBaseflowDetailed,
  summarizeEvent,
  type EventPoints,
  type EventSummary,
  type SeparationMethod,
} from '../../../core';
import type { MethodChoice } from '../../components/SeparationPicker';

// The rules "logger wins at the same time, manual readings averaged" and "which methods use key points" live in core.
export { seriesFromReadings, usesKeyPoints, type SeriesFromReadings } from '../../../core';

/** A discharge record ready for the core: times (UTC ms, ascending) and discharges (m³/s). */
export interface StormSeries {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
}

/** The core method for a pick, with every parameter written out so a saved analysis can be repeated. */
export function methodFor(choice: MethodChoice, area_km2: number | undefined): SeparationMethod {
  return methodWithDefaults(choice.kind, { bfiPreset: choice.bfiPreset, area_km2 });
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

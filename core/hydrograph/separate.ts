// Baseflow separation: one entry point for every event method and continuous filter.
import { constantDischarge } from './constant-discharge';
import { fillEvent, flowAt, type EventInput } from './event-common';
import { concaveLine } from './concave';
import { filterNoiseNote } from './filter-noise';
import { lightlySmoothed, smoothingEffectNote } from './light-smoothing';
import { dailyMeans, dailyToReadings } from './daily-means';
import { filterSpec } from './filter-spec';
import { findEventPointsDetailed } from './key-points';
import { localMinimum, localMinimumInterval_days } from './local-minimum';
import { defaultSmoothedMinima, type SeparationMethod } from './methods';
import { positive, SEPARATE_FN as FN } from './method-checks';
import { medianInterval_ms } from './resample';
import { backToReadings, filterQuick, recursiveFilter, regularGrid } from './run-filter';
import { dailyOnlyReason } from './daily-only';
import type { FilterRestart } from './split';
import {
  checkArea,
  checkEventPoints,
  interpolateAt,
  type BaseflowNodes,
  MS_PER_DAY,
  prepareSeries,
  type EventPoints,
  type PreparedSeries,
  type Series,
} from './series';
import { smoothedMinima } from './smoothed-minima';
import { straightLineLine } from './straight-line';
import { variableSlopeLine } from './variable-slope';

export type { SeparationMethod };

/** Context of a separation: key points (UTC ms) for event methods, catchment area (km²), gap bridging limit (ms). */
export interface SeparationContext {
  points?: EventPoints;
  area_km2?: number;
  /**
   * Longest gap (ms) a recursive filter runs across; longer gaps split the record and the filter restarts.
   * Default: the bridging limit of DOMAIN.md §4 for the record's usual step (bridgingLimit_ms).
   */
  maxBridge_ms?: number;
  /**
   * 'light': separate a lightly smoothed copy (a centred mean of up to 5 readings, 30 minutes either side at most),
   * cap the baseflow at the recorded discharge, and state the effect in a note. Off by default.
   */
  smoothing?: 'light';
}

/** Baseflow (m³/s, one per reading, 0 ≤ b ≤ Q) with plain sentences about resampling, gaps and key points. */
export interface SeparationResult {
  baseflow: Float64Array;
  notes: string[];
  points?: EventPoints;
  /**
   * Event methods: the baseflow (m³/s) at the key points (UTC ms), where the line bends between readings;
   * summarizeEvent takes them as extra trapezoid nodes.
   */
  baseflowAtPoints?: BaseflowNodes;
  /** Recursive filters: the gaps longer than the bridging limit after which the filter restarted (UTC ms). */
  restarts?: FilterRestart[];
  /** Set when the method's constant is published for daily data and this record is not daily: the reason. */
  dailyOnly?: string;
}

const DAILY_TOLERANCE = 1e-6;

/** Baseflow (m³/s) at every reading by the given method; 0 ≤ b ≤ Q, same length as the series. */
export function separateBaseflow(series: Series, method: SeparationMethod, context?: SeparationContext): Float64Array {
  return separateBaseflowDetailed(series, method, context).baseflow;
}

/** Like separateBaseflow, also saying what was done to the record (resampled, gaps, constants per step). */
export function separateBaseflowDetailed(
  series: Series,
  method: SeparationMethod,
  context?: SeparationContext,
): SeparationResult {
  if (context?.smoothing !== undefined) return smoothedSeparation(series, method, context);
  const kind = method?.kind;
  if ((kind === 'eckhardt' || kind === 'chapman-maxwell' || kind === 'lyne-hollick') && context?.maxBridge_ms === undefined) {
    const spec = filterSpec(method);
    if (context?.area_km2 !== undefined) checkArea(context.area_km2, FN);
    const quick = filterQuick(series, spec);
    if (quick !== null) return withDailyOnly(quick, method.kind, series.time_ms[1] - series.time_ms[0]);
  }
  const prepared = prepareSeries(series, FN);
  const area = context?.area_km2 === undefined ? undefined : checkArea(context.area_km2, FN);
  switch (method?.kind) {
    case 'constant-discharge':
    case 'straight-line':
    case 'concave':
    case 'variable-slope':
      return eventMethod(series, prepared, method.kind, context?.points, area);
    case 'lyne-hollick':
    case 'eckhardt':
    case 'chapman-maxwell':
    {
      const spec = filterSpec(method);
      const run = recursiveFilter(prepared, context?.maxBridge_ms, spec);
      const note = filterNoiseNote(prepared.discharge_m3s, spec.name, missingMask(prepared));
      if (note !== null) run.notes.push(note);
      const t = prepared.time_ms;
      return withDailyOnly(run, method.kind, prepared.regular ? t[1] - t[0] : medianInterval_ms(t));
    }
    case 'smoothed-minima': {
      const block = positive(method.block_days ?? defaultSmoothedMinima.block_days, 'smoothed-minima block_days');
      const factor = method.factor ?? defaultSmoothedMinima.factor;
      if (typeof factor !== 'number' || !(factor > 0 && factor <= 1)) {
        throw new RangeError(`${FN} needs smoothed-minima factor in (0, 1]; got ${String(factor)}`);
      }
      return minimaMethod(prepared, 'smoothed minima', (t, q, step, days) => smoothedMinima(t, q, step, block, factor, days).baseflow);
    }
    case 'local-minimum': {
      let interval = method.interval_days;
      if (interval === undefined) {
        if (area === undefined) {
          throw new RangeError(`${FN} needs local-minimum interval_days or a catchment area_km2 to set the interval`);
        }
        interval = localMinimumInterval_days(area);
      }
      const days = positive(interval, 'local-minimum interval_days');
      const result = minimaMethod(prepared, 'local minimum', (t, q, step) => localMinimum(t, q, step, days));
      result.notes.push(`The local-minimum interval is ${days} days.`);
      return result;
    }
    default: {
      const unknown: never = method;
      throw new RangeError(`${FN} needs a known method kind; got ${JSON.stringify((unknown as { kind?: unknown })?.kind)}`);
    }
  }
}

/** A filter's result with the daily-only reason (and its note) when its constant does not suit the step. */
function withDailyOnly(run: SeparationResult, kind: string, step_ms: number): SeparationResult {
  const reason = dailyOnlyReason(kind, step_ms);
  if (reason === null) return run;
  run.notes.push(reason);
  run.dailyOnly = reason;
  return run;
}

function eventMethod(
  series: Series,
  prepared: PreparedSeries,
  kind: 'constant-discharge' | 'straight-line' | 'concave' | 'variable-slope',
  given: EventPoints | undefined,
  area: number | undefined,
): SeparationResult {
  const notes = [...prepared.notes];
  let points: EventPoints;
  if (given !== undefined) points = checkEventPoints(given, prepared.time_ms, FN);
  else {
    const found = findEventPointsDetailed(series, area === undefined ? undefined : { area_km2: area });
    points = found.points;
    notes.push('Key points were found automatically.', ...found.notes.filter((n) => !notes.includes(n)));
  }
  const input: EventInput = { time_ms: prepared.time_ms, discharge_m3s: prepared.discharge_m3s, points };
  if (kind === 'constant-discharge') return { baseflow: constantDischarge(input), notes, points };
  const line = kind === 'straight-line' ? straightLineLine(input) : kind === 'concave' ? concaveLine(input) : variableSlopeLine(input);
  const baseflow = fillEvent(input, line);
  const times = [points.riseStart_ms, points.peak_ms, points.inflection_ms, points.runoffEnd_ms];
  const baseflowAtPoints: BaseflowNodes = {
    time_ms: times,
    baseflow_m3s: times.map((x) => Math.min(flowAt(input, x), Math.max(0, line(x)))),
  };
  return { baseflow, notes, points, baseflowAtPoints };
}

/** Separates a lightly smoothed copy of the record and says what the smoothing changed (see SeparationContext). */
function smoothedSeparation(series: Series, method: SeparationMethod, context: SeparationContext): SeparationResult {
  if (context.smoothing !== 'light') {
    throw new RangeError(`${FN} needs smoothing 'light' or none; got ${JSON.stringify(context.smoothing)}`);
  }
  const plain: SeparationContext = { ...context, smoothing: undefined };
  const prepared = prepareSeries(series, FN);
  const raw = separateBaseflowDetailed(series, method, plain);
  const smooth = lightlySmoothed(prepared);
  if (smooth.discharge_m3s === null) return { ...raw, notes: [...raw.notes, smooth.note] };
  const t = prepared.time_ms;
  const q = prepared.discharge_m3s;
  const result = separateBaseflowDetailed({ time_ms: t, discharge_m3s: smooth.discharge_m3s }, method, plain);
  const b = result.baseflow;
  for (let i = 0; i < b.length; i++) if (b[i] > q[i]) b[i] = q[i];
  if (result.baseflowAtPoints) {
    const nodes = result.baseflowAtPoints;
    nodes.baseflow_m3s = nodes.baseflow_m3s.map((v, k) => Math.min(v, interpolateAt(t, q, nodes.time_ms[k])));
  }
  const note = smoothingEffectNote(t, q, raw.baseflow, smooth.discharge_m3s, b, smooth.readings);
  return { ...result, notes: [...new Set([...prepared.notes, ...result.notes]), note] };
}

function missingMask(prepared: PreparedSeries): Uint8Array | undefined {
  if (prepared.gaps.length === 0) return undefined;
  const mask = new Uint8Array(prepared.time_ms.length);
  for (const g of prepared.gaps) mask.fill(1, g.first, g.last + 1);
  return mask;
}

/**
 * Runs a minima method (blocks and intervals in days) on daily flows: on a daily or coarser record, on the
 * readings (resampled to a regular step if irregular); on a sub-daily one, on the means of its whole days,
 * with the daily baseflow interpolated back to the reading times and capped at the discharge.
 */
function minimaMethod(
  prepared: PreparedSeries,
  name: string,
  run: (t: Float64Array, q: Float64Array, step_ms: number, window_days: number) => Float64Array,
): SeparationResult {
  const notes: string[] = [];
  const { time_ms: t, discharge_m3s: q } = prepared;
  if (t.length < 2) throw new RangeError(`${FN} needs at least 2 readings for ${name}; got ${t.length}`);
  if (prepared.gaps.length > 0) notes.push(`Gaps were bridged for ${name}: ${prepared.notes.join(' ')}`);
  const span_days = (t[t.length - 1] - t[0]) / MS_PER_DAY;
  const step = prepared.regular ? t[1] - t[0] : medianInterval_ms(t);
  if (step >= MS_PER_DAY * (1 - DAILY_TOLERANCE)) {
    const grid = regularGrid(prepared, name, notes);
    const gridB = run(grid.time_ms, grid.discharge_m3s, grid.step_ms, (t.length * grid.step_ms) / MS_PER_DAY);
    return { baseflow: backToReadings(t, q, grid.time_ms, gridB), notes };
  }
  const days = dailyMeans(t, q);
  if (days.time_ms.length === 0) {
    const has = Math.floor(span_days * 10 + 1e-9) / 10;
    throw new RangeError(
      `${FN} needs at least one whole day of readings for ${name} (it works on daily mean flows); ` +
        `this window has ${has} days. Widen the window.`,
    );
  }
  const dayB = run(days.time_ms, days.discharge_m3s, MS_PER_DAY, span_days);
  notes.push(
    `The readings are more frequent than daily: ${name} was applied to the means of the ` +
      `${days.time_ms.length} whole days from the first reading, and the daily baseflow was interpolated back ` +
      `to the reading times and capped at the discharge.`,
  );
  return { baseflow: dailyToReadings(days.time_ms, dayB, t, q), notes };
}

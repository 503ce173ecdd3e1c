// Baseflow separation: one entry point for every event method and continuous filter.
import { concave } from './concave';
import { constantDischarge } from './constant-discharge';
import type { EventInput } from './event-common';
import { chapmanMaxwell } from './filters/chapman-maxwell';
import { eckhardt } from './filters/eckhardt';
import { defaultLyneHollick, lyneHollick } from './filters/lyne-hollick';
import { findEventPointsDetailed } from './key-points';
import { localMinimum, localMinimumInterval_days } from './local-minimum';
import { interpolateOnto, medianInterval_ms, resampleRegular } from './resample';
import { checkArea, checkEventPoints, prepareSeries, type EventPoints, type PreparedSeries, type Series } from './series';
import { defaultSmoothedMinima, smoothedMinima } from './smoothed-minima';
import { straightLine } from './straight-line';
import { variableSlope } from './variable-slope';
import { splitAtLongGaps, type Piece } from './split';

/** A baseflow separation method: event methods use key points; the others are continuous filters. */
export type SeparationMethod =
  | { kind: 'constant-discharge' }
  | { kind: 'straight-line' }
  | { kind: 'concave' }
  | { kind: 'variable-slope' }
  | { kind: 'lyne-hollick'; alpha?: number; passes?: number }
  | { kind: 'eckhardt'; bfiMax: number; recession: number }
  | { kind: 'chapman-maxwell'; recession: number }
  | { kind: 'smoothed-minima'; block_days?: number; factor?: number }
  | { kind: 'local-minimum'; interval_days?: number };

/** Context of a separation: key points (UTC ms) for event methods, catchment area (km²), gap bridging limit (ms). */
export interface SeparationContext {
  points?: EventPoints;
  area_km2?: number;
  /** Longest gap (ms) a recursive filter runs across; longer gaps split the record. Default 5 × median step. */
  maxBridge_ms?: number;
}

/** Baseflow (m³/s, one per reading, 0 ≤ b ≤ Q) with plain sentences about resampling, gaps and key points. */
export interface SeparationResult {
  baseflow: Float64Array;
  notes: string[];
  points?: EventPoints;
}

const FN = 'separateBaseflow';

/** Baseflow (m³/s) at every reading by the given method; 0 ≤ b ≤ Q, same length as the series. */
export function separateBaseflow(series: Series, method: SeparationMethod, context?: SeparationContext): Float64Array {
  return separateBaseflowDetailed(series, method, context).baseflow;
}

/** Like separateBaseflow, also saying what was done to the record (resampled, gaps bridged or split). */
export function separateBaseflowDetailed(
  series: Series,
  method: SeparationMethod,
  context?: SeparationContext,
): SeparationResult {
  const prepared = prepareSeries(series, FN);
  const area = context?.area_km2 === undefined ? undefined : checkArea(context.area_km2, FN);
  switch (method?.kind) {
    case 'constant-discharge':
    case 'straight-line':
    case 'concave':
    case 'variable-slope':
      return eventMethod(series, prepared, method.kind, context?.points, area);
    case 'lyne-hollick': {
      const alpha = method.alpha ?? defaultLyneHollick.alpha;
      const passes = method.passes ?? defaultLyneHollick.passes;
      inOpenUnit(alpha, 'lyne-hollick alpha');
      if (!Number.isInteger(passes) || passes < 1 || passes > 9) {
        throw new RangeError(`${FN} needs lyne-hollick passes as an integer from 1 to 9; got ${String(passes)}`);
      }
      return recursiveFilter(prepared, context, 'Lyne–Hollick', (q) => lyneHollick(q, alpha, passes));
    }
    case 'eckhardt': {
      const { bfiMax, recession } = method;
      if (typeof bfiMax !== 'number' || !(bfiMax > 0 && bfiMax <= 1)) {
        throw new RangeError(`${FN} needs eckhardt bfiMax in (0, 1]; got ${String(bfiMax)}`);
      }
      inOpenUnit(recession, 'eckhardt recession');
      return recursiveFilter(prepared, context, 'Eckhardt', (q) => eckhardt(q, bfiMax, recession));
    }
    case 'chapman-maxwell': {
      inOpenUnit(method.recession, 'chapman-maxwell recession');
      return recursiveFilter(prepared, context, 'Chapman–Maxwell', (q) => chapmanMaxwell(q, method.recession));
    }
    case 'smoothed-minima': {
      const block = method.block_days ?? defaultSmoothedMinima.block_days;
      const factor = method.factor ?? defaultSmoothedMinima.factor;
      positive(block, 'smoothed-minima block_days');
      if (typeof factor !== 'number' || !(factor > 0 && factor <= 1)) {
        throw new RangeError(`${FN} needs smoothed-minima factor in (0, 1]; got ${String(factor)}`);
      }
      return minimaMethod(prepared, 'smoothed minima', (t, q, step) => smoothedMinima(t, q, step, block, factor).baseflow);
    }
    case 'local-minimum': {
      let interval = method.interval_days;
      if (interval === undefined) {
        if (area === undefined) {
          throw new RangeError(`${FN} needs local-minimum interval_days or a catchment area_km2 to set the interval`);
        }
        interval = localMinimumInterval_days(area);
      }
      positive(interval, 'local-minimum interval_days');
      const days = interval;
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

function inOpenUnit(x: unknown, what: string): void {
  if (typeof x !== 'number' || !(x > 0 && x < 1)) throw new RangeError(`${FN} needs ${what} in (0, 1); got ${String(x)}`);
}

function positive(x: unknown, what: string): void {
  if (typeof x !== 'number' || !Number.isFinite(x) || !(x > 0)) {
    throw new RangeError(`${FN} needs ${what} above 0; got ${String(x)}`);
  }
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
  const baseflow =
    kind === 'constant-discharge'
      ? constantDischarge(input)
      : kind === 'straight-line'
        ? straightLine(input)
        : kind === 'concave'
          ? concave(input)
          : variableSlope(input);
  return { baseflow, notes, points };
}

/** Runs a recursive filter on a regular grid, piece by piece between long gaps, and maps it back. */
function recursiveFilter(
  prepared: PreparedSeries,
  context: SeparationContext | undefined,
  name: string,
  filter: (q: Float64Array) => Float64Array,
): SeparationResult {
  const { time_ms: t, discharge_m3s: q } = prepared;
  const notes: string[] = [];
  const grid = regularGrid(prepared, name, notes);
  const maxBridge = context?.maxBridge_ms ?? 5 * grid.step_ms;
  positive(maxBridge, 'maxBridge_ms');
  const pieces: Piece[] = splitAtLongGaps(prepared, grid.time_ms, maxBridge, name, notes);
  if (pieces.length === 1 && grid.time_ms === t) {
    // The filters keep 0 ≤ b ≤ Q themselves: on a regular record in one piece their output is the answer.
    return { baseflow: filter(q), notes };
  }
  const gridB = new Float64Array(grid.time_ms.length);
  let previousEnd = -1;
  for (const piece of pieces) {
    gridB.set(filter(grid.discharge_m3s.subarray(piece.first, piece.last + 1)), piece.first);
    if (previousEnd >= 0) {
      const a = previousEnd;
      const c = piece.first;
      for (let k = a + 1; k < c; k++) {
        gridB[k] = gridB[a] + ((gridB[c] - gridB[a]) * (grid.time_ms[k] - grid.time_ms[a])) / (grid.time_ms[c] - grid.time_ms[a]);
      }
    }
    previousEnd = piece.last;
  }
  return { baseflow: backToReadings(t, q, grid.time_ms, gridB), notes };
}

function minimaMethod(
  prepared: PreparedSeries,
  name: string,
  run: (t: Float64Array, q: Float64Array, step_ms: number) => Float64Array,
): SeparationResult {
  const notes: string[] = [];
  const grid = regularGrid(prepared, name, notes);
  if (prepared.gaps.length > 0) notes.push(`Gaps were bridged for ${name}: ${prepared.notes.join(' ')}`);
  const gridB = run(grid.time_ms, grid.discharge_m3s, grid.step_ms);
  return { baseflow: backToReadings(prepared.time_ms, prepared.discharge_m3s, grid.time_ms, gridB), notes };
}

function regularGrid(prepared: PreparedSeries, name: string, notes: string[]) {
  const { time_ms: t, discharge_m3s: q } = prepared;
  if (t.length < 2) throw new RangeError(`${FN} needs at least 2 readings for ${name}; got ${t.length}`);
  if (prepared.regular) return { time_ms: t, discharge_m3s: q, step_ms: t[1] - t[0] };
  const grid = resampleRegular(t, q, medianInterval_ms(t));
  notes.push(
    `The readings are irregular: ${t.length} readings were resampled by linear interpolation to ` +
      `${grid.time_ms.length} at a regular step of ${(grid.step_ms / 60_000).toPrecision(4)} min for ${name}; ` +
      `the baseflow was interpolated back to the reading times and capped at the discharge.`,
  );
  return grid;
}

function backToReadings(t: Float64Array, q: Float64Array, gridT: Float64Array, gridB: Float64Array): Float64Array {
  const b = gridT === t ? gridB : interpolateOnto(gridT, gridB, t);
  for (let i = 0; i < b.length; i++) {
    const v = b[i];
    b[i] = v > q[i] ? q[i] : v > 0 ? v : 0;
  }
  return b;
}

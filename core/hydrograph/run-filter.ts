// Running a recursive filter on a record: a fused check-and-filter pass for clean regular records, otherwise
// resampling to a regular grid and splitting at long gaps, then mapping the baseflow back to the readings.
import type { FilterSpec } from './filter-spec';
import { positive, SEPARATE_FN } from './method-checks';
import { interpolateOnto, medianInterval_ms, resampleRegular } from './resample';
import type { PreparedSeries, Series } from './series';
import { bridgingLimit_ms } from './bridging-limit';
import { noiseNoteOf, noiseSamples } from './filter-noise';
import { splitAtLongGaps, type FilterRestart } from './split';

/** Baseflow (m³/s) with plain sentences about what was done to the record. */
export interface FilterRun {
  baseflow: Float64Array;
  notes: string[];
  /** Gaps longer than the bridging limit after which the filter started afresh (UTC ms); empty when none. */
  restarts: FilterRestart[];
}

/**
 * The quick path for a clean regular record given as Float64Arrays: the filter's own loop checks the record
 * while filtering, and the noise note's samples are taken behind it (filterNoiseNote's note, from cache).
 * Null when the path does not apply; the general path then checks and reports.
 */
export function filterQuick(series: Series, spec: FilterSpec): FilterRun | null {
  const t = series?.time_ms;
  const q = series?.discharge_m3s;
  if (!(t instanceof Float64Array) || !(q instanceof Float64Array)) return null;
  if (t.length !== q.length || t.length < 3) return null;
  const step = t[1] - t[0];
  if (!(step > 0 && step < Infinity)) return null;
  const samples = noiseSamples(q);
  const baseflow = spec.runChecked(t, q, step, samples);
  if (baseflow === null) return null;
  const notes = [spec.note(step)];
  const noise = noiseNoteOf(samples, q.length, spec.name);
  if (noise !== null) notes.push(noise);
  return { baseflow, notes, restarts: [] };
}

/**
 * Runs a recursive filter on a regular grid, across gaps up to the bridging limit (maxBridge_ms when given,
 * else DOMAIN.md §4's limit for the record's usual step) and piece by piece between longer ones.
 */
export function recursiveFilter(prepared: PreparedSeries, maxBridge_ms: number | undefined, spec: FilterSpec): FilterRun {
  const { time_ms: t, discharge_m3s: q } = prepared;
  const notes: string[] = [];
  const grid = regularGrid(prepared, spec.name, notes);
  notes.push(spec.note(grid.step_ms));
  const maxBridge = maxBridge_ms === undefined ? bridgingLimit_ms(grid.step_ms) : positive(maxBridge_ms, 'maxBridge_ms');
  const { pieces, restarts } = splitAtLongGaps(prepared, grid.time_ms, maxBridge, spec.name, notes);
  if (pieces.length === 1 && grid.time_ms === t) {
    // The filters keep 0 ≤ b ≤ Q themselves: on a regular record in one piece their output is the answer.
    return { baseflow: spec.run(q, grid.step_ms), notes, restarts };
  }
  const gridB = new Float64Array(grid.time_ms.length);
  let previousEnd = -1;
  for (const piece of pieces) {
    gridB.set(spec.run(grid.discharge_m3s.subarray(piece.first, piece.last + 1), grid.step_ms), piece.first);
    if (previousEnd >= 0) {
      const a = previousEnd;
      const c = piece.first;
      for (let k = a + 1; k < c; k++) {
        gridB[k] = gridB[a] + ((gridB[c] - gridB[a]) * (grid.time_ms[k] - grid.time_ms[a])) / (grid.time_ms[c] - grid.time_ms[a]);
      }
    }
    previousEnd = piece.last;
  }
  return { baseflow: backToReadings(t, q, grid.time_ms, gridB), notes, restarts };
}

/** The record itself when regular, else resampled linearly at its median interval (saying so in notes). */
export function regularGrid(
  prepared: PreparedSeries,
  name: string,
  notes: string[],
): { time_ms: Float64Array; discharge_m3s: Float64Array; step_ms: number } {
  const { time_ms: t, discharge_m3s: q } = prepared;
  if (t.length < 2) throw new RangeError(`${SEPARATE_FN} needs at least 2 readings for ${name}; got ${t.length}`);
  if (prepared.regular) return { time_ms: t, discharge_m3s: q, step_ms: t[1] - t[0] };
  const grid = resampleRegular(t, q, medianInterval_ms(t));
  notes.push(
    `The readings are irregular: ${t.length} readings were resampled by linear interpolation to ` +
      `${grid.time_ms.length} at a regular step of ${(grid.step_ms / 60_000).toPrecision(4)} min for ${name}; ` +
      `the baseflow was interpolated back to the reading times and capped at the discharge.`,
  );
  return grid;
}

/** Baseflow on the grid mapped to the reading times (linear) and kept within 0 ≤ b ≤ Q. */
export function backToReadings(t: Float64Array, q: Float64Array, gridT: Float64Array, gridB: Float64Array): Float64Array {
  const b = gridT === t ? gridB : interpolateOnto(gridT, gridB, t);
  for (let i = 0; i < b.length; i++) {
    const v = b[i];
    b[i] = v > q[i] ? q[i] : v > 0 ? v : 0;
  }
  return b;
}

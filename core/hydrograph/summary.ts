// Event summary: peak, trapezoid volumes, baseflow index, runoff depth and runoff coefficient.
import { trapezoidVolumes, trapezoidVolumesWithNodes } from './integrate';
import { checkArea, interpolateAt, prepareSeries, type BaseflowNodes, type Series } from './series';

/** Options of summarizeEvent: area (km²), rainfall depth (mm) and a window (UTC ms; whole series by default). */
export interface SummaryOptions {
  area_km2?: number;
  rainfall_mm?: number;
  from_ms?: number;
  to_ms?: number;
  /** Baseflow at the key points from separateBaseflowDetailed: extra trapezoid nodes where the line bends. */
  baseflowAtPoints?: BaseflowNodes;
}

/** Event summary: peak (m³/s) and its time (UTC ms), volumes (m³), BFI (0–1), depth (mm), coefficient (0–1+). */
export interface EventSummary {
  peak_m3s: number;
  peakTime_ms: number;
  totalVolume_m3: number;
  baseflowVolume_m3: number;
  directVolume_m3: number;
  baseflowIndex: number;
  runoffDepth_mm?: number;
  runoffCoefficient?: number;
  notes: string[];
}

/** Relative slack allowed when checking b ≤ Q, for baseflow computed in another unit and converted back. */
const BASEFLOW_SLACK = 1e-9;

/** Summarises an event from its discharges (m³/s) and baseflow (m³/s, same length) over a time window. */
export function summarizeEvent(series: Series, baseflow: ArrayLike<number>, options?: SummaryOptions): EventSummary {
  const fn = 'summarizeEvent';
  const { time_ms: t, discharge_m3s: q, notes } = prepareSeries(series, fn);
  checkBaseflow(baseflow, q, fn);
  const n = t.length;
  const from = options?.from_ms ?? t[0];
  const to = options?.to_ms ?? t[n - 1];
  if (!Number.isFinite(from) || !Number.isFinite(to) || from < t[0] || to > t[n - 1] || from > to) {
    throw new RangeError(`${fn} needs from_ms ≤ to_ms inside the series (${t[0]}–${t[n - 1]} ms); got ${from} and ${to}`);
  }
  let peak_m3s = -Infinity;
  let peakTime_ms = from;
  for (let i = 0; i < n; i++) {
    if (t[i] >= from && t[i] <= to && q[i] > peak_m3s) {
      peak_m3s = q[i];
      peakTime_ms = t[i];
    }
  }
  for (const x of [from, to]) {
    const v = interpolateAt(t, q, x);
    if (v > peak_m3s) {
      peak_m3s = v;
      peakTime_ms = x;
    }
  }
  const nodes = options?.baseflowAtPoints;
  if (nodes !== undefined) checkNodes(nodes, q, t, fn);
  const { total_m3, baseflow_m3 } =
    nodes === undefined ? trapezoidVolumes(t, q, baseflow, from, to) : trapezoidVolumesWithNodes(t, q, baseflow, from, to, nodes);
  const direct = Math.max(0, total_m3 - baseflow_m3);
  let baseflowIndex = 0;
  if (total_m3 > 0) baseflowIndex = baseflow_m3 / total_m3;
  else if (to === from) notes.push('The window starts and ends at the same time, so it holds no volume; the baseflow index is given as 0.');
  else notes.push('There is no flow in the window; the baseflow index is given as 0.');
  const result: EventSummary = {
    peak_m3s,
    peakTime_ms,
    totalVolume_m3: total_m3,
    baseflowVolume_m3: baseflow_m3,
    directVolume_m3: direct,
    baseflowIndex,
    notes,
  };
  if (options?.area_km2 !== undefined) {
    const area = checkArea(options.area_km2, fn);
    result.runoffDepth_mm = direct / (area * 1e3);
  }
  if (options?.rainfall_mm !== undefined) {
    const p = options.rainfall_mm;
    if (typeof p !== 'number' || !Number.isFinite(p) || !(p > 0)) {
      throw new RangeError(`${fn} needs rainfall_mm above 0 for a runoff coefficient; got ${String(p)}`);
    }
    if (result.runoffDepth_mm === undefined) {
      throw new RangeError(`${fn} needs area_km2 with rainfall_mm: the runoff coefficient is runoff depth / rainfall`);
    }
    result.runoffCoefficient = result.runoffDepth_mm / p;
  }
  return result;
}

/** Checks a baseflow array: same length as the series, finite and 0 ≤ b ≤ Q (gaps compared to the bridged Q). */
export function checkBaseflow(baseflow: ArrayLike<number>, q: Float64Array, fn: string): void {
  if (!baseflow || baseflow.length !== q.length) {
    throw new RangeError(`${fn} needs one baseflow value per reading; got ${baseflow?.length} for ${q.length} readings`);
  }
  for (let i = 0; i < q.length; i++) {
    const b = baseflow[i];
    if (!Number.isFinite(b) || b < 0 || b > q[i] * (1 + BASEFLOW_SLACK) + Number.MIN_VALUE) {
      throw new RangeError(`${fn} needs 0 ≤ baseflow ≤ discharge at every reading; reading ${i} has baseflow ${b} m³/s and discharge ${q[i]} m³/s`);
    }
  }
}

/** Checks extra baseflow nodes: finite times inside the series, 0 ≤ b ≤ Q at each (Q interpolated). */
function checkNodes(nodes: BaseflowNodes, q: Float64Array, t: Float64Array, fn: string): void {
  const { time_ms: times, baseflow_m3s: values } = nodes;
  if (!Array.isArray(times) || !Array.isArray(values) || times.length !== values.length) {
    throw new RangeError(`${fn} needs baseflowAtPoints as equal lists of times and baseflows`);
  }
  for (let k = 0; k < times.length; k++) {
    const x = times[k];
    const v = values[k];
    if (!Number.isFinite(x) || x < t[0] || x > t[t.length - 1]) {
      throw new RangeError(`${fn} needs baseflowAtPoints times inside the series; got ${x}`);
    }
    const qx = interpolateAt(t, q, x);
    if (!Number.isFinite(v) || v < 0 || v > qx * (1 + BASEFLOW_SLACK) + Number.MIN_VALUE) {
      throw new RangeError(`${fn} needs 0 ≤ baseflow ≤ discharge at baseflowAtPoints; got ${v} m³/s where the discharge is ${qx} m³/s`);
    }
  }
}

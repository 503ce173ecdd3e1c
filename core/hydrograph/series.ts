// Storm-series types, input checks and gap bridging shared by every hydrograph computation.

/** A discharge record: times (UTC epoch ms, strictly ascending) and discharges (m³/s; NaN, null or undefined marks a gap). */
export interface Series {
  time_ms: ArrayLike<number>;
  discharge_m3s: ArrayLike<number>;
}

/** The four key points of a storm event, each a time in UTC epoch ms. */
export interface EventPoints {
  riseStart_ms: number;
  peak_ms: number;
  inflection_ms: number;
  runoffEnd_ms: number;
}

/** Baseflow (m³/s) at extra times (UTC ms, ascending) where a separation line bends between readings. */
export interface BaseflowNodes {
  time_ms: number[];
  baseflow_m3s: number[];
}

/** A run of missing discharges: readings first..last (inclusive indices) are NaN. */
export interface Gap {
  first: number;
  last: number;
}

/** A stretch with no readings in a record that otherwise has a steady step (a logger outage): after reading `after`. */
export interface Outage {
  after: number;
  length_ms: number;
}

/** A checked series: times (ms) and discharges (m³/s) as Float64Array, gaps filled by linear interpolation; may share the caller's arrays, never written to when shared. */
export interface PreparedSeries {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
  gaps: Gap[];
  /** Stretches without readings more than 3 times the usual step long (only in records with a usual step). */
  outages: Outage[];
  notes: string[];
  /** True when every interval equals the others within one part in a million. */
  regular: boolean;
}

/** Milliseconds per day (the one definition lives in core/time). */
export { MS_PER_DAY } from '../time/day';

/** Checks a series; returns it as Float64Arrays with interior gaps bridged linearly and end gaps held level. */
export function prepareSeries(series: Series, fn: string): PreparedSeries {
  if (series === null || typeof series !== 'object' || !series.time_ms || !series.discharge_m3s) {
    throw new RangeError(`${fn} needs a series with time_ms and discharge_m3s`);
  }
  const n = series.time_ms.length;
  if (n === 0) throw new RangeError(`${fn} needs at least one reading; got an empty series`);
  if (series.discharge_m3s.length !== n) {
    throw new RangeError(
      `${fn} needs as many discharges as times; got ${series.discharge_m3s.length} discharges and ${n} times`,
    );
  }
  const tIn = series.time_ms;
  const qIn = series.discharge_m3s;
  if (!(tIn instanceof Float64Array)) checkNumbers(tIn, 'time_ms', fn);
  // The caller's Float64Arrays are used as they are (core never writes to them); anything else is copied.
  const t = tIn instanceof Float64Array ? tIn : Float64Array.from(tIn);
  const scan = quickScan(t, qIn);
  let valid = n;
  if (!scan.clean) valid = slowScan(t, qIn, fn);
  const stepMin = scan.stepMin;
  const stepMax = scan.stepMax;
  if (valid === 0) throw new RangeError(`${fn} needs at least one reading with a discharge; all ${n} are gaps (missing)`);
  // null and undefined (what JSON and sparse arrays make of a missing value) are gaps like NaN.
  const q = valid === n && qIn instanceof Float64Array ? qIn : Float64Array.from(qIn, (v) => (v === null || v === undefined ? NaN : v));
  const regular = n < 3 || stepMax - stepMin <= 1e-6 * stepMin;
  const gaps = valid === n ? [] : bridgeGaps(t, q);
  const notes = gaps.map((g) => gapNote(t, g, n));
  const outages = regular ? [] : findOutages(t);
  for (const o of outages) notes.push(outageNote(t, o));
  return { time_ms: t, discharge_m3s: q, gaps, outages, notes, regular };
}

/** Throws a RangeError naming the first entry of a plain array that is a string, boolean or anything but a number. */
function checkNumbers(values: ArrayLike<unknown>, name: string, fn: string): void {
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v === 'number' || ((v === null || v === undefined) && name === 'discharge_m3s')) continue;
    const shown = typeof v === 'string' ? `the text ${JSON.stringify(v)}` : `${typeof v} ${String(v)}`;
    throw new RangeError(`${fn} needs ${name} as numbers; ${name}[${i}] is ${shown}`);
  }
}

/** Stretches without readings longer than 3 usual steps, where at least half the intervals are the usual step (±1 %). */
function findOutages(t: Float64Array): Outage[] {
  const n = t.length;
  const d = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) d[i] = t[i + 1] - t[i];
  const sorted = Float64Array.from(d).sort();
  const usual = sorted[sorted.length >> 1];
  let steady = 0;
  for (let i = 0; i < d.length; i++) if (Math.abs(d[i] - usual) <= 0.01 * usual) steady++;
  if (2 * steady < d.length) return [];
  const outages: Outage[] = [];
  for (let i = 0; i < d.length; i++) if (d[i] > 3 * usual) outages.push({ after: i, length_ms: d[i] });
  return outages;
}

/** A UTC time (ms) as "2025-05-01 06:00 UTC" for notes. */
export function utcLabel(time_ms: number): string {
  return `${new Date(time_ms).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** A duration (ms) in words for notes: hours below two days, else days. */
export function durationLabel(duration_ms: number): string {
  const hours = duration_ms / 3_600_000;
  return hours < 48 ? `${Number(hours.toPrecision(3))} h` : `${Number((hours / 24).toPrecision(3))} days`;
}

function outageNote(t: Float64Array, o: Outage): string {
  return (
    `There are no readings for ${durationLabel(o.length_ms)} after ${utcLabel(t[o.after])} (a logger outage?); ` +
    `the flow across it is taken as a straight line between the readings either side.`
  );
}

/** One quick pass: clean when times are finite and ascending and every discharge is a finite number ≥ 0. */
function quickScan(t: Float64Array, q: ArrayLike<number>): { clean: boolean; stepMin: number; stepMax: number } {
  const n = t.length;
  // null, strings and booleans pass `>= 0` in JavaScript: a plain array is also checked for type, slowly.
  let ok = t[0] > -Infinity && t[0] < Infinity && q[0] >= 0 && q[0] < Infinity && (q instanceof Float64Array || allNumbers(q));
  let stepMin = Infinity;
  let stepMax = 0;
  let previous = t[0];
  for (let i = 1; i < n; i++) {
    const ti = t[i];
    const qi = q[i];
    const step = ti - previous;
    if (!(step > 0 && ti < Infinity && qi >= 0 && qi < Infinity)) ok = false;
    stepMin = step < stepMin ? step : stepMin;
    stepMax = step > stepMax ? step : stepMax;
    previous = ti;
  }
  return { clean: ok, stepMin, stepMax };
}

function allNumbers(q: ArrayLike<unknown>): boolean {
  for (let i = 0; i < q.length; i++) if (typeof q[i] !== 'number') return false;
  return true;
}

/** The detailed pass when the quick one found something: throws on bad input, else counts valid discharges. */
function slowScan(t: Float64Array, q: ArrayLike<number>, fn: string): number {
  let previous = -Infinity;
  let valid = 0;
  for (let i = 0; i < t.length; i++) {
    const ti = t[i];
    if (!(ti > previous) || ti === Infinity) {
      if (!Number.isFinite(ti)) throw new RangeError(`${fn} needs finite times; time_ms[${i}] is ${String(ti)}`);
      throw new RangeError(
        `${fn} needs time_ms strictly ascending; reading ${i} (${ti}) is not after reading ${i - 1} (${previous})`,
      );
    }
    previous = ti;
    const qi: unknown = q[i];
    if (qi === null || qi === undefined) continue;
    if (typeof qi !== 'number') {
      const shown = typeof qi === 'string' ? `the text ${JSON.stringify(qi)}` : `${typeof qi} ${String(qi)}`;
      throw new RangeError(`${fn} needs discharges as numbers (NaN, null or nothing marks a gap); discharge_m3s[${i}] is ${shown}`);
    }
    if (qi >= 0 && qi !== Infinity) {
      valid++;
      continue;
    }
    if (Number.isNaN(qi)) continue;
    if (typeof qi !== 'number' || !Number.isFinite(qi)) {
      throw new RangeError(`${fn} needs finite discharges (NaN marks a gap); discharge_m3s[${i}] is ${String(qi)}`);
    }
    throw new RangeError(`${fn} needs discharge ≥ 0 m³/s; discharge_m3s[${i}] is ${qi}`);
  }
  return valid;
}

function bridgeGaps(t: Float64Array, q: Float64Array): Gap[] {
  const n = q.length;
  const gaps: Gap[] = [];
  let i = 0;
  while (i < n) {
    if (!Number.isNaN(q[i])) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && Number.isNaN(q[j + 1])) j++;
    gaps.push({ first: i, last: j });
    const before = i - 1;
    const after = j + 1;
    for (let k = i; k <= j; k++) {
      if (before < 0) q[k] = q[after];
      else if (after >= n) q[k] = q[before];
      else q[k] = q[before] + ((q[after] - q[before]) * (t[k] - t[before])) / (t[after] - t[before]);
    }
    i = j + 1;
  }
  return gaps;
}

function gapNote(t: Float64Array, g: Gap, n: number): string {
  const count = g.last - g.first + 1;
  const what = `${count} missing discharge${count === 1 ? '' : 's'} (readings ${g.first}–${g.last})`;
  if (g.first === 0) return `${what} at the start were held at the first available discharge.`;
  if (g.last === n - 1) return `${what} at the end were held at the last available discharge.`;
  const hours = (t[g.last + 1] - t[g.first - 1]) / 3_600_000;
  return `${what} were bridged by a straight line over ${hours.toPrecision(3)} h.`;
}

/** Checks that an area in km² is a finite number above zero. */
export function checkArea(area_km2: number, fn: string): number {
  if (typeof area_km2 !== 'number' || !Number.isFinite(area_km2) || area_km2 <= 0) {
    throw new RangeError(`${fn} needs a catchment area above 0 km²; got ${String(area_km2)}`);
  }
  return area_km2;
}

/** Checks that key points are finite, inside the series and in order rise ≤ peak ≤ inflection ≤ end. */
export function checkEventPoints(points: EventPoints, t: Float64Array, fn: string): EventPoints {
  const names = ['riseStart_ms', 'peak_ms', 'inflection_ms', 'runoffEnd_ms'] as const;
  const first = t[0];
  const last = t[t.length - 1];
  for (const name of names) {
    const v = points?.[name];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new RangeError(`${fn} needs key point ${name} as a finite time in ms; got ${String(v)}`);
    }
    if (v < first || v > last) {
      throw new RangeError(`${fn} needs key point ${name} inside the series (${first}–${last} ms); got ${v}`);
    }
  }
  for (let k = 1; k < names.length; k++) {
    if (points[names[k]] < points[names[k - 1]]) {
      throw new RangeError(
        `${fn} needs key points in order rise start ≤ peak ≤ inflection ≤ end of runoff; ` +
          `${names[k]} (${points[names[k]]}) is before ${names[k - 1]} (${points[names[k - 1]]})`,
      );
    }
  }
  if (!(points.runoffEnd_ms > points.riseStart_ms)) {
    throw new RangeError(`${fn} needs the end of runoff after the rise start; both are ${points.riseStart_ms} ms`);
  }
  return points;
}

/** Index of the last time ≤ at_ms (−1 when at_ms is before the first time); binary search. */
export function indexAtOrBefore(t: ArrayLike<number>, at_ms: number): number {
  let lo = 0;
  let hi = t.length - 1;
  if (at_ms < t[0]) return -1;
  if (at_ms >= t[hi]) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid] <= at_ms) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Value of y at at_ms by linear interpolation between samples; held level outside the times. */
export function interpolateAt(t: ArrayLike<number>, y: ArrayLike<number>, at_ms: number): number {
  const i = indexAtOrBefore(t, at_ms);
  if (i < 0) return y[0];
  if (i >= t.length - 1) return y[t.length - 1];
  const f = (at_ms - t[i]) / (t[i + 1] - t[i]);
  return y[i] + f * (y[i + 1] - y[i]);
}

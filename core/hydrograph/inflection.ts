// The falling-limb inflection point (d²Q/dt² = 0, the steepest fall) from a local smooth fit with a bracketed root.
import { localPolynomial } from './local-fit';
import { indexAtOrBefore, prepareSeries, type Series } from './series';

/** Options of findInflection: the local-fit half width in readings (default from the falling-limb length). */
export interface InflectionOptions {
  halfWindow_readings?: number;
}

/** Result of the smooth-fit inflection search: the time (UTC ms, whole) and the bracket the root was found in. */
export interface InflectionResult {
  inflection_ms: number;
  bracket_ms: [number, number] | null;
  halfWidth_ms: number;
}

/** Time (UTC ms) of the falling-limb inflection between peak_ms and end_ms, from a local quartic fit (tricube weights). */
export function findInflection(series: Series, peak_ms: number, end_ms: number, options?: InflectionOptions): number {
  return findInflectionDetailed(series, peak_ms, end_ms, options).inflection_ms;
}

/** Like findInflection, also returning the bracket [a, b] (UTC ms) around the root and the fit half width (ms). */
export function findInflectionDetailed(
  series: Series,
  peak_ms: number,
  end_ms: number,
  options?: InflectionOptions,
): InflectionResult {
  const fn = 'findInflection';
  const { time_ms: t, discharge_m3s: q } = prepareSeries(series, fn);
  if (!Number.isFinite(peak_ms) || !Number.isFinite(end_ms) || !(end_ms > peak_ms)) {
    throw new RangeError(`${fn} needs finite times with end_ms after peak_ms; got ${peak_ms} and ${end_ms}`);
  }
  if (peak_ms < t[0] || end_ms > t[t.length - 1]) {
    throw new RangeError(`${fn} needs peak_ms and end_ms inside the series (${t[0]}–${t[t.length - 1]} ms)`);
  }
  return inflectionOnPrepared(t, q, peak_ms, end_ms, options?.halfWindow_readings);
}

/** The search on already checked arrays (used by findEventPoints). */
export function inflectionOnPrepared(
  t: Float64Array,
  q: Float64Array,
  peak_ms: number,
  end_ms: number,
  halfWindow_readings?: number,
): InflectionResult {
  const first = Math.max(0, indexAtOrBefore(t, peak_ms));
  const last = indexAtOrBefore(t, end_ms);
  const count = last - first + 1;
  if (halfWindow_readings !== undefined && !(Number.isInteger(halfWindow_readings) && halfWindow_readings >= 2)) {
    throw new RangeError(`findInflection needs halfWindow_readings as an integer ≥ 2; got ${halfWindow_readings}`);
  }
  const m = halfWindow_readings ?? Math.min(15, Math.max(3, Math.round(count / 25)));
  const h = (m + 1) * medianStep(t, first, last);
  if (count < 3 || t.length < 4) {
    return { inflection_ms: Math.round(0.5 * (peak_ms + end_ms)), bracket_ms: null, halfWidth_ms: h };
  }
  const slope = new Float64Array(count).fill(NaN);
  const curv = new Float64Array(count).fill(NaN);
  const shapeAt = (k: number) => {
    if (Number.isNaN(slope[k])) {
      const s = localPolynomial(t, q, t[first + k], h);
      slope[k] = s ? s.slope : 0;
      curv[k] = s ? s.curvature : 0;
    }
  };
  // Coarse-to-fine: the fit spans 2m + 1 readings, so a stride of about m/2 cannot step over the steepest fall.
  const stride = Math.max(1, m >> 1);
  let steepest = 0;
  for (let k = 0; k < count; k += stride) {
    shapeAt(k);
    if (slope[k] < slope[steepest]) steepest = k;
  }
  const coarse = steepest;
  for (let k = Math.max(0, coarse - stride); k <= Math.min(count - 1, coarse + stride); k++) {
    shapeAt(k);
    if (slope[k] < slope[steepest]) steepest = k;
  }
  // Times are returned as whole milliseconds (records store integer ms), kept within [peak_ms, end_ms].
  const clampTime = (x: number) => Math.round(Math.min(end_ms, Math.max(peak_ms, x)));
  for (let d = 0; d < count; d++) {
    for (const k of d === 0 ? [steepest - 1, steepest] : [steepest - 1 - d, steepest + d]) {
      if (k < 0 || k + 1 >= count) continue;
      shapeAt(k);
      shapeAt(k + 1);
      if (curv[k] < 0 && curv[k + 1] >= 0) {
        const a = t[first + k];
        const b = t[first + k + 1];
        const root = bracketedRoot((x) => localPolynomial(t, q, x, h)?.curvature ?? 0, a, b, curv[k], curv[k + 1]);
        return { inflection_ms: clampTime(root), bracket_ms: [Math.round(a), Math.round(b)], halfWidth_ms: h };
      }
    }
  }
  return { inflection_ms: clampTime(t[first + steepest]), bracket_ms: null, halfWidth_ms: h };
}

function medianStep(t: Float64Array, first: number, last: number): number {
  const lo = Math.max(0, first - 1);
  const hi = Math.min(t.length - 1, Math.max(last, lo + 1));
  const steps: number[] = [];
  for (let i = lo; i < hi; i++) steps.push(t[i + 1] - t[i]);
  steps.sort((x, y) => x - y);
  return steps[steps.length >> 1];
}

/** Root of g in [a, b] where g(a) < 0 ≤ g(b): Illinois false position, falling back to bisection. */
function bracketedRoot(g: (x: number) => number, a: number, b: number, ga: number, gb: number): number {
  if (gb === 0) return b;
  let side = 0;
  const tolerance = Math.max(1e-9 * (b - a), 1e-3);
  for (let iter = 0; iter < 100 && b - a > tolerance; iter++) {
    let x = (a * gb - b * ga) / (gb - ga);
    if (!(x > a && x < b)) x = 0.5 * (a + b);
    const gx = g(x);
    if (gx === 0) return x;
    if (gx < 0) {
      a = x;
      ga = gx;
      if (side === -1) gb /= 2;
      side = -1;
    } else {
      b = x;
      gb = gx;
      if (side === 1) ga /= 2;
      side = 1;
    }
  }
  return (a * gb - b * ga) / (gb - ga);
}

// Lyne & Hollick (1979) recursive digital filter, passes alternating forward and backward
// (Nathan & McMahon 1990), with reflected ends (Ladson et al. 2013).
import { defaultLyneHollick } from '../methods';
import { regularEnough } from './first-order';

/**
 * One step of the filter, the only place it is written: the quickflow f_k = α·f_{k−1} + (1+α)/2·(x_k − x_{k−1})
 * from f_{k−1} (m³/s), kept within 0 ≤ f_k ≤ x_k; the kept value is what the next step carries. Small enough
 * for the engine to inline into every pass (the benchmark's Lyne–Hollick ratio checks that it does).
 */
function quickflowStep(f: number, alpha: number, c: number, x: number, previous: number): number {
  const next = alpha * f + c * (x - previous);
  return next < 0 ? 0 : next > x ? x : next;
}

/**
 * Baseflow (m³/s) of a regular, gap-free record by the Lyne–Hollick filter with α per step of the record:
 * quickflow f_k = α·f_{k−1} + (1+α)/2·(x_k − x_{k−1}) kept within 0 ≤ f_k ≤ x_k, baseflow x_k − f_k,
 * where x is the discharge on the first pass and the previous pass's baseflow after that. The record is
 * extended by `reflect` mirrored values at each end; only the output array (length n) is the size of the record.
 * The variant: the quickflow is clamped at every step and the clamped value is fed back into the next step
 * (the constrained filter as set out by Ladson et al. 2013, Australian Journal of Water Resources 17(1),
 * from memory), not clamped only at the output; on a fall the two differ, and this one never lets a
 * negative quickflow lower the baseflow that follows.
 */
export function lyneHollick(
  q: Float64Array,
  alpha: number = defaultLyneHollick.alpha,
  passes: number = defaultLyneHollick.passes,
  reflect: number = defaultLyneHollick.reflect,
): Float64Array {
  const n = q.length;
  if (n === 1) return Float64Array.of(q[0]);
  const r = Math.min(reflect, n - 1);
  const { head, tail } = reflectedEnds(q, r);
  const body = new Float64Array(n);
  const c = (1 + alpha) / 2;
  for (let pass = 0; pass < passes; pass++) {
    const source = pass === 0 ? q : body;
    if (pass % 2 === 0) forward(head, source, body, tail, alpha, c);
    else backward(head, body, tail, alpha, c);
  }
  return body;
}

/** The r mirrored values at each end of the extended record: head[i] = q[r − i], tail[i] = q[n − 2 − i]. */
function reflectedEnds(q: Float64Array, r: number): { head: Float64Array; tail: Float64Array } {
  const n = q.length;
  const head = new Float64Array(r);
  const tail = new Float64Array(r);
  for (let i = 0; i < r; i++) {
    head[i] = q[r - i];
    tail[i] = q[n - 2 - i];
  }
  return { head, tail };
}

/**
 * The same filter, checking the record during the first pass (as firstOrderFilterChecked does): null unless
 * every step is within 4·10⁻⁷ of the first and every discharge is finite and ≥ 0; the caller then takes the
 * general path, which decides and says what is wrong.
 */
export function lyneHollickChecked(
  t: Float64Array,
  q: Float64Array,
  alpha: number,
  passes: number,
  reflect: number,
): Float64Array | null {
  const n = q.length;
  if (n < 3 || t.length !== n || !(t[0] > -Infinity) || !(q[0] >= 0 && q[0] < Infinity)) return null;
  const r = Math.min(reflect, n - 1);
  const { head, tail } = reflectedEnds(q, r);
  const body = new Float64Array(n);
  const c = (1 + alpha) / 2;
  let f = 0;
  let previous = r > 0 ? head[0] : q[0];
  for (let k = 1; k < r; k++) {
    const xk = head[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    head[k] = xk - f;
  }
  let from = 0;
  if (r === 0) {
    body[0] = q[0];
    from = 1;
  }
  // Steps and discharges are tested as in firstOrderFilterChecked: a sum of squared step deviations, and a
  // sum of |Q| − Q that is exactly 0 only when every discharge is finite and ≥ 0.
  const step0 = t[1] - t[0];
  let deviation2 = 0;
  let negative = 0;
  let previousT = from === 0 ? t[0] - step0 : t[0];
  for (let k = from; k < n; k++) {
    const xk = q[k];
    const tk = t[k];
    const d = tk - previousT - step0;
    previousT = tk;
    deviation2 += d * d;
    negative += Math.abs(xk) - xk;
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    body[k] = xk - f;
  }
  if (!(regularEnough(deviation2, step0) && negative === 0)) return null;
  for (let k = 0; k < r; k++) {
    const xk = tail[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    tail[k] = xk - f;
  }
  for (let pass = 1; pass < passes; pass++) {
    if (pass % 2 === 0) forward(head, body, body, tail, alpha, c);
    else backward(head, body, tail, alpha, c);
  }
  return body;
}

/** A forward pass over head, body (read from `source`, written to `body`) and tail; the first value is kept. */
function forward(head: Float64Array, source: Float64Array, body: Float64Array, tail: Float64Array, alpha: number, c: number): void {
  const r = head.length;
  const n = body.length;
  let f = 0;
  let previous = r > 0 ? head[0] : source[0];
  for (let k = 1; k < r; k++) {
    const xk = head[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    head[k] = xk - f;
  }
  let from = 0;
  if (r === 0) {
    body[0] = source[0];
    from = 1;
  }
  for (let k = from; k < n; k++) {
    const xk = source[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    body[k] = xk - f;
  }
  for (let k = 0; k < r; k++) {
    const xk = tail[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    tail[k] = xk - f;
  }
}

/** A backward pass over tail, body and head, in place; the last value of the extended record is kept. */
function backward(head: Float64Array, body: Float64Array, tail: Float64Array, alpha: number, c: number): void {
  const r = tail.length;
  const n = body.length;
  let f = 0;
  let previous = r > 0 ? tail[r - 1] : body[n - 1];
  for (let k = r - 2; k >= 0; k--) {
    const xk = tail[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    tail[k] = xk - f;
  }
  const from = r === 0 ? n - 2 : n - 1;
  for (let k = from; k >= 0; k--) {
    const xk = body[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    body[k] = xk - f;
  }
  for (let k = r - 1; k >= 0; k--) {
    const xk = head[k];
    f = quickflowStep(f, alpha, c, xk, previous);
    previous = xk;
    head[k] = xk - f;
  }
}

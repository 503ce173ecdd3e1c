// The classic hand method for the inflection: Newton forward-difference polynomial through equally spaced
// points, and Newton–Raphson on its second derivative safeguarded by bisection.
import { interpolateAt, prepareSeries, type Series } from './series';

/** Options of the polynomial cross-check: number of equally spaced nodes (default 7, 4–12). */
export interface NewtonPolynomialOptions {
  nodes?: number;
}

/** Result of the polynomial cross-check; s is time in node steps from from_ms. */
export interface NewtonPolynomialInflection {
  inflection_ms: number;
  /** Node times (UTC ms), equally spaced from from_ms to to_ms. */
  nodes_ms: Float64Array;
  /** Discharges at the nodes (m³/s), read or linearly interpolated from the series. */
  nodes_m3s: Float64Array;
  /** Leading forward differences Δ^k Q₀, k = 0…nodes−1 (m³/s). */
  differences: Float64Array;
  /** Power-basis coefficients c_j of P(s) = Σ c_j·s^j (m³/s). */
  coefficients: Float64Array;
  /** Root of P″ in node steps. */
  root_s: number;
  /** Newton–Raphson steps taken and bisection steps that replaced a Newton step. */
  iterations: number;
  bisections: number;
  converged: boolean;
}

/** Default node count of the polynomial cross-check. */
export const defaultNewtonPolynomialNodes = 7;

/** Falling-limb inflection (UTC ms) between from_ms and to_ms by the Newton forward-difference polynomial. */
export function inflectionByNewtonPolynomial(
  series: Series,
  from_ms: number,
  to_ms: number,
  options?: NewtonPolynomialOptions,
): NewtonPolynomialInflection {
  const fn = 'inflectionByNewtonPolynomial';
  const { time_ms: t, discharge_m3s: q } = prepareSeries(series, fn);
  const count = options?.nodes ?? defaultNewtonPolynomialNodes;
  if (!Number.isInteger(count) || count < 4 || count > 12) {
    throw new RangeError(`${fn} needs nodes as an integer from 4 to 12; got ${String(count)}`);
  }
  if (!Number.isFinite(from_ms) || !Number.isFinite(to_ms) || !(to_ms > from_ms)) {
    throw new RangeError(`${fn} needs finite times with to_ms after from_ms; got ${from_ms} and ${to_ms}`);
  }
  if (from_ms < t[0] || to_ms > t[t.length - 1]) {
    throw new RangeError(`${fn} needs from_ms and to_ms inside the series (${t[0]}–${t[t.length - 1]} ms)`);
  }
  const step = (to_ms - from_ms) / (count - 1);
  const nodes_ms = new Float64Array(count);
  const nodes_m3s = new Float64Array(count);
  for (let j = 0; j < count; j++) {
    nodes_ms[j] = j === count - 1 ? to_ms : from_ms + j * step;
    nodes_m3s[j] = interpolateAt(t, q, nodes_ms[j]);
  }
  const differences = forwardDifferences(nodes_m3s);
  const coefficients = newtonToPower(differences);
  const d2 = derivative(derivative(coefficients));
  const d3 = derivative(d2);
  const d1 = derivative(coefficients);
  const bracket = fallingBracket(d1, d2, count - 1);
  if (bracket === null) {
    throw new RangeError(
      `${fn} found no falling-limb inflection between ${from_ms} and ${to_ms}: the polynomial's second ` +
        `derivative never turns from negative to positive there; choose a window around the steepest fall`,
    );
  }
  const root = safeguardedNewton(d2, d3, bracket[0], bracket[1]);
  return {
    inflection_ms: Math.round(from_ms + root.x * step),
    nodes_ms,
    nodes_m3s,
    differences,
    coefficients,
    root_s: root.x,
    iterations: root.iterations,
    bisections: root.bisections,
    converged: root.converged,
  };
}

/** Leading forward differences Δ^k y₀ of equally spaced values. */
export function forwardDifferences(y: ArrayLike<number>): Float64Array {
  const work = Float64Array.from(y);
  const out = new Float64Array(work.length);
  for (let k = 0; k < work.length; k++) {
    out[k] = work[0];
    for (let i = 0; i < work.length - k - 1; i++) work[i] = work[i + 1] - work[i];
  }
  return out;
}

/** Power-basis coefficients of P(s) = Σ_k Δ^k y₀ · s(s−1)…(s−k+1)/k!. */
export function newtonToPower(differences: ArrayLike<number>): Float64Array {
  const n = differences.length;
  const out = new Float64Array(n);
  let falling = new Float64Array(n);
  falling[0] = 1;
  let factorial = 1;
  for (let k = 0; k < n; k++) {
    if (k > 0) {
      factorial *= k;
      const next = new Float64Array(n);
      for (let j = 0; j < k; j++) {
        next[j + 1] += falling[j];
        next[j] -= (k - 1) * falling[j];
      }
      falling = next;
    }
    for (let j = 0; j <= k; j++) out[j] += (differences[k] * falling[j]) / factorial;
  }
  return out;
}

function derivative(c: Float64Array): Float64Array {
  const out = new Float64Array(Math.max(1, c.length - 1));
  for (let j = 1; j < c.length; j++) out[j - 1] = j * c[j];
  return out;
}

function horner(c: Float64Array, x: number): number {
  let v = 0;
  for (let j = c.length - 1; j >= 0; j--) v = v * x + c[j];
  return v;
}

/** The sign change of P″ from − to + over [0, span] where P′ is most negative (the steepest fall). */
function fallingBracket(d1: Float64Array, d2: Float64Array, span: number): [number, number] | null {
  const perStep = 32;
  const total = span * perStep;
  let best: [number, number] | null = null;
  let bestSlope = Infinity;
  let previous = horner(d2, 0);
  for (let k = 1; k <= total; k++) {
    const x = k / perStep;
    const g = horner(d2, x);
    if (previous < 0 && g >= 0) {
      const a = (k - 1) / perStep;
      const slope = Math.min(horner(d1, a), horner(d1, x));
      if (slope < bestSlope) {
        bestSlope = slope;
        best = [a, x];
      }
    }
    previous = g;
  }
  return best;
}

/** Newton–Raphson on g (derivative dg) kept inside the bracket [a, b] with g(a) < 0 ≤ g(b) by bisection. */
function safeguardedNewton(
  g: Float64Array,
  dg: Float64Array,
  a: number,
  b: number,
): { x: number; iterations: number; bisections: number; converged: boolean } {
  let x = 0.5 * (a + b);
  let bisections = 0;
  for (let iterations = 1; iterations <= 60; iterations++) {
    const gx = horner(g, x);
    if (gx === 0) return { x, iterations, bisections, converged: true };
    if (gx < 0) a = x;
    else b = x;
    const slope = horner(dg, x);
    let next = slope !== 0 ? x - gx / slope : NaN;
    if (!(next > a && next < b)) {
      next = 0.5 * (a + b);
      bisections++;
    }
    if (Math.abs(next - x) <= 1e-13 * Math.max(1, Math.abs(x))) return { x: next, iterations, bisections, converged: true };
    x = next;
  }
  return { x, iterations: 60, bisections, converged: false };
}

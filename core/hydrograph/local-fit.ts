// A weighted local polynomial fit (tricube weights) giving the smoothed slope and curvature of a record at any time.
import { sortedIndex } from '../sorted';

/** Slope (m³/s per ms) and curvature (m³/s per ms²) of a local polynomial fit centred on a time. */
export interface LocalShape {
  slope: number;
  curvature: number;
}

/** Degree of the local polynomial: a quartic keeps the curvature bias at O(h⁴) inside the record. */
export const LOCAL_FIT_DEGREE = 4;

const P = LOCAL_FIT_DEGREE + 1;
const M = new Float64Array(P * P);
const R = new Float64Array(P);
const X = new Float64Array(P);
const POW = new Float64Array(2 * P - 1);

/**
 * Fits Q ≈ Σ c_j·u^j (j ≤ LOCAL_FIT_DEGREE), u = (t − at_ms)/halfWidth_ms, by weighted least squares over
 * the readings within halfWidth_ms of at_ms (tricube weights), widening the window until at least
 * LOCAL_FIT_DEGREE + 3 readings carry weight. Returns null when the record has too few readings.
 */
export function localPolynomial(
  t: Float64Array,
  q: Float64Array,
  at_ms: number,
  halfWidth_ms: number,
): LocalShape | null {
  const n = t.length;
  if (n < P + 2) return null;
  let h = halfWidth_ms;
  for (;;) {
    const shape = fitWithin(t, q, at_ms, h);
    if (shape !== null) return shape;
    if (h > 4 * (t[n - 1] - t[0])) return null;
    h *= 1.5;
  }
}

function fitWithin(t: Float64Array, q: Float64Array, at: number, h: number): LocalShape | null {
  const lo = sortedIndex(t, at - h);
  let count = 0;
  M.fill(0);
  R.fill(0);
  for (let i = lo; i < t.length && t[i] < at + h; i++) {
    const u = (t[i] - at) / h;
    const a = Math.abs(u);
    if (a >= 1) continue;
    const c = 1 - a * a * a;
    let p = c * c * c;
    count++;
    const y = q[i];
    for (let j = 0; j < 2 * P - 1; j++) {
      POW[j] = p;
      if (j < P) R[j] += p * y;
      p *= u;
    }
    for (let r = 0; r < P; r++) for (let s = r; s < P; s++) M[r * P + s] += POW[r + s];
  }
  if (count < P + 2) return null;
  for (let r = 1; r < P; r++) for (let s = 0; s < r; s++) M[r * P + s] = M[s * P + r];
  if (!solve()) return null;
  return { slope: X[1] / h, curvature: (2 * X[2]) / (h * h) };
}

function solve(): boolean {
  for (let col = 0; col < P; col++) {
    let pivot = col;
    for (let r = col + 1; r < P; r++) if (Math.abs(M[r * P + col]) > Math.abs(M[pivot * P + col])) pivot = r;
    if (!(Math.abs(M[pivot * P + col]) > 1e-14 * Math.abs(M[0]))) return false;
    if (pivot !== col) {
      for (let c = 0; c < P; c++) {
        const tmp = M[col * P + c];
        M[col * P + c] = M[pivot * P + c];
        M[pivot * P + c] = tmp;
      }
      const tmp = R[col];
      R[col] = R[pivot];
      R[pivot] = tmp;
    }
    for (let r = col + 1; r < P; r++) {
      const f = M[r * P + col] / M[col * P + col];
      for (let c = col; c < P; c++) M[r * P + c] -= f * M[col * P + c];
      R[r] -= f * R[col];
    }
  }
  for (let r = P - 1; r >= 0; r--) {
    let s = R[r];
    for (let c = r + 1; c < P; c++) s -= M[r * P + c] * X[c];
    X[r] = s / M[r * P + r];
  }
  return true;
}


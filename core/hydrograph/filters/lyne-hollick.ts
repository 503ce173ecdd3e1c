// Lyne & Hollick (1979) recursive digital filter, passes alternating forward and backward
// (Nathan & McMahon 1990), with reflected ends (Ladson et al. 2013).

/** Default Lyne–Hollick settings: α = 0.925 per step, 3 passes, 30 values reflected at each end. */
export const defaultLyneHollick = { alpha: 0.925, passes: 3, reflect: 30 } as const;

/**
 * Baseflow (m³/s) of a regular, gap-free record by the Lyne–Hollick filter:
 * quickflow f_k = α·f_{k−1} + (1+α)/2·(x_k − x_{k−1}) kept within 0 ≤ f_k ≤ x_k, baseflow x_k − f_k,
 * where x is the discharge on the first pass and the previous pass's baseflow after that.
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
  const x = new Float64Array(n + 2 * r);
  x.set(q, r);
  for (let j = 1; j <= r; j++) {
    x[r - j] = q[j];
    x[r + n - 1 + j] = q[n - 1 - j];
  }
  const c = (1 + alpha) / 2;
  for (let pass = 0; pass < passes; pass++) {
    if (pass % 2 === 0) forward(x, alpha, c);
    else backward(x, alpha, c);
  }
  return x.slice(r, r + n);
}

function forward(x: Float64Array, alpha: number, c: number): void {
  let f = 0;
  let previous = x[0];
  for (let k = 1; k < x.length; k++) {
    const xk = x[k];
    f = alpha * f + c * (xk - previous);
    if (f < 0) f = 0;
    else if (f > xk) f = xk;
    previous = xk;
    x[k] = xk - f;
  }
}

function backward(x: Float64Array, alpha: number, c: number): void {
  let f = 0;
  let previous = x[x.length - 1];
  for (let k = x.length - 2; k >= 0; k--) {
    const xk = x[k];
    f = alpha * f + c * (xk - previous);
    if (f < 0) f = 0;
    else if (f > xk) f = xk;
    previous = xk;
    x[k] = xk - f;
  }
}

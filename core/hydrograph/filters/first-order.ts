// The one-store recursive filter shared by Eckhardt and Chapman–Maxwell: b_k = carry·b_{k−1} + gain·Q_k, b ≤ Q.

/**
 * Baseflow (m³/s) of a regular, gap-free record: b₀ = start·Q₀, then b_k = carry·b_{k−1} + gain·Q_k
 * capped at Q_k. Writes into `out` when given (same length as q).
 */
export function firstOrderFilter(
  q: Float64Array,
  carry: number,
  gain: number,
  start: number,
  out: Float64Array = new Float64Array(q.length),
): Float64Array {
  const n = q.length;
  let level = start * q[0];
  out[0] = level;
  for (let k = 1; k < n; k++) {
    const qk = q[k];
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    out[k] = level;
  }
  return out;
}

/**
 * The same filter, checking the record in the same loop: returns null unless every time is finite and
 * ascending, every interval equals the others within one part in a million (the rule of prepareSeries),
 * and every discharge is finite and ≥ 0. On null the caller takes the general path, which says what is wrong.
 */
export function firstOrderFilterChecked(
  t: Float64Array,
  q: Float64Array,
  carry: number,
  gain: number,
  start: number,
): Float64Array | null {
  const n = q.length;
  const out = new Float64Array(n);
  const q0 = q[0];
  let level = start * q0;
  out[0] = level;
  // The checks are kept free of branches: a NaN or infinity anywhere makes the sums non-finite.
  let qMin = q0;
  let qSum = q0;
  let stepMin = Infinity;
  let stepMax = -Infinity;
  let stepSum = 0;
  let previous = t[0];
  for (let k = 1; k < n; k++) {
    const qk = q[k];
    const tk = t[k];
    const step = tk - previous;
    previous = tk;
    qMin = qk < qMin ? qk : qMin;
    qSum += qk;
    stepSum += step;
    stepMin = step < stepMin ? step : stepMin;
    stepMax = step > stepMax ? step : stepMax;
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    out[k] = level;
  }
  const clean = qMin >= 0 && Number.isFinite(qSum) && Number.isFinite(t[0]) && Number.isFinite(stepSum) && stepMin > 0;
  return clean && stepMax - stepMin <= 1e-6 * stepMin ? out : null;
}

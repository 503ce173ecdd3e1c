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
 * The same filter, checking the record in the same loop: returns null unless every step is within 4·10⁻⁷ of
 * the first (hence the record is regular by the rule of prepareSeries, one part in a million, and its times
 * finite and ascending) and every discharge is finite and ≥ 0. The step test is a sum of squared deviations,
 * a sufficient condition: on null the caller takes the general path, which decides and says what is wrong.
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
  const step0 = t[1] - t[0];
  // A NaN or infinity anywhere makes the sums non-finite, so the loop needs no early exits.
  let deviation2 = 0;
  let qMin = q0;
  let qSum = q0;
  let previous = t[0];
  for (let k = 1; k < n; k++) {
    const qk = q[k];
    const tk = t[k];
    const d = tk - previous - step0;
    previous = tk;
    deviation2 += d * d;
    qSum += qk;
    qMin = qk < qMin ? qk : qMin;
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    out[k] = level;
  }
  return regularEnough(deviation2, step0) && qMin >= 0 && qSum < Infinity ? out : null;
}

/** True when a sum of squared step deviations (ms²) proves every step within 4·10⁻⁷ of step0 (ms > 0). */
export function regularEnough(deviation2: number, step0: number): boolean {
  const tolerance = 4e-7 * step0;
  return step0 > 0 && step0 < Infinity && deviation2 <= tolerance * tolerance;
}

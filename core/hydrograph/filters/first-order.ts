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

/** Readings the checked filter takes before telling its follower (a few tens of kB, still in cache). */
const STRETCH = 4096;

/** Something that reads the record just behind a filter pass, while those readings are still in cache. */
export interface PassFollower {
  /** Called after each stretch of the pass; end is the index after the last reading the pass has read. */
  takeBelow(end: number): void;
}

/**
 * The same filter, checking the record in the same loop: returns null unless every step is within 4·10⁻⁷ of
 * the first (hence the record is regular by the rule of prepareSeries, one part in a million, and its times
 * finite and ascending) and every discharge is finite and ≥ 0. The step test is a sum of squared deviations,
 * a sufficient condition: on null the caller takes the general path, which decides and says what is wrong.
 * The pass goes in stretches of a few thousand readings; after each it tells `follower` how far it got.
 */
export function firstOrderFilterChecked(
  t: Float64Array,
  q: Float64Array,
  carry: number,
  gain: number,
  start: number,
  follower: PassFollower,
): Float64Array | null {
  const n = q.length;
  const out = new Float64Array(n);
  const q0 = q[0];
  const step0 = t[1] - t[0];
  // level, sum of squared step deviations, smallest and sum of the discharges, carried from stretch to stretch.
  const state = new Float64Array([start * q0, 0, q0, q0]);
  out[0] = state[0];
  for (let from = 1; from < n; from += STRETCH) {
    const to = Math.min(n, from + STRETCH);
    checkedStretch(t, q, out, from, to, carry, gain, step0, state);
    follower.takeBelow(to);
  }
  return regularEnough(state[1], step0) && state[2] >= 0 && state[3] < Infinity ? out : null;
}

/**
 * One stretch (readings from..to − 1, from ≥ 1) of firstOrderFilterChecked into out, carrying `state`. A
 * function of its own, so the engine optimises this loop alone, whatever follows the pass.
 */
function checkedStretch(
  t: Float64Array,
  q: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
  carry: number,
  gain: number,
  step0: number,
  state: Float64Array,
): void {
  let level = state[0];
  let deviation2 = state[1];
  let qMin = state[2];
  let qSum = state[3];
  let previous = t[from - 1];
  // A NaN or infinity anywhere makes the sums non-finite, so the loop needs no early exits.
  for (let k = from; k < to; k++) {
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
  state[0] = level;
  state[1] = deviation2;
  state[2] = qMin;
  state[3] = qSum;
}

/** True when a sum of squared step deviations (ms²) proves every step within 4·10⁻⁷ of step0 (ms > 0). */
export function regularEnough(deviation2: number, step0: number): boolean {
  const tolerance = 4e-7 * step0;
  return step0 > 0 && step0 < Infinity && deviation2 <= tolerance * tolerance;
}

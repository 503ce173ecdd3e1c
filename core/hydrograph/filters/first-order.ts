// The one-store recursive filter shared by Eckhardt and Chapman–Maxwell: b_k = carry·b_{k−1} + gain·Q_k, b ≤ Q.
//
// Both passes below take the recursion two readings at a time. With c = carry ≥ 0, g = gain and m = min:
//   b_k     = m(c·b_{k−1} + g·Q_k, Q_k)
//   b_{k+1} = m(c·b_k + g·Q_{k+1}, Q_{k+1})
//           = m(c²·b_{k−1} + (c·g·Q_k + g·Q_{k+1}),  m(c·Q_k + g·Q_{k+1}, Q_{k+1}))
// since c·m(x, y) = m(c·x, c·y) for c ≥ 0 and m(x, y) + z = m(x + z, y + z). So b_{k+1} waits on one multiply,
// one add and one comparison after b_{k−1}, not two of each, and b_k is worked out beside it: the pass is not
// held up by its own chain of arithmetic. The values agree with the one-step recursion to rounding (parts in
// 10¹⁵); the cap keeps b ≤ Q exactly, and b ≥ 0 whenever Q ≥ 0.
//
// Steady flow must stay at gain/(1 − c)·Q (BFImax·Q for Eckhardt) to the last digit or so. c is near 1 at short
// steps, and a stored c, or c², keeps only a few digits of 1 − c. So the filters give drain = 1 − c worked out
// directly, E = 1 − c² is taken as drain·(2 − drain), and the two gains of the pair are scaled by
// (1 − c²_stored)/E: the carried level then settles where the published recursion does.

/** The constants of two steps at once (see above): level ← pairCarry·level + gainA·Q_k + gainB·Q_{k+1}. */
function pairConstants(drain: number, gain: number): { pairCarry: number; gainA: number; gainB: number } {
  const e = drain * (2 - drain);
  const pairCarry = 1 - e;
  const scale = (1 - pairCarry) / e;
  return { pairCarry, gainA: (gain - gain * drain) * scale, gainB: gain * scale };
}

/**
 * Baseflow (m³/s) of a regular, gap-free record: b₀ = start·Q₀, then b_k = (1 − drain)·b_{k−1} + gain·Q_k
 * capped at Q_k (0 < drain ≤ 1). Writes into `out` when given (same length as q).
 */
export function firstOrderFilter(
  q: Float64Array,
  drain: number,
  gain: number,
  start: number,
  out: Float64Array = new Float64Array(q.length),
): Float64Array {
  const n = q.length;
  if (n === 0) return out;
  const carry = 1 - drain;
  const { pairCarry, gainA, gainB } = pairConstants(drain, gain);
  let level = start * q[0];
  out[0] = level;
  let k = 1;
  for (; k + 1 < n; k += 2) {
    const qa = q[k];
    const qb = q[k + 1];
    let a = carry * level + gain * qa;
    if (a > qa) a = qa;
    out[k] = a;
    let cap = carry * qa + gain * qb;
    if (cap > qb) cap = qb;
    level = pairCarry * level + (gainA * qa + gainB * qb);
    if (level > cap) level = cap;
    out[k + 1] = level;
  }
  if (k < n) {
    const qk = q[k];
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    out[k] = level;
  }
  return out;
}

/** Readings the checked filter takes before telling its follower (a few tens of kB, still in cache); even. */
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
 * The pass goes in stretches of a few thousand readings; after each it tells `follower` how far it got. The
 * values are firstOrderFilter's, bit for bit (the stretches are even, so the readings pair up alike).
 */
export function firstOrderFilterChecked(
  t: Float64Array,
  q: Float64Array,
  drain: number,
  gain: number,
  start: number,
  follower: PassFollower,
): Float64Array | null {
  const n = q.length;
  const out = new Float64Array(n);
  const q0 = q[0];
  const step0 = t[1] - t[0];
  // The level, the sum of squared step deviations and the sum of |Q| − Q, carried from stretch to stretch.
  const state = new Float64Array([start * q0, 0, Math.abs(q0) - q0]);
  out[0] = state[0];
  for (let from = 1; from < n; from += STRETCH) {
    const to = Math.min(n, from + STRETCH);
    checkedStretch(t, q, out, from, to, drain, gain, step0, state);
    follower.takeBelow(to);
  }
  return regularEnough(state[1], step0) && state[2] === 0 ? out : null;
}

/**
 * One stretch (readings from..to − 1, from ≥ 1) of firstOrderFilterChecked into out, carrying `state`. A
 * function of its own, so the engine optimises this loop alone, whatever follows the pass.
 *
 * |Q| − Q is 0 for a finite Q ≥ 0, positive for a negative or −∞ one and NaN for NaN or +∞, so its sum is
 * exactly 0 only when every discharge is finite and ≥ 0; a NaN or infinite time makes the deviations NaN.
 * Neither needs an early exit from the loop.
 */
function checkedStretch(
  t: Float64Array,
  q: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
  drain: number,
  gain: number,
  step0: number,
  state: Float64Array,
): void {
  const carry = 1 - drain;
  const { pairCarry, gainA, gainB } = pairConstants(drain, gain);
  let level = state[0];
  let deviation2 = state[1];
  let negative = state[2];
  let previous = t[from - 1];
  let k = from;
  for (; k + 1 < to; k += 2) {
    const qa = q[k];
    const qb = q[k + 1];
    const ta = t[k];
    const tb = t[k + 1];
    const da = ta - previous - step0;
    const db = tb - ta - step0;
    previous = tb;
    deviation2 += da * da + db * db;
    negative += Math.abs(qa) - qa + (Math.abs(qb) - qb);
    let a = carry * level + gain * qa;
    if (a > qa) a = qa;
    out[k] = a;
    let cap = carry * qa + gain * qb;
    if (cap > qb) cap = qb;
    level = pairCarry * level + (gainA * qa + gainB * qb);
    if (level > cap) level = cap;
    out[k + 1] = level;
  }
  if (k < to) {
    const qk = q[k];
    const d = t[k] - previous - step0;
    deviation2 += d * d;
    negative += Math.abs(qk) - qk;
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    out[k] = level;
  }
  state[0] = level;
  state[1] = deviation2;
  state[2] = negative;
}

/** True when a sum of squared step deviations (ms²) proves every step within 4·10⁻⁷ of step0 (ms > 0). */
export function regularEnough(deviation2: number, step0: number): boolean {
  const tolerance = 4e-7 * step0;
  return step0 > 0 && step0 < Infinity && deviation2 <= tolerance * tolerance;
}

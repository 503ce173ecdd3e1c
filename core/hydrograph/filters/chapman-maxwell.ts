// Chapman & Maxwell (1996) one-parameter recursive digital filter.

/** Default Chapman–Maxwell recession constant k (per step; 0.925 as commonly used with daily data). */
export const defaultChapmanMaxwell = { recession: 0.925 } as const;

/**
 * Baseflow (m³/s) of a regular, gap-free record: b_k = k/(2 − k)·b_{k−1} + (1 − k)/(2 − k)·Q_k, capped at
 * Q_k, starting at the steady-state value b₀ = Q₀/2.
 */
export function chapmanMaxwell(q: Float64Array, recession: number): Float64Array {
  const n = q.length;
  const b = new Float64Array(n);
  const carry = recession / (2 - recession);
  const gain = (1 - recession) / (2 - recession);
  let level = q[0] / 2;
  b[0] = level;
  for (let k = 1; k < n; k++) {
    const qk = q[k];
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    b[k] = level;
  }
  return b;
}

// Eckhardt (2005) two-parameter recursive digital filter.

/** BFImax presets by aquifer type (Eckhardt 2005): perennial/porous, ephemeral/porous, perennial/hard rock. */
export const BFI_MAX_PRESETS = {
  'perennial-porous': 0.8,
  'ephemeral-porous': 0.5,
  'perennial-hard-rock': 0.25,
} as const;

/** Default Eckhardt recession constant a ≈ 0.98 per day (daily data). */
export const defaultEckhardt = { recession: 0.98, bfiMax: BFI_MAX_PRESETS['perennial-porous'] } as const;

/**
 * Baseflow (m³/s) of a regular, gap-free record:
 * b_k = ((1 − BFImax)·a·b_{k−1} + (1 − a)·BFImax·Q_k) / (1 − a·BFImax), capped at Q_k,
 * starting at the steady-state value b₀ = BFImax·Q₀.
 */
export function eckhardt(q: Float64Array, bfiMax: number, recession: number): Float64Array {
  const n = q.length;
  const b = new Float64Array(n);
  const denominator = 1 - recession * bfiMax;
  const carry = ((1 - bfiMax) * recession) / denominator;
  const gain = ((1 - recession) * bfiMax) / denominator;
  let level = bfiMax * q[0];
  b[0] = level;
  for (let k = 1; k < n; k++) {
    const qk = q[k];
    level = carry * level + gain * qk;
    if (level > qk) level = qk;
    b[k] = level;
  }
  return b;
}

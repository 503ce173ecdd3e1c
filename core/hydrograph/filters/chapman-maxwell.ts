// Chapman & Maxwell (1996) one-parameter recursive digital filter.
import { firstOrderFilter } from './first-order';

/** Coefficients of b_k = carry·b_{k−1} + gain·Q_k for Chapman–Maxwell with the recession constant per step. */
export function chapmanMaxwellCoefficients(recessionPerStep: number): { carry: number; gain: number } {
  return { carry: recessionPerStep / (2 - recessionPerStep), gain: (1 - recessionPerStep) / (2 - recessionPerStep) };
}

/**
 * Baseflow (m³/s) of a regular, gap-free record, with the recession constant k per step of the record:
 * b_k = k/(2 − k)·b_{k−1} + (1 − k)/(2 − k)·Q_k, capped at Q_k, starting at the steady-state value b₀ = Q₀/2.
 */
export function chapmanMaxwell(q: Float64Array, recessionPerStep: number): Float64Array {
  const { carry, gain } = chapmanMaxwellCoefficients(recessionPerStep);
  return firstOrderFilter(q, carry, gain, 0.5);
}

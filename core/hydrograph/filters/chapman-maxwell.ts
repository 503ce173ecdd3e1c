// Chapman & Maxwell (1996) one-parameter recursive digital filter.
import { firstOrderFilter } from './first-order';

/**
 * Coefficients of b_k = b_{k−1} − drain·b_{k−1} + gain·Q_k for Chapman–Maxwell with the recession constant k
 * per step: carry = k/(2 − k), drain = 1 − carry = 2·(1 − k)/(2 − k) and gain = (1 − k)/(2 − k) = drain/2.
 */
export function chapmanMaxwellCoefficients(recessionPerStep: number): { drain: number; gain: number } {
  const gain = (1 - recessionPerStep) / (2 - recessionPerStep);
  return { drain: 2 * gain, gain };
}

/**
 * Baseflow (m³/s) of a regular, gap-free record, with the recession constant k per step of the record:
 * b_k = k/(2 − k)·b_{k−1} + (1 − k)/(2 − k)·Q_k, capped at Q_k, starting at the steady-state value b₀ = Q₀/2.
 */
export function chapmanMaxwell(q: Float64Array, recessionPerStep: number): Float64Array {
  const { drain, gain } = chapmanMaxwellCoefficients(recessionPerStep);
  return firstOrderFilter(q, drain, gain, 0.5);
}

// Eckhardt (2005) two-parameter recursive digital filter.
import { firstOrderFilter } from './first-order';

/** Coefficients of b_k = carry·b_{k−1} + gain·Q_k for Eckhardt's filter with the recession constant per step. */
export function eckhardtCoefficients(bfiMax: number, recessionPerStep: number): { carry: number; gain: number } {
  const denominator = 1 - recessionPerStep * bfiMax;
  return {
    carry: ((1 - bfiMax) * recessionPerStep) / denominator,
    gain: ((1 - recessionPerStep) * bfiMax) / denominator,
  };
}

/**
 * Baseflow (m³/s) of a regular, gap-free record, with the recession constant a per step of the record:
 * b_k = ((1 − BFImax)·a·b_{k−1} + (1 − a)·BFImax·Q_k) / (1 − a·BFImax), capped at Q_k,
 * starting at the steady-state value b₀ = BFImax·Q₀.
 */
export function eckhardt(q: Float64Array, bfiMax: number, recessionPerStep: number): Float64Array {
  const { carry, gain } = eckhardtCoefficients(bfiMax, recessionPerStep);
  return firstOrderFilter(q, carry, gain, bfiMax);
}

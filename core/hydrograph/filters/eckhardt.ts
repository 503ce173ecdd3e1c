// Eckhardt (2005) two-parameter recursive digital filter.
import { firstOrderFilter } from './first-order';

/**
 * Coefficients of b_k = b_{k−1} − drain·b_{k−1} + gain·Q_k for Eckhardt's filter with the recession constant a
 * per step: carry = (1 − BFImax)·a/(1 − a·BFImax), drain = 1 − carry = (1 − a)/(1 − a·BFImax) and
 * gain = BFImax·drain, so that gain/drain (the level under steady flow, over Q) is BFImax to rounding.
 */
export function eckhardtCoefficients(bfiMax: number, recessionPerStep: number): { drain: number; gain: number } {
  const drain = (1 - recessionPerStep) / (1 - recessionPerStep * bfiMax);
  return { drain, gain: bfiMax * drain };
}

/**
 * Baseflow (m³/s) of a regular, gap-free record, with the recession constant a per step of the record:
 * b_k = ((1 − BFImax)·a·b_{k−1} + (1 − a)·BFImax·Q_k) / (1 − a·BFImax), capped at Q_k,
 * starting at the steady-state value b₀ = BFImax·Q₀.
 */
export function eckhardt(q: Float64Array, bfiMax: number, recessionPerStep: number): Float64Array {
  const { drain, gain } = eckhardtCoefficients(bfiMax, recessionPerStep);
  return firstOrderFilter(q, drain, gain, bfiMax);
}

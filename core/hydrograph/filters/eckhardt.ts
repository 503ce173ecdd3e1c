// Eckhardt (2005) two-parameter recursive digital filter.
import { firstOrderFilter } from './first-order';

/** BFImax presets by aquifer type (Eckhardt 2005): perennial/porous, ephemeral/porous, perennial/hard rock. */
export const BFI_MAX_PRESETS = {
  'perennial-porous': 0.8,
  'ephemeral-porous': 0.5,
  'perennial-hard-rock': 0.25,
} as const;

/**
 * Default Eckhardt settings: recession constant a = 0.98 per day (the value for daily data; separateBaseflow
 * applies it at the record's step as a^(Δt/1 day)) and BFImax for a perennial stream on porous aquifers.
 */
export const defaultEckhardt = { recession: 0.98, bfiMax: BFI_MAX_PRESETS['perennial-porous'] } as const;

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

import { M_PER_FT } from '../units';

/** Wading limit on depth × velocity, m²/s: 10 ft²/s (USGS practice, from memory) = 0.9290304 m²/s. */
export const WADING_LIMIT_M2S = 10 * M_PER_FT * M_PER_FT;

/** Whether depth_m (m) × |velocity_mps| (m/s) reaches the wading limit. */
export function exceedsWadingLimit(depth_m: number, velocity_mps: number): boolean {
  if (!Number.isFinite(depth_m) || depth_m < 0) {
    throw new RangeError(`exceedsWadingLimit needs a finite depth ≥ 0 m; got ${String(depth_m)}`);
  }
  if (!Number.isFinite(velocity_mps)) {
    throw new RangeError(`exceedsWadingLimit needs a finite velocity_mps; got ${String(velocity_mps)}`);
  }
  return depth_m * Math.abs(velocity_mps) >= WADING_LIMIT_M2S;
}

/**
 * Point velocities observed in one vertical, by method: at 0.6 of the depth from the surface alone,
 * at 0.2 and 0.8, or at 0.2, 0.6 and 0.8 (all m/s).
 */
export type PointVelocities =
  | { kind: 'six-tenths'; v06_mps: number }
  | { kind: 'two-point'; v02_mps: number; v08_mps: number }
  | { kind: 'three-point'; v02_mps: number; v06_mps: number; v08_mps: number };

/** Depth (m) below which the 0.6-depth method is used, above which 0.2 and 0.8 (Buchanan & Somers 1969). */
export const SIX_TENTHS_DEPTH_LIMIT_M = 0.75;

function finiteVelocity(what: string, v: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new RangeError(`verticalMeanVelocity needs a finite ${what}; got ${String(v)}`);
  }
  return v;
}

/**
 * Mean velocity in a vertical (m/s) from point observations: v0.6; (v0.2 + v0.8)/2; or the average of
 * v0.6 and (v0.2 + v0.8)/2 (Buchanan & Somers 1969, USGS TWRI 3-A8; Turnipseed & Sauer 2010, TM 3-A8).
 */
export function verticalMeanVelocity(obs: PointVelocities): number {
  switch (obs.kind) {
    case 'six-tenths':
      return finiteVelocity('v06_mps', obs.v06_mps);
    case 'two-point':
      return 0.5 * (finiteVelocity('v02_mps', obs.v02_mps) + finiteVelocity('v08_mps', obs.v08_mps));
    case 'three-point': {
      const twoPoint = 0.5 * (finiteVelocity('v02_mps', obs.v02_mps) + finiteVelocity('v08_mps', obs.v08_mps));
      return 0.5 * (finiteVelocity('v06_mps', obs.v06_mps) + twoPoint);
    }
    default: {
      const unknown: never = obs;
      throw new RangeError(
        `verticalMeanVelocity needs kind 'six-tenths', 'two-point' or 'three-point'; got ${String((unknown as { kind?: unknown }).kind)}`,
      );
    }
  }
}

/** The usual method for a vertical of depth_m (m): 0.6 depth below 0.75 m, else 0.2 and 0.8. */
export function suggestedVelocityMethod(depth_m: number): 'six-tenths' | 'two-point' {
  if (!Number.isFinite(depth_m) || depth_m < 0) {
    throw new RangeError(`suggestedVelocityMethod needs a finite depth ≥ 0 m; got ${String(depth_m)}`);
  }
  return depth_m < SIX_TENTHS_DEPTH_LIMIT_M ? 'six-tenths' : 'two-point';
}

// Plain-data types of a stage–discharge rating. All stages in metres above gauge datum, discharge in m³/s.

/** One power-law piece Q = coefficient · (stage + shift − offset_m)^exponent, used from fromStage_m upward. */
export interface RatingSegment {
  /** Lower breakpoint, m: the segment applies from here up to the next segment's fromStage_m. */
  fromStage_m: number;
  /** C in Q = C·(h − e)^b, in m³/s per m^b; must be > 0. */
  coefficient: number;
  /** e, the gauge height of zero flow for this segment, m. */
  offset_m: number;
  /** b, dimensionless; must be > 0. */
  exponent: number;
}

/** A rating: segments sorted by fromStage_m (strictly ascending); the first also applies below its breakpoint. */
export interface Rating {
  segments: RatingSegment[];
  /** Lowest and highest gauged stage, m; stages outside it are extrapolated. */
  gaugedRange_m?: [number, number];
}

/** One gauging: the stage during the measurement (m) and the measured discharge (m³/s). */
export interface GaugingPoint {
  stage_m: number;
  discharge_m3s: number;
}

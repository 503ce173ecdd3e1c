// Plain-data types of a velocity–area discharge measurement.

/** One vertical: station across the section (m), depth (m), mean velocity (m/s), optional angle coefficient. */
export interface Vertical {
  station_m: number;
  depth_m: number;
  /** Mean velocity in the vertical, m/s (negative for reverse flow). */
  velocity_mps: number;
  /** Cosine of the angle between the flow and the normal to the section, in (0, 1]; default 1. */
  angleCoefficient?: number;
}

/** The part of the section a vertical stands for: its station (m), width (m), area (m²), discharge (m³/s), share of Q. */
export interface Subsection {
  station_m: number;
  width_m: number;
  area_m2: number;
  discharge_m3s: number;
  /** Fraction of the total discharge, 0–1 (0 for every subsection when the total is not positive). */
  share: number;
}

/** Result of a mid-section computation: totals in m³/s, m², m, m/s, the subsections and warning sentences. */
export interface MidSectionResult {
  discharge_m3s: number;
  area_m2: number;
  width_m: number;
  meanVelocity_mps: number;
  subsections: Subsection[];
  warnings: string[];
}

// The range around a direct runoff volume: the rating's standard error carried through the discharges to
// the volume, and the spread of the separation methods, as plain arithmetic for the screen and its tests.

/**
 * Standard error (percent, in log space) used for a rating that has none: 10 %, a common working figure
 * for a rating checked by a handful of gaugings (common practice, not a published constant).
 */
export const DEFAULT_RATING_SE_PCT = 10;

/** The low and high ends of a volume range, m³, with the parts they come from. */
export interface RunoffRange {
  /** The volume of the chosen method, m³. */
  volume_m3: number;
  /** The chosen method's volume with every discharge one standard error lower and higher, m³. */
  rating: { low_m3: number; high_m3: number };
  /** Lowest and highest volume among the methods that worked, m³. */
  methods: { low_m3: number; high_m3: number };
  /** The whole range: the lowest method one standard error low to the highest one standard error high, m³. */
  low_m3: number;
  high_m3: number;
}

/**
 * The range of a direct runoff volume (m³) given the volumes of every method (m³) and the rating's
 * standard error (percent, log space). A rating error moves every discharge of the storm by the same
 * factor f = 1 + se/100 (one rating, one bias: the case that matters for a volume); every separation
 * method here is linear in the discharges (scaling Q by f scales baseflow by f), so the direct volume
 * moves by the same factor: V/f to V·f.
 */
export function runoffRange(volume_m3: number, methodVolumes_m3: readonly number[], se_pct: number): RunoffRange {
  if (!(se_pct >= 0) || !Number.isFinite(se_pct)) throw new RangeError(`The rating's standard error must be 0 % or more; got ${se_pct}`);
  const f = 1 + se_pct / 100;
  const all = [volume_m3, ...methodVolumes_m3.filter((v) => Number.isFinite(v))];
  const lowM = Math.min(...all);
  const highM = Math.max(...all);
  return {
    volume_m3,
    rating: { low_m3: volume_m3 / f, high_m3: volume_m3 * f },
    methods: { low_m3: lowM, high_m3: highM },
    low_m3: lowM / f,
    high_m3: highM * f,
  };
}

/** A figure rounded to `digits` significant figures, for "about" sentences (0 stays 0). */
export function roundAbout(v: number, digits = 2): number {
  return Number.isFinite(v) ? Number(v.toPrecision(digits)) : v;
}

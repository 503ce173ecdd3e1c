// The range around a direct runoff volume that a technician is shown (DOMAIN.md §5): the rating's standard
// error as a log-normal band, widened where discharges lie beyond the gauged range, the spread of the methods
// suited to the record, the key points moved within their tolerance, and the ends rounded outward.

/**
 * Standard error (percent, log space) taken for a rating without fit statistics: 10 %, a common working
 * figure for a rating checked by a handful of gaugings (common practice, not a published constant). The range
 * says plainly when it is used.
 */
export const DEFAULT_RATING_SE_PCT = 10;

/** How much wider the band is for the part of the volume from discharges beyond the gauged range: doubled. */
export const EXTRAPOLATION_BAND_FACTOR = 2;

/** One separation method's volume on the storm (m³), or the plain reason it is left out of the spread. */
export interface MethodVolume {
  /** The method's name as the caller shows it. */
  name: string;
  volume_m3?: number;
  /** Why this method is not in the spread (gave no volume, daily-only for the step, restarted at a gap). */
  leftOut?: string;
}

/** What the range is built from. */
export interface RunoffRangeInput {
  /** The chosen method's direct runoff volume, m³. */
  volume_m3: number;
  /** Every method tried on the storm; those with a leftOut reason or no volume stay out of the spread. */
  methods?: readonly MethodVolume[];
  /** The rating's standard error in percent (log space); undefined when the rating has none. */
  standardError_pct?: number;
  /** Width of the band in standard errors: 1 (about 68 %) or 2 (about 95 %). Default 1. */
  band?: 1 | 2;
  /** Share (0–1) of the direct volume from discharges beyond the gauged range. Default 0. */
  extrapolatedShare?: number;
  /** The chosen method's volume (m³) with the key points moved within their own tolerance. */
  keyPointVolumes_m3?: readonly number[];
  /** Significant figures the ends are rounded outward to. Default 2. */
  digits?: number;
}

/** The range and what it holds, each part in m³, with plain sentences saying so. */
export interface RunoffRange {
  volume_m3: number;
  /** The ends, rounded outward (low down, high up) to `digits` significant figures, m³. */
  low_m3: number;
  high_m3: number;
  /** The ends before rounding, m³. */
  exact: { low_m3: number; high_m3: number };
  rating: {
    standardError_pct: number;
    /** True when the rating has no statistics and DEFAULT_RATING_SE_PCT was taken. */
    isDefault: boolean;
    band: 1 | 2;
    /** Volume factors of the band, below and above 1, with the widening for extrapolation included. */
    lowFactor: number;
    highFactor: number;
    extrapolatedShare: number;
  };
  /** The spread of the methods in it, and the methods left out with why. */
  methods: { low_m3: number; high_m3: number; used: string[]; leftOut: { name: string; reason: string }[] };
  keyPoints?: { low_m3: number; high_m3: number };
  /** Plain sentences: which band, which methods, whether extrapolation widened it, the default if taken. */
  sentences: string[];
}

/** x rounded down (toward −∞) to `digits` significant figures. */
export function roundDown(x: number, digits = 2): number {
  return roundTo(x, digits, Math.floor);
}

/** x rounded up (toward +∞) to `digits` significant figures. */
export function roundUp(x: number, digits = 2): number {
  return roundTo(x, digits, Math.ceil);
}

function roundTo(x: number, digits: number, how: (v: number) => number): number {
  if (!Number.isFinite(x) || x === 0) return x;
  const scale = Math.pow(10, digits - 1 - Math.floor(Math.log10(Math.abs(x))));
  // The tiny nudge keeps a value already on the grid (2.4 × 10⁴ stored as 23999.999…) where it is.
  const v = how(Number((x * scale).toPrecision(12)));
  return scale >= 1 ? v / scale : v * Math.round(1 / scale);
}

function check(name: string, v: number | undefined, ok: (x: number) => boolean, expected: string): void {
  if (v === undefined) return;
  if (typeof v !== 'number' || !Number.isFinite(v) || !ok(v)) throw new RangeError(`runoffRange needs ${name} ${expected}; got ${String(v)}`);
}

/**
 * The range of a direct runoff volume. The rating's S_e is a log-space standard deviation, so a ±z·S_e band
 * on every discharge is the factor exp(±z·S_e/100) (standard log-normal propagation, DOMAIN.md §2); one
 * rating error moves every discharge of the storm by the same factor, and every separation method here is
 * linear in the discharges, so the direct volume moves by it too. The share x of the volume from discharges
 * beyond the gauged range gets the band doubled: factor (1 − x)·exp(±zS) + x·exp(±2zS). The band is laid
 * around the lowest and highest of the chosen volume, the suited methods and the key-point volumes; the
 * ends are rounded outward.
 */
export function runoffRange(input: RunoffRangeInput): RunoffRange {
  const { volume_m3 } = input;
  check('the volume', volume_m3, (x) => x >= 0, 'as a volume of 0 m³ or more');
  check("the rating's standard error", input.standardError_pct, (x) => x >= 0, 'as 0 % or more');
  check('the extrapolated share', input.extrapolatedShare, (x) => x >= 0 && x <= 1, 'from 0 to 1');
  const band = input.band ?? 1;
  if (band !== 1 && band !== 2) throw new RangeError(`runoffRange needs a band of 1 or 2 standard errors; got ${String(band)}`);
  const digits = input.digits ?? 2;
  const isDefault = input.standardError_pct === undefined;
  const se = isDefault ? DEFAULT_RATING_SE_PCT : (input.standardError_pct as number);
  const x = input.extrapolatedShare ?? 0;
  const s = (band * se) / 100;
  const wide = EXTRAPOLATION_BAND_FACTOR * s;
  const lowFactor = (1 - x) * Math.exp(-s) + x * Math.exp(-wide);
  const highFactor = (1 - x) * Math.exp(s) + x * Math.exp(wide);

  const used: string[] = [];
  const leftOut: { name: string; reason: string }[] = [];
  const volumes: number[] = [];
  for (const m of input.methods ?? []) {
    if (m.leftOut !== undefined) leftOut.push({ name: m.name, reason: m.leftOut });
    else if (m.volume_m3 === undefined || !Number.isFinite(m.volume_m3)) leftOut.push({ name: m.name, reason: 'it gave no volume on this storm' });
    else {
      used.push(m.name);
      volumes.push(m.volume_m3);
    }
  }
  const methodsLow = Math.min(volume_m3, ...volumes);
  const methodsHigh = Math.max(volume_m3, ...volumes);
  const kp = (input.keyPointVolumes_m3 ?? []).filter((v) => Number.isFinite(v));
  const keyPoints = kp.length > 0 ? { low_m3: Math.min(volume_m3, ...kp), high_m3: Math.max(volume_m3, ...kp) } : undefined;
  const lowBase = Math.min(methodsLow, keyPoints?.low_m3 ?? Infinity);
  const highBase = Math.max(methodsHigh, keyPoints?.high_m3 ?? -Infinity);
  const exact = { low_m3: Math.max(0, lowBase * lowFactor), high_m3: highBase * highFactor };

  const pct = (v: number) => String(Number(v.toPrecision(2)));
  const sentences = [
    `The rating's ±${band === 1 ? '1 standard error (about 68 % of errors)' : '2 standard errors (about 95 % of errors)'} on every discharge: ` +
      `the volume × ${pct(Math.exp(-s))} to × ${pct(Math.exp(s))} for a standard error of ${pct(se)} %.`,
  ];
  if (isDefault) sentences.push(`The rating has no fit statistics, so a standard error of ${DEFAULT_RATING_SE_PCT} % is assumed (common practice).`);
  if (x > 0) {
    sentences.push(
      `${pct(100 * x)} % of the volume comes from discharges beyond the gauged range: the band is doubled for that part, so it is wider.`,
    );
  }
  if (used.length > 0) sentences.push(`The spread of ${used.length === 1 ? 'the method' : 'the methods'} ${used.join(', ')}.`);
  for (const l of leftOut) sentences.push(`${l.name} is left out: ${l.reason}`);
  if (keyPoints) sentences.push('The key points moved within their tolerance.');
  return {
    volume_m3,
    low_m3: roundDown(exact.low_m3, digits),
    high_m3: roundUp(exact.high_m3, digits),
    exact,
    rating: { standardError_pct: se, isDefault, band, lowFactor, highFactor, extrapolatedShare: x },
    methods: { low_m3: methodsLow, high_m3: methodsHigh, used, leftOut },
    ...(keyPoints ? { keyPoints } : {}),
    sentences,
  };
}

/**
 * Share (0–1) of the direct runoff ∫(Q − b) dt between from_ms and to_ms (trapezoids on the readings) that
 * lies on intervals touching a discharge flagged as beyond the gauged range (flag 1).
 */
export function extrapolatedShare(
  time_ms: ArrayLike<number>,
  discharge_m3s: ArrayLike<number>,
  baseflow_m3s: ArrayLike<number>,
  flags: ArrayLike<number>,
  from_ms = -Infinity,
  to_ms = Infinity,
): number {
  let all = 0;
  let flagged = 0;
  for (let i = 0; i + 1 < time_ms.length; i++) {
    if (time_ms[i] < from_ms || time_ms[i + 1] > to_ms) continue;
    const d0 = Math.max(0, discharge_m3s[i] - baseflow_m3s[i]);
    const d1 = Math.max(0, discharge_m3s[i + 1] - baseflow_m3s[i + 1]);
    const area = ((d0 + d1) / 2) * (time_ms[i + 1] - time_ms[i]);
    if (!Number.isFinite(area)) continue;
    all += area;
    if (flags[i] === 1 || flags[i + 1] === 1) flagged += area;
  }
  return all > 0 ? flagged / all : 0;
}

import { tryJohnsonOffset } from './johnson';
import { logLineAt } from './log-regression';
import { scanThenBrent } from './minimize';
import type { GaugingPoint, RatingSegment } from './types';
import { requireFinite } from './validate';

/** Options of fitRating: offset_m (m) fixes the gauge height of zero flow (e.g. a surveyed control). */
export interface FitRatingOptions {
  offset_m?: number;
}

/** A fitted rating segment with its statistics; percentages are of the rated discharge. */
export interface RatingFit {
  /** The fitted segment; fromStage_m is the offset, so it applies over the whole range of stage. */
  segment: RatingSegment;
  /** 100 × √(Σ(ln Q_i − ln Q̂_i)²/(n − p)), in percent; p = 3 with a fitted offset, 2 with a fixed one. */
  standardError_pct: number;
  /** 100·(Q_meas − Q_rating)/Q_rating for each gauging, in input order. */
  deviations_pct: number[];
  /** Plain sentences about things that do not stop the fit. */
  warnings: string[];
  /** Whether the offset was searched for (true) or fixed by the caller (false). */
  offsetFitted: boolean;
  /** n − p. */
  degreesOfFreedom: number;
  /** Lowest and highest gauged stage, m. */
  gaugedRange_m: [number, number];
  /** Johnson's three-point offset (m) as a cross-check, when the gaugings give one. */
  johnsonOffset_m?: number;
}

/** Fewest gaugings a rating should rest on before fitRating stops warning (ISO 18320 guidance, from memory). */
export const FIT_ADVISED_GAUGINGS = 12;
/** Usual range of the exponent for natural controls (Rantz et al. 1982, from memory). */
export const USUAL_EXPONENT_RANGE: readonly [number, number] = [1.3, 3.0];
/** Offsets are searched from min stage − this × stage span up to just below the lowest stage. */
export const OFFSET_SEARCH_SPANS = 10;
const OFFSET_NEAREST_FRACTION = 1e-6;
const GRID_POINTS = 48;
const OUTLIER_FLOOR_LN = 1e-6;

function validatePoints(points: readonly GaugingPoint[]): void {
  if (!Array.isArray(points)) throw new RangeError('fitRating needs an array of gaugings');
  points.forEach((p, i) => {
    requireFinite('fitRating', `stage_m at index ${i}`, p?.stage_m);
    requireFinite('fitRating', `discharge_m3s at index ${i}`, p?.discharge_m3s);
    if (!(p.discharge_m3s > 0)) {
      throw new RangeError(
        `fitRating needs discharges > 0 m³/s to fit in log space; gauging at index ${i} has ${p.discharge_m3s} m³/s`,
      );
    }
  });
}

/**
 * Fits Q = C·(h − e)^b to gaugings in log space. Without options.offset_m, e is found by Brent's
 * method on the log-space sum of squares over ln(min h − e), bracketed by a grid scan and seeded with
 * Johnson's estimate; for each trial e, C and b come from linear least squares.
 */
export function fitRating(points: readonly GaugingPoint[], options: FitRatingOptions = {}): RatingFit {
  validatePoints(points);
  const n = points.length;
  const distinct = new Set(points.map((p) => p.stage_m)).size;
  if (distinct < 3) throw new RangeError(`fitRating needs at least 3 distinct stages; got ${distinct}`);
  const fixed = options.offset_m !== undefined;
  const p = fixed ? 2 : 3;
  if (n <= p) {
    throw new RangeError(
      `fitRating needs at least ${p + 1} gaugings to ${fixed ? 'fit C and b' : 'fit C, b and the offset'} and estimate the standard error (n − ${p} degrees of freedom); got ${n}`,
    );
  }
  const stage = new Float64Array(n);
  const lnQ = new Float64Array(n);
  const scratch = new Float64Array(n);
  let minH = Infinity;
  let maxH = -Infinity;
  for (let i = 0; i < n; i++) {
    stage[i] = points[i].stage_m;
    lnQ[i] = Math.log(points[i].discharge_m3s);
    minH = Math.min(minH, stage[i]);
    maxH = Math.max(maxH, stage[i]);
  }
  const warnings: string[] = [];
  const johnson = tryJohnsonOffset(points);
  const johnsonOffset_m = 'offset_m' in johnson ? johnson.offset_m : undefined;

  let offset: number;
  if (fixed) {
    offset = options.offset_m as number;
    requireFinite('fitRating', 'offset_m', offset);
    if (!(offset < minH)) {
      throw new RangeError(`fitRating needs offset_m below the lowest gauged stage ${minH} m; got ${offset} m`);
    }
  } else {
    // Search t = ln(min h − e): equal steps in t are equal relative steps in the distance to zero flow,
    // which is how the log-space fit responds to the offset.
    const span = maxH - minH;
    const tLo = Math.log(span * OFFSET_NEAREST_FRACTION);
    const tHi = Math.log(span * OFFSET_SEARCH_SPANS);
    const sseAt = (t: number): number => logLineAt(stage, lnQ, minH - Math.exp(t), scratch).sse;
    // Johnson's estimate seeds the scan when it falls inside the range.
    const tJ = johnsonOffset_m !== undefined ? Math.log(minH - johnsonOffset_m) : NaN;
    const t = scanThenBrent(sseAt, tLo, tHi, GRID_POINTS, tJ > tLo && tJ < tHi ? [tJ] : []);
    offset = minH - Math.exp(t);
    const edge = 1e-6 * (tHi - tLo);
    if (t - tLo <= edge) {
      warnings.push(
        `The offset ended at the top of its search range, just below the lowest gauged stage ${minH} m; it is poorly determined by these gaugings, so consider fixing it from a survey of the control.`,
      );
    } else if (tHi - t <= edge) {
      warnings.push(
        `The offset ended at the bottom of its search range (${OFFSET_SEARCH_SPANS} stage spans below the lowest gauging); it is poorly determined by these gaugings, so consider fixing it from a survey of the control.`,
      );
    }
  }

  const line = logLineAt(stage, lnQ, offset, scratch);
  if (!(line.exponent > 0)) {
    throw new RangeError(
      `fitRating needs gaugings whose discharge rises with stage; the fitted exponent is ${line.exponent.toPrecision(4)}`,
    );
  }
  const coefficient = Math.exp(line.lnCoefficient);
  const dof = n - p;
  const se = Math.sqrt(line.sse / dof);
  const deviations_pct: number[] = [];
  for (let i = 0; i < n; i++) {
    const rated = coefficient * Math.pow(stage[i] - offset, line.exponent);
    deviations_pct.push((100 * (points[i].discharge_m3s - rated)) / rated);
  }

  if (n < FIT_ADVISED_GAUGINGS) {
    warnings.push(`Only ${n} gaugings; at least ${FIT_ADVISED_GAUGINGS} spread over the range of stage are advised for a rating.`);
  }
  const [bLow, bHigh] = USUAL_EXPONENT_RANGE;
  if (line.exponent < bLow || line.exponent > bHigh) {
    warnings.push(
      `The fitted exponent ${line.exponent.toFixed(2)} is outside the usual range ${bLow}–${bHigh.toFixed(1)} for natural controls; check the offset and the gaugings.`,
    );
  }
  for (let i = 0; i < n; i++) {
    const residual = lnQ[i] - line.lnCoefficient - line.exponent * Math.log(stage[i] - offset);
    // The floor keeps rounding-level residuals of near-exact data from being called outliers.
    if (Math.abs(residual) > Math.max(2 * se, OUTLIER_FLOOR_LN)) {
      const d = deviations_pct[i];
      warnings.push(
        `The gauging at index ${i} (stage ${stage[i].toFixed(3)} m, ${points[i].discharge_m3s.toPrecision(4)} m³/s) deviates by ${d > 0 ? '+' : ''}${d.toFixed(1)} % from the fit, more than 2 standard errors.`,
      );
    }
  }

  return {
    segment: { fromStage_m: offset, coefficient, offset_m: offset, exponent: line.exponent },
    standardError_pct: 100 * se,
    deviations_pct,
    warnings,
    offsetFitted: !fixed,
    degreesOfFreedom: dof,
    gaugedRange_m: [minH, maxH],
    ...(johnsonOffset_m !== undefined ? { johnsonOffset_m } : {}),
  };
}

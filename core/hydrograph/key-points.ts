// Key points of a storm event: rise start, peak, falling-limb inflection and end of direct runoff.
import {
  BURST_DIP_SHARE,
  RISE_START_SHARE,
  RISE_START_SIGMAS,
  STORM_SIGMAS,
  walkBack,
  walkOn,
  type FallWalk,
  type RiseWalk,
} from './event-walk';
import { inflectionOnPrepared } from './inflection';
import { noiseSigma, runningMean } from './noise';
import { checkArea, durationLabel, MS_PER_DAY, prepareSeries, type EventPoints, type Gap, type Series } from './series';
import { semiLogBreak } from './semi-log-break';

/** Days from the peak to the end of direct runoff, N = 0.827·A^0.2 with A in km² (Linsley, Kohler & Paulhus). */
export function runoffDuration_days(area_km2: number): number {
  return 0.827 * Math.pow(checkArea(area_km2, 'runoffDuration_days'), 0.2);
}

/** Options of findEventPoints: with a catchment area (km²) the end of runoff is the peak + N days. */
export interface EventPointOptions {
  area_km2?: number;
}

/** Key points with how each was found: plain sentences for the screen, and the record's noise σ (m³/s). */
export interface EventPointsDetailed {
  points: EventPoints;
  notes: string[];
  noise_m3s: number;
}

/**
 * Half-width, in readings, of the running mean the walks look at (5 readings in all) when the record is noisy:
 * when σ exceeds a quarter of a percent of the rise, so that the noise, not the share of the rise, sets the
 * tolerances. In readings, not in time, so that stretching a record's time scale moves no key point; and
 * only on noisy records, so that a clean hourly record keeps every short burst it shows.
 */
const WALK_SMOOTHING_READINGS = 2;
const WALK_SMOOTHING_NOISE_SHARE = 0.0025;

/**
 * Finds the key points (UTC ms): peak = the highest reading; rise start = the last reading before the flow
 * rises above its pre-event level; end of runoff = the last burst's peak + N days with an area (not past the
 * next storm nor the last reading), else where the recession becomes straight on a semi-log plot; inflection
 * = steepest fall between them. Tolerances scale to the record's noise (DOMAIN.md §4); a record with no rise
 * of more than 10σ above its pre-event level has no storm and is refused with a RangeError.
 */
export function findEventPoints(series: Series, options?: EventPointOptions): EventPoints {
  return findEventPointsDetailed(series, options).points;
}

/** Like findEventPoints, with notes saying how the points were found and what the record limits; times in whole ms. */
export function findEventPointsDetailed(series: Series, options?: EventPointOptions): EventPointsDetailed {
  const fn = 'findEventPoints';
  const prepared = prepareSeries(series, fn);
  const { time_ms: t, discharge_m3s: q } = prepared;
  const notes = [...prepared.notes];
  const area = options?.area_km2 === undefined ? undefined : checkArea(options.area_km2, fn);
  const n = t.length;
  if (n < 4) throw new RangeError(`${fn} needs at least 4 readings; got ${n}`);
  const sigma = noiseSigma(q, missingMask(prepared.gaps, n));
  let peak = 0;
  let lowest = 0;
  for (let i = 1; i < n; i++) {
    if (q[i] > q[peak]) peak = i;
    if (q[i] < q[lowest]) lowest = i;
  }
  refuseWithoutStorm(q[peak] - q[lowest], sigma);
  if (peak === 0) throw new RangeError('No storm was found in this record: the highest reading is the first one, so there is no rise before the peak.');
  if (peak === n - 1) throw new RangeError(`${fn} needs readings after the peak; the highest reading is the last one`);
  const noisy = sigma > WALK_SMOOTHING_NOISE_SHARE * (q[peak] - q[lowest]);
  const s = noisy ? runningMean(q, WALK_SMOOTHING_READINGS) : q;
  const back = walkBack(q, s, peak, sigma);
  refuseWithoutStorm(q[peak] - back.level_m3s, sigma);
  const on = walkOn(q, s, peak, back.level_m3s, sigma);
  const { fallEnd, lastPeak } = on;
  if (fallEnd === peak) throw new RangeError(`${fn} needs a falling limb after the peak`);
  notes.push(...limitNotes(t, q, s, peak, back, on, sigma));
  const rise_ms = t[back.riseStart];
  if (area !== undefined) {
    const days = runoffDuration_days(area);
    let end_ms = Math.round(t[lastPeak] + days * MS_PER_DAY);
    const from = lastPeak === peak ? 'peak' : "last burst's peak";
    if (on.nextStorm && end_ms > t[fallEnd]) {
      notes.push(
        `The ${from} + N = ${days.toPrecision(3)} days runs into the next storm, which starts ` +
          `${durationLabel(t[fallEnd] - t[lastPeak])} after it; the end of runoff was set to the start of the next storm.`,
      );
      end_ms = t[fallEnd];
    } else if (end_ms > t[n - 1]) {
      notes.push(`The end of runoff (${from} + ${days.toPrecision(3)} days) is after the last reading; it was set to the last reading.`);
      end_ms = t[n - 1];
    } else {
      notes.push(`The end of runoff is the ${from} + N = 0.827·A^0.2 = ${days.toPrecision(3)} days.`);
    }
    let searchEnd = Math.min(end_ms, t[fallEnd]);
    if (!(searchEnd > t[lastPeak])) searchEnd = t[Math.min(n - 1, lastPeak + 1)];
    const inflection = inflectionOnPrepared(t, q, t[lastPeak], searchEnd).inflection_ms;
    const points = { riseStart_ms: rise_ms, peak_ms: t[peak], inflection_ms: Math.min(inflection, end_ms), runoffEnd_ms: end_ms };
    return { points: wholeMs(points, t[0], t[n - 1]), notes, noise_m3s: sigma };
  }
  const searchEnd = fallEnd > lastPeak ? fallEnd : Math.min(n - 1, lastPeak + 1);
  const inflection = inflectionOnPrepared(t, q, t[lastPeak], t[searchEnd]).inflection_ms;
  const end_ms = Math.round(semiLogBreak(t, q, inflection, searchEnd));
  notes.push('The end of runoff is where the recession becomes straight on a semi-log plot (two-line fit of ln Q).');
  const points = { riseStart_ms: rise_ms, peak_ms: t[peak], inflection_ms: Math.min(inflection, end_ms), runoffEnd_ms: end_ms };
  return { points: wholeMs(points, t[0], t[n - 1]), notes, noise_m3s: sigma };
}

/** Throws the RangeError of a record with no storm: a rise (m³/s) not clearly above 10 times the noise σ. */
function refuseWithoutStorm(rise_m3s: number, sigma: number): void {
  if (rise_m3s > STORM_SIGMAS * sigma) return;
  throw new RangeError(
    `No storm was found in this record: the highest reading stands ${sig(rise_m3s)} m³/s above the flow before it, ` +
      `and a storm needs more than ${STORM_SIGMAS} times the record's noise (σ = ${sig(sigma)} m³/s), that is ` +
      `${sig(STORM_SIGMAS * sigma)} m³/s. Choose a window with a storm in it.`,
  );
}

/** Plain sentences on what the record limits: noise, bursts merged, a storm cut by either end of the record. */
function limitNotes(
  t: Float64Array,
  q: Float64Array,
  s: Float64Array,
  peak: number,
  back: RiseWalk,
  on: FallWalk,
  sigma: number,
): string[] {
  const notes: string[] = [];
  const n = t.length;
  const rise = q[peak] - back.level_m3s;
  const tolerance = Math.max(RISE_START_SHARE * rise, RISE_START_SIGMAS * sigma);
  const noise = sigma > 0 ? `The record's noise is about ${sig(sigma)} m³/s` : 'The record shows no noise';
  notes.push(
    `${noise}; the rise start is the last reading before the peak within ${sig(tolerance)} m³/s of the ` +
      `pre-event level (${sig(back.level_m3s)} m³/s).`,
  );
  const bursts = 1 + back.burstsBefore + on.burstsAfter;
  if (bursts > 1) {
    notes.push(
      `The storm came in ${bursts} bursts: the flow between them stayed more than a quarter of the rise above the ` +
        `pre-event level, so they are taken as one event, from the first rise to the end of runoff after the last burst.`,
    );
  }
  if (on.lastPeak !== peak) {
    notes.push(`The end of runoff is counted from the last burst's peak, ${durationLabel(t[on.lastPeak] - t[peak])} after the highest reading.`);
  }
  if (back.riseStart === 0) {
    notes.push('The record starts on the rising limb: the rise start is the first reading, and the storm may have begun before it.');
  }
  const above = s[n - 1] - back.level_m3s;
  if (!on.nextStorm && above > BURST_DIP_SHARE * rise) {
    notes.push(
      `The record ends before the storm has receded: the last readings are still ${sig(above)} m³/s ` +
        `(${Math.round((100 * above) / rise)} % of the rise) above the pre-event level, so the end of runoff can be no later than the last reading.`,
    );
  }
  return notes;
}

/** A number to 3 significant figures for notes. */
function sig(x: number): string {
  return String(Number(x.toPrecision(3)));
}

function missingMask(gaps: readonly Gap[], n: number): Uint8Array | undefined {
  if (gaps.length === 0) return undefined;
  const mask = new Uint8Array(n);
  for (const g of gaps) mask.fill(1, g.first, g.last + 1);
  return mask;
}

/** Key points rounded to whole milliseconds (records store integer ms), in order and inside [t_first, t_last]. */
function wholeMs(p: EventPoints, first_ms: number, last_ms: number): EventPoints {
  const lo = Math.ceil(first_ms);
  const hi = Math.floor(last_ms);
  const whole = (x: number, from: number) => {
    const v = Math.max(from, Math.round(x));
    return lo <= hi ? Math.min(hi, Math.max(lo, v)) : v;
  };
  const rise = whole(p.riseStart_ms, -Infinity);
  const peak = whole(p.peak_ms, rise);
  const inflection = whole(p.inflection_ms, peak);
  return { riseStart_ms: rise, peak_ms: peak, inflection_ms: inflection, runoffEnd_ms: whole(p.runoffEnd_ms, inflection) };
}

// Key points of a storm event: rise start, peak, falling-limb inflection and end of direct runoff.
import { inflectionOnPrepared } from './inflection';
import { checkArea, MS_PER_DAY, prepareSeries, type EventPoints, type Series } from './series';
import { semiLogBreak } from './semi-log-break';

/** Days from the peak to the end of direct runoff, N = 0.827·A^0.2 with A in km² (Linsley, Kohler & Paulhus). */
export function runoffDuration_days(area_km2: number): number {
  return 0.827 * Math.pow(checkArea(area_km2, 'runoffDuration_days'), 0.2);
}

/** Options of findEventPoints: with a catchment area (km²) the end of runoff is the peak + N days. */
export interface EventPointOptions {
  area_km2?: number;
}

/** Key points with how each was found: plain sentences for the screen. */
export interface EventPointsDetailed {
  points: EventPoints;
  notes: string[];
}

/** Share of the event rise treated as noise when looking for the rise start and the next event. */
const RISE_TOLERANCE = 0.01;
/** Share of the event rise a later re-rise must exceed to count as the next event. */
const NEXT_EVENT_TOLERANCE = 0.05;

/**
 * Finds the key points (UTC ms): peak = the highest reading; rise start = the last reading before the flow
 * rises above its pre-event level; end of runoff = peak + N days with an area (clamped to the last reading),
 * else where the recession becomes straight on a semi-log plot; inflection = steepest fall between them.
 */
export function findEventPoints(series: Series, options?: EventPointOptions): EventPoints {
  return findEventPointsDetailed(series, options).points;
}

/** Like findEventPoints, with notes saying how the points were found (clamping, gaps); times in whole ms. */
export function findEventPointsDetailed(series: Series, options?: EventPointOptions): EventPointsDetailed {
  const fn = 'findEventPoints';
  const prepared = prepareSeries(series, fn);
  const { time_ms: t, discharge_m3s: q } = prepared;
  const notes = [...prepared.notes];
  const area = options?.area_km2 === undefined ? undefined : checkArea(options.area_km2, fn);
  const n = t.length;
  if (n < 4) throw new RangeError(`${fn} needs at least 4 readings; got ${n}`);
  let peak = 0;
  for (let i = 1; i < n; i++) if (q[i] > q[peak]) peak = i;
  if (peak === 0) throw new RangeError(`${fn} needs a rise before the peak; the highest reading is the first one`);
  if (peak === n - 1) throw new RangeError(`${fn} needs readings after the peak; the highest reading is the last one`);
  const rise = riseStartIndex(q, peak);
  const fallEnd = nextEventIndex(q, peak, q[peak] - q[rise]);
  if (fallEnd === peak) throw new RangeError(`${fn} needs a falling limb after the peak`);
  let end_ms: number;
  if (area !== undefined) {
    const days = runoffDuration_days(area);
    end_ms = Math.round(t[peak] + days * MS_PER_DAY);
    if (end_ms > t[n - 1]) {
      notes.push(
        `The end of runoff (peak + ${days.toPrecision(3)} days) is after the last reading; it was set to the last reading.`,
      );
      end_ms = t[n - 1];
    } else {
      notes.push(`The end of runoff is the peak + N = 0.827·A^0.2 = ${days.toPrecision(3)} days.`);
    }
    const searchEnd = Math.min(end_ms, t[fallEnd]);
    const inflection = inflectionOnPrepared(t, q, t[peak], searchEnd).inflection_ms;
    return { points: wholeMs({ riseStart_ms: t[rise], peak_ms: t[peak], inflection_ms: inflection, runoffEnd_ms: end_ms }, t[0], t[n - 1]), notes };
  }
  const inflection = inflectionOnPrepared(t, q, t[peak], t[fallEnd]).inflection_ms;
  end_ms = Math.round(semiLogBreak(t, q, inflection, fallEnd));
  notes.push('The end of runoff is where the recession becomes straight on a semi-log plot (two-line fit of ln Q).');
  return {
    points: wholeMs({ riseStart_ms: t[rise], peak_ms: t[peak], inflection_ms: Math.min(inflection, end_ms), runoffEnd_ms: end_ms }, t[0], t[n - 1]),
    notes,
  };
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

/** The last reading at the pre-event level before the peak (noise below 1 % of the rise ignored). */
function riseStartIndex(q: Float64Array, peak: number): number {
  let lowest = q[peak];
  for (let i = 0; i < peak; i++) if (q[i] < lowest) lowest = q[i];
  const tol = RISE_TOLERANCE * (q[peak] - lowest);
  let trough = peak;
  let level = q[peak];
  for (let i = peak; i > 0 && q[i - 1] <= level + tol; i--) {
    if (q[i - 1] < level) {
      level = q[i - 1];
      trough = i - 1;
    }
  }
  let rise = trough;
  while (rise + 1 < peak && q[rise + 1] <= level + tol) rise++;
  return rise;
}

/** The trough after the peak where the flow starts rising again by more than 5 % of the rise, or the last reading. */
function nextEventIndex(q: Float64Array, peak: number, eventRise: number): number {
  const tol = NEXT_EVENT_TOLERANCE * eventRise;
  let trough = peak;
  for (let i = peak + 1; i < q.length; i++) {
    if (q[i] <= q[trough]) trough = i;
    else if (q[i] > q[trough] + tol) return trough;
  }
  return q.length - 1;
}

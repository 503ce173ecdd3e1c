// Gaps a recursive filter meets: bridged up to the bridging limit (DOMAIN.md §4), a restart beyond it.
import { durationLabel, utcLabel, type PreparedSeries } from './series';

/** A run of grid indices (inclusive) a filter runs across without restarting. */
export interface Piece {
  first: number;
  last: number;
}

/** A gap longer than the bridging limit: the last time before it and the first after it (UTC ms). */
export interface FilterRestart {
  from_ms: number;
  to_ms: number;
}

/** Pieces of the grid to filter one by one, and the gaps the filter restarted after. */
export interface SplitRecord {
  pieces: Piece[];
  restarts: FilterRestart[];
}

interface Hole {
  from_ms: number;
  to_ms: number;
  /** Readings missing: a count for discharges marked missing, null for times with no reading at all. */
  missing: number | null;
}

/**
 * Interior holes of the record, in time order: runs of missing discharges (between the readings either
 * side) and intervals between readings longer than the limit or than 3 usual steps (times with no reading).
 */
function holesOf(prepared: PreparedSeries, limit_ms: number): Hole[] {
  const { time_ms: t, gaps, outages } = prepared;
  const holes: Hole[] = [];
  for (const g of gaps) {
    if (g.first > 0 && g.last < t.length - 1) holes.push({ from_ms: t[g.first - 1], to_ms: t[g.last + 1], missing: g.last - g.first + 1 });
  }
  const seen = new Set<number>();
  for (const o of outages) {
    seen.add(o.after);
    holes.push({ from_ms: t[o.after], to_ms: t[o.after + 1], missing: null });
  }
  if (!prepared.regular) {
    for (let i = 0; i + 1 < t.length; i++) {
      if (!seen.has(i) && t[i + 1] - t[i] > limit_ms) holes.push({ from_ms: t[i], to_ms: t[i + 1], missing: null });
    }
  }
  return holes.sort((a, b) => a.from_ms - b.from_ms);
}

function holeWords(h: Hole): string {
  const what = h.missing === null ? 'with no readings' : `(${h.missing} missing)`;
  return `A ${durationLabel(h.to_ms - h.from_ms)} gap ${what} from ${utcLabel(h.from_ms)} to ${utcLabel(h.to_ms)}`;
}

/**
 * Pieces of the grid between interior gaps longer than limit_ms (measured between the readings on either
 * side); shorter gaps stay bridged by the straight line in discharge and the filter runs across them.
 * Adds one note per gap saying where it is and which was done, and why for a restart.
 */
export function splitAtLongGaps(
  prepared: PreparedSeries,
  gridT: Float64Array,
  limit_ms: number,
  name: string,
  notes: string[],
): SplitRecord {
  const { time_ms: t, gaps } = prepared;
  for (const g of gaps) {
    if (g.first > 0 && g.last < t.length - 1) continue;
    const count = g.last - g.first + 1;
    notes.push(`${count} missing discharge${count === 1 ? '' : 's'} at the ${g.first === 0 ? 'start' : 'end'} were held level for ${name}.`);
  }
  const pieces: Piece[] = [];
  const restarts: FilterRestart[] = [];
  const limit = durationLabel(limit_ms);
  let first = 0;
  let k = 0;
  for (const h of holesOf(prepared, limit_ms)) {
    if (h.to_ms - h.from_ms <= limit_ms) {
      notes.push(`${holeWords(h)} was bridged by a straight line in discharge and ${name} ran across it (gaps up to ${limit} are bridged).`);
      continue;
    }
    while (k < gridT.length && gridT[k] <= h.from_ms) k++;
    const end = k - 1;
    while (k < gridT.length && gridT[k] < h.to_ms) k++;
    if (end >= first) pieces.push({ first, last: end });
    first = k;
    restarts.push({ from_ms: h.from_ms, to_ms: h.to_ms });
    notes.push(
      `${holeWords(h)} is longer than the ${limit} this record can be bridged over, so ${name} was restarted ` +
        `after it (the filter has no memory of the flow before); the baseflow across the gap is a straight line, ` +
        `and a volume after the restart is less certain.`,
    );
  }
  pieces.push({ first, last: gridT.length - 1 });
  return { pieces, restarts };
}

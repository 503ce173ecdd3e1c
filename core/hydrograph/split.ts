// Splitting a record at long gaps so that a recursive filter restarts after each one.
import type { PreparedSeries } from './series';

/** A run of grid indices (inclusive) a filter runs across without restarting. */
export interface Piece {
  first: number;
  last: number;
}

/**
 * Pieces of the grid between interior gaps longer than maxBridge_ms (measured between the readings on
 * either side); shorter gaps stay bridged. Adds one note per gap saying which was done.
 */
export function splitAtLongGaps(
  prepared: PreparedSeries,
  gridT: Float64Array,
  maxBridge_ms: number,
  name: string,
  notes: string[],
): Piece[] {
  const { time_ms: t, gaps } = prepared;
  const pieces: Piece[] = [];
  let first = 0;
  let k = 0;
  for (const g of gaps) {
    const interior = g.first > 0 && g.last < t.length - 1;
    const from = interior ? t[g.first - 1] : t[g.first];
    const to = interior ? t[g.last + 1] : t[g.last];
    const count = g.last - g.first + 1;
    const hours = ((to - from) / 3_600_000).toPrecision(3);
    if (!interior) {
      notes.push(`${count} missing discharge${count === 1 ? '' : 's'} at the ${g.first === 0 ? 'start' : 'end'} were held level for ${name}.`);
      continue;
    }
    if (to - from <= maxBridge_ms) {
      notes.push(`A ${hours} h gap (${count} missing) was bridged by a straight line and filtered across by ${name}.`);
      continue;
    }
    while (k < gridT.length && gridT[k] <= from) k++;
    const end = k - 1;
    while (k < gridT.length && gridT[k] < to) k++;
    if (end >= first) pieces.push({ first, last: end });
    first = k;
    notes.push(
      `A ${hours} h gap (${count} missing) is longer than ${(maxBridge_ms / 3_600_000).toPrecision(3)} h: ` +
        `${name} was restarted after it and the baseflow across it is a straight line.`,
    );
  }
  pieces.push({ first, last: gridT.length - 1 });
  return pieces;
}

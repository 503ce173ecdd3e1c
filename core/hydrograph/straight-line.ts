// Straight-line separation: baseflow a straight line from the rise start to the end of direct runoff.
import { fillEvent, flowAt, type EventInput } from './event-common';

/** The straight baseflow line (m³/s at a time in ms) from (rise start, Q) to (end of runoff, Q), before capping. */
export function straightLineLine(input: EventInput): (t_ms: number) => number {
  const { riseStart_ms: a, runoffEnd_ms: c } = input.points;
  const qa = flowAt(input, a);
  const qc = flowAt(input, c);
  return (t) => qa + ((qc - qa) * (t - a)) / (c - a);
}

/** Baseflow (m³/s) on the straight line from (rise start, Q) to (end of runoff, Q), capped at Q; Q outside. */
export function straightLine(input: EventInput): Float64Array {
  return fillEvent(input, straightLineLine(input));
}

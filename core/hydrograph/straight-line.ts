// Straight-line separation: baseflow a straight line from the rise start to the end of direct runoff.
import { fillEvent, flowAt, type EventInput } from './event-common';

/** Baseflow (m³/s) on the straight line from (rise start, Q) to (end of runoff, Q), capped at Q; Q outside. */
export function straightLine(input: EventInput): Float64Array {
  const { riseStart_ms: a, runoffEnd_ms: c } = input.points;
  const qa = flowAt(input, a);
  const qc = flowAt(input, c);
  return fillEvent(input, (t) => qa + ((qc - qa) * (t - a)) / (c - a));
}

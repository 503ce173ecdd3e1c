// Concave (fixed-base) separation: pre-event recession extended to under the peak, then straight to the end.
import { fillEvent, flowAt, type EventInput } from './event-common';
import { recessionLogSlope } from './recession-extension';

/** The concave baseflow line (m³/s at a time in ms) between the rise start and the end of runoff, before capping. */
export function concaveLine(input: EventInput): (t_ms: number) => number {
  const { riseStart_ms: a, peak_ms: p, runoffEnd_ms: c } = input.points;
  const qa = flowAt(input, a);
  const qc = flowAt(input, c);
  // The pre-event fit spans as long as the extension it serves: from the rise start to under the peak.
  const slope = recessionLogSlope(input.time_ms, input.discharge_m3s, a, 'before', p - a);
  const underPeak = qa * Math.exp(slope * (p - a));
  return (t) => (t <= p ? qa * Math.exp(slope * (t - a)) : c > p ? underPeak + ((qc - underPeak) * (t - p)) / (c - p) : qc);
}

/** Baseflow (m³/s): pre-event recession from the rise start to the peak time, then a line to the end of runoff. */
export function concave(input: EventInput): Float64Array {
  return fillEvent(input, concaveLine(input));
}

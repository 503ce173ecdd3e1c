// Concave (fixed-base) separation: pre-event recession extended to under the peak, then straight to the end.
import { fillEvent, flowAt, type EventInput } from './event-common';
import { recessionLogSlope } from './recession-extension';

/** Baseflow (m³/s): pre-event recession from the rise start to the peak time, then a line to the end of runoff. */
export function concave(input: EventInput): Float64Array {
  const { riseStart_ms: a, peak_ms: p, runoffEnd_ms: c } = input.points;
  const qa = flowAt(input, a);
  const qc = flowAt(input, c);
  const slope = recessionLogSlope(input.time_ms, input.discharge_m3s, a, 'before');
  const underPeak = qa * Math.exp(slope * (p - a));
  return fillEvent(input, (t) =>
    t <= p ? qa * Math.exp(slope * (t - a)) : underPeak + ((qc - underPeak) * (t - p)) / (c - p),
  );
}

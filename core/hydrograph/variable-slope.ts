// Variable-slope separation: pre-event recession to under the peak, post-event recession back to under
// the inflection point, joined by a straight line.
import { fillEvent, flowAt, type EventInput } from './event-common';
import { recessionLogSlope } from './recession-extension';

/** Baseflow (m³/s) by the variable-slope method (Linsley et al.; Chow, Maidment & Mays 1988), capped at Q. */
export function variableSlope(input: EventInput): Float64Array {
  const { riseStart_ms: a, peak_ms: p, inflection_ms: f, runoffEnd_ms: c } = input.points;
  const t = input.time_ms;
  const q = input.discharge_m3s;
  const qa = flowAt(input, a);
  const qc = flowAt(input, c);
  const before = recessionLogSlope(t, q, a, 'before');
  const after = recessionLogSlope(t, q, c, 'after');
  const underPeak = qa * Math.exp(before * (p - a));
  const underInflection = qc * Math.exp(after * (f - c));
  return fillEvent(input, (x) => {
    if (x <= p) return qa * Math.exp(before * (x - a));
    if (x >= f) return qc * Math.exp(after * (x - c));
    return underPeak + ((underInflection - underPeak) * (x - p)) / (f - p);
  });
}

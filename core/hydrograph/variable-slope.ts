// Variable-slope separation: pre-event recession to under the peak, post-event recession back to under
// the inflection point, joined by a straight line.
import { fillEvent, flowAt, type EventInput } from './event-common';
import { recessionLogSlope } from './recession-extension';

/** The variable-slope baseflow line (m³/s at a time in ms) between the rise start and the end of runoff, before capping. */
export function variableSlopeLine(input: EventInput): (t_ms: number) => number {
  const { riseStart_ms: a, peak_ms: p, inflection_ms: f, runoffEnd_ms: c } = input.points;
  const t = input.time_ms;
  const q = input.discharge_m3s;
  const qa = flowAt(input, a);
  const qc = flowAt(input, c);
  // Each fit spans as long as the extension it serves: rise start to peak, and end of runoff back to inflection.
  const before = recessionLogSlope(t, q, a, 'before', p - a);
  const after = recessionLogSlope(t, q, c, 'after', c - f);
  const underPeak = qa * Math.exp(before * (p - a));
  const underInflection = qc * Math.exp(after * (f - c));
  return (x) => {
    if (x <= p) return qa * Math.exp(before * (x - a));
    if (x >= f) return qc * Math.exp(after * (x - c));
    return underPeak + ((underInflection - underPeak) * (x - p)) / (f - p);
  };
}

/** Baseflow (m³/s) by the variable-slope method (Linsley et al.; Chow, Maidment & Mays 1988), capped at Q. */
export function variableSlope(input: EventInput): Float64Array {
  return fillEvent(input, variableSlopeLine(input));
}

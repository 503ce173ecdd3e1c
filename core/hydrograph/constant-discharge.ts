// Constant-discharge separation: baseflow held at the rise-start flow until the falling limb meets it.
import { flowAt, type EventInput } from './event-common';

/** Baseflow (m³/s) held at the flow of the rise start until the falling limb drops to that flow; Q elsewhere. */
export function constantDischarge(input: EventInput): Float64Array {
  const { time_ms: t, discharge_m3s: q, points } = input;
  const level = flowAt(input, points.riseStart_ms);
  const b = new Float64Array(t.length);
  let met = false;
  for (let i = 0; i < t.length; i++) {
    if (t[i] < points.riseStart_ms || met) {
      b[i] = q[i];
      continue;
    }
    b[i] = Math.min(level, q[i]);
    if (t[i] >= points.peak_ms && q[i] <= level) met = true;
  }
  return b;
}

// Shared steps of the event separation methods: flow at the key points and the final 0 ≤ b ≤ Q cap.
import { interpolateAt, type EventPoints } from './series';

/** Inputs every event method receives: checked times (UTC ms), bridged discharges (m³/s) and key points. */
export interface EventInput {
  time_ms: Float64Array;
  discharge_m3s: Float64Array;
  points: EventPoints;
}

/** Discharge (m³/s) at a time by linear interpolation between readings. */
export function flowAt(input: EventInput, at_ms: number): number {
  return interpolateAt(input.time_ms, input.discharge_m3s, at_ms);
}

/**
 * Baseflow array: Q outside [riseStart, runoffEnd]; inside, the method's line `inside(t)` capped to
 * 0 ≤ b ≤ Q at every reading.
 */
export function fillEvent(input: EventInput, inside: (t_ms: number) => number): Float64Array {
  const { time_ms: t, discharge_m3s: q, points } = input;
  const b = new Float64Array(t.length);
  for (let i = 0; i < t.length; i++) {
    const ti = t[i];
    if (ti < points.riseStart_ms || ti > points.runoffEnd_ms) {
      b[i] = q[i];
      continue;
    }
    const v = inside(ti);
    b[i] = v > q[i] ? q[i] : v > 0 ? v : 0;
  }
  return b;
}

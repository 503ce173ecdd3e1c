import type { Rating } from './types';
import { requireFinite, validateSegments } from './validate';

/**
 * Gauge height (m) at which the rating, with stage shift shift_m (m), first reaches discharge_m3s (m³/s):
 * the zero-flow stage for 0; the breakpoint itself when the discharge falls in an upward jump there.
 */
export function stageAt(rating: Rating, discharge_m3s: number, shift_m = 0): number {
  validateSegments('stageAt', rating);
  requireFinite('stageAt', 'discharge_m3s', discharge_m3s);
  requireFinite('stageAt', 'shift_m', shift_m);
  if (discharge_m3s < 0) {
    throw new RangeError(`stageAt needs a discharge ≥ 0 m³/s; got ${discharge_m3s}`);
  }
  const segments = rating.segments;
  if (discharge_m3s === 0) return segments[0].offset_m - shift_m;
  // Each segment is strictly increasing, so the target lies in the first one whose top value exceeds it;
  // the top segment is unbounded above.
  let i = 0;
  for (; i < segments.length - 1; i++) {
    const s = segments[i];
    const top = segments[i + 1].fromStage_m;
    const qTop = top > s.offset_m ? s.coefficient * Math.pow(top - s.offset_m, s.exponent) : 0;
    if (discharge_m3s < qTop) break;
  }
  const s = segments[i];
  const h = s.offset_m + Math.pow(discharge_m3s / s.coefficient, 1 / s.exponent);
  const bottom = i === 0 ? -Infinity : s.fromStage_m;
  return Math.max(h, bottom) - shift_m;
}

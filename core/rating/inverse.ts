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
  for (let i = 0; i < segments.length; i++) {
    const s = segments[i];
    const last = i === segments.length - 1;
    if (!last) {
      const top = segments[i + 1].fromStage_m;
      const qTop = top > s.offset_m ? s.coefficient * Math.pow(top - s.offset_m, s.exponent) : 0;
      // Each segment is strictly increasing, so the target lies in this one when it is below its top value.
      if (!(discharge_m3s < qTop)) continue;
    }
    const h = s.offset_m + Math.pow(discharge_m3s / s.coefficient, 1 / s.exponent);
    const bottom = i === 0 ? -Infinity : s.fromStage_m;
    return Math.max(h, bottom) - shift_m;
  }
  throw new RangeError('stageAt found no segment for the discharge; the rating must have at least one segment');
}

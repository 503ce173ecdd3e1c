import { stageAt } from './inverse';
import type { GaugingPoint, Rating } from './types';
import { requireFinite } from './validate';

/**
 * The stage shift (m) that passes the rating through one gauging: s = stageAt(Q_meas) − h, which for
 * one segment is e + (Q_meas/C)^(1/b) − h. Positive for scour, negative for fill or weed.
 */
export function shiftFor(rating: Rating, point: GaugingPoint): number {
  requireFinite('shiftFor', 'gauging stage_m', point?.stage_m);
  requireFinite('shiftFor', 'gauging discharge_m3s', point?.discharge_m3s);
  if (point.discharge_m3s < 0) {
    throw new RangeError(`shiftFor needs a gauged discharge ≥ 0 m³/s; got ${point.discharge_m3s}`);
  }
  return stageAt(rating, point.discharge_m3s) - point.stage_m;
}

import type { Rating } from './types';
import { validateSegments } from './validate';

/** Gauge height of zero flow (m) of a rating: the first segment's offset; Q = 0 at or below it. */
export function zeroFlowStage_m(rating: Rating): number {
  validateSegments('zeroFlowStage_m', rating);
  return rating.segments[0].offset_m;
}

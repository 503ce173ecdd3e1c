import type { Rating } from './types';
import { requireFinite, validateRating } from './validate';

/**
 * Whether a discharge at gauge height stage_m (m) is extrapolated: true below the lowest or above the
 * highest gauged stage; false inside it, and false when the rating carries no gauged range.
 */
export function isExtrapolated(rating: Rating, stage_m: number): boolean {
  validateRating('isExtrapolated', rating);
  requireFinite('isExtrapolated', 'stage_m', stage_m);
  const range = rating.gaugedRange_m;
  if (range === undefined) return false;
  return stage_m < range[0] || stage_m > range[1];
}

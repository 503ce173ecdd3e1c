import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  continuousCoefficient,
  dischargeAt,
  shiftFor,
  stageAt,
  type Rating,
  type RatingSegment,
} from '../../../core/rating/index';

// Random valid ratings: 1–4 segments; above the first, each segment's offset lies below its breakpoint
// and its coefficient meets the segment below (times a jump factor ≥ 1, so Q never falls).
function ratingArbitrary(jumps: readonly number[]): fc.Arbitrary<Rating> {
  return fc
  .record({
    offset: fc.double({ min: -2, max: 2, noNaN: true }),
    coefficient: fc.double({ min: 0.1, max: 100, noNaN: true }),
    exponent: fc.double({ min: 0.8, max: 3.5, noNaN: true }),
    upper: fc.array(
      fc.record({
        rise: fc.double({ min: 0.05, max: 2, noNaN: true }),
        drop: fc.double({ min: 0.01, max: 2, noNaN: true }),
        exponent: fc.double({ min: 0.8, max: 3.5, noNaN: true }),
        jump: fc.constantFrom(...jumps),
      }),
      { maxLength: 3 },
    ),
  })
  .map(({ offset, coefficient, exponent, upper }) => {
    const segments: RatingSegment[] = [{ fromStage_m: offset, coefficient, offset_m: offset, exponent }];
    let from = offset;
    for (const u of upper) {
      from += u.rise;
      const below = segments[segments.length - 1];
      const e = from - u.drop;
      const c = continuousCoefficient(below, e, u.exponent, from) * u.jump;
      segments.push({ fromStage_m: from, coefficient: c, offset_m: e, exponent: u.exponent });
    }
    return { segments };
  });
}
const ratingArb = ratingArbitrary([1, 1, 1.05]);
const continuousArb = ratingArbitrary([1]);

const stageArb = fc.double({ min: -3, max: 12, noNaN: true });

describe('rating properties (fast-check)', () => {
  // exact: stageAt inverts dischargeAt wherever Q > 0
  it('stageAt(dischargeAt(h)) ≈ h', () => {
    fc.assert(
      fc.property(ratingArb, stageArb, (rating, h) => {
        const q = dischargeAt(rating, h);
        if (q > 0) {
          expect(Math.abs(stageAt(rating, q) - h)).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(h)));
        } else {
          // Q is 0 at or below the offset, or where C·(h − e)^b underflows (below 1e-300) just above it
          const first = rating.segments[0];
          const underflows = h > first.offset_m && first.coefficient * (h - first.offset_m) ** first.exponent < 1e-300;
          expect(h <= first.offset_m || underflows).toBe(true);
          expect(stageAt(rating, q)).toBe(rating.segments[0].offset_m);
        }
      }),
      { numRuns: 500 },
    );
  });
  // exact: a rating without downward jumps gives Q non-decreasing in stage
  it('Q is non-decreasing in stage', () => {
    fc.assert(
      fc.property(ratingArb, stageArb, stageArb, (rating, a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        expect(dischargeAt(rating, hi)).toBeGreaterThanOrEqual(dischargeAt(rating, lo) * (1 - 1e-12));
      }),
      { numRuns: 500 },
    );
  });
  // exact: a shift s is evaluation at h + s (DOMAIN.md §2)
  it('shifting by s equals evaluating at h + s', () => {
    fc.assert(
      fc.property(ratingArb, stageArb, fc.double({ min: -1, max: 1, noNaN: true }), (rating, h, s) => {
        expect(dischargeAt(rating, h, s)).toBe(dischargeAt(rating, h + s));
        expect(Math.abs(stageAt(rating, dischargeAt(rating, h, s) || 0, s) - h)).toBeLessThanOrEqual(
          dischargeAt(rating, h, s) > 0 ? 1e-9 * (1 + Math.abs(h) + Math.abs(s)) : Infinity,
        );
      }),
      { numRuns: 300 },
    );
  });
  // exact: on a continuous rating the single-gauging shift reproduces the gauged discharge
  it('shiftFor passes the rating through the gauging', () => {
    fc.assert(
      fc.property(continuousArb, stageArb, fc.double({ min: 1e-3, max: 1e3, noNaN: true }), (rating, h, q) => {
        const s = shiftFor(rating, { stage_m: h, discharge_m3s: q });
        expect(Math.abs(dischargeAt(rating, h, s) - q)).toBeLessThanOrEqual(1e-8 * q);
      }),
      { numRuns: 300 },
    );
  });
});

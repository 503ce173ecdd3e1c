import { describe, expect, it } from 'vitest';
import {
  dischargeAt,
  isExtrapolated,
  ratingContinuity,
  ratingTable,
  stageAt,
  validateRating,
  zeroFlowStage_m,
  type Rating,
} from '../../../core/rating/index';

const seg = (fromStage_m: number, coefficient: number, offset_m: number, exponent: number) => ({ fromStage_m, coefficient, offset_m, exponent });
const good: Rating = { segments: [seg(0.2, 8, 0.2, 1.5), seg(1, 10, 0.4, 2)], gaugedRange_m: [0.3, 2] };

// Issue 3: each bad rating throws a RangeError whose message names the problem and what is needed.
const badRatings: [string, Rating, RegExp][] = [
  ['no segments', { segments: [] }, /at least one segment; got an empty list/],
  ['segments missing', {} as Rating, /at least one segment; got none/],
  ['zero coefficient', { segments: [seg(0, 0, 0, 2)] }, /coefficient > 0 in segment 0; got 0/],
  ['negative coefficient', { segments: [seg(0.2, 8, 0.2, 1.5), seg(1, -3, 0.4, 2)] }, /coefficient > 0 in segment 1; got -3/],
  ['zero exponent', { segments: [seg(0, 5, 0, 0)] }, /exponent > 0 in segment 0; got 0/],
  ['negative exponent', { segments: [seg(0, 5, 0, -1.5)] }, /exponent > 0 in segment 0; got -1.5/],
  ['NaN coefficient', { segments: [seg(0, Number.NaN, 0, 2)] }, /finite coefficient in segment 0; got NaN/],
  ['infinite exponent', { segments: [seg(0, 5, 0, Infinity)] }, /finite exponent in segment 0; got Infinity/],
  ['NaN offset', { segments: [seg(0, 5, Number.NaN, 2)] }, /finite offset_m in segment 0; got NaN/],
  ['NaN breakpoint', { segments: [seg(Number.NaN, 5, 0, 2)] }, /finite fromStage_m in segment 0; got NaN/],
  ['unsorted segments', { segments: [seg(1, 10, 0.4, 2), seg(0.2, 8, 0.2, 1.5)] }, /sorted by fromStage_m, strictly ascending; segment 1 starts at 0.2 m/],
  ['repeated breakpoint', { segments: [seg(0.2, 8, 0.2, 1.5), seg(0.2, 10, 0.1, 2)] }, /strictly ascending; segment 1 starts at 0.2 m, not above segment 0 at 0.2 m/],
  ['offset at its breakpoint', { segments: [seg(0.2, 8, 0.2, 1.5), seg(1, 10, 1, 2)] }, /offset below its breakpoint; segment 1 has offset_m 1 m at or above fromStage_m 1 m/],
];
const badRanges: [string, Rating, RegExp][] = [
  ['gauged range reversed', { ...good, gaugedRange_m: [2, 0.3] }, /lowest ≤ highest; got \[2, 0.3\]/],
  ['gauged range NaN', { ...good, gaugedRange_m: [Number.NaN, 2] }, /finite lowest gauged stage .*; got NaN/],
  ['gauged range wrong shape', { ...good, gaugedRange_m: [1] as unknown as [number, number] }, /gaugedRange_m as \[lowest, highest\]/],
];

describe('bad ratings', () => {
  it.each(badRatings)('%s', (_name, rating, message) => {
    for (const call of [
      () => dischargeAt(rating, 1),
      () => stageAt(rating, 1),
      () => zeroFlowStage_m(rating),
      () => ratingTable(rating, 0, 1, 0.5),
      () => ratingContinuity(rating),
      () => isExtrapolated(rating, 1),
    ]) {
      expect(call).toThrow(RangeError);
      expect(call).toThrow(message);
    }
  });
  it('one-segment fast path names the same problems', () => {
    expect(() => dischargeAt({ segments: [seg(0, -1, 0, 2)] }, 1)).toThrow(/dischargeAt needs a coefficient > 0 in segment 0; got -1/);
  });
  it.each(badRanges)('%s', (_name, rating, message) => {
    for (const call of [() => validateRating('check', rating), () => ratingTable(rating, 0, 1, 0.5), () => isExtrapolated(rating, 1)]) {
      expect(call).toThrow(RangeError);
      expect(call).toThrow(message);
    }
  });
});

describe('bad stages, shifts and discharges', () => {
  const one: Rating = { segments: [seg(0, 5, 0, 2)] };
  it.each([one, good])('dischargeAt names a non-finite stage or shift', (rating) => {
    expect(() => dischargeAt(rating, Number.NaN)).toThrow(RangeError);
    expect(() => dischargeAt(rating, Number.NaN)).toThrow(/dischargeAt needs a finite stage_m; got NaN/);
    expect(() => dischargeAt(rating, Infinity)).toThrow(/finite stage_m; got Infinity/);
    expect(() => dischargeAt(rating, 1, Number.NaN)).toThrow(/finite shift_m; got NaN/);
    expect(() => dischargeAt(rating, 1e308, 1e308)).toThrow(/finite stage_m \+ shift_m; got 1e\+308 \+ 1e\+308/);
  });
  it('stageAt refuses negative or non-finite discharge', () => {
    expect(() => stageAt(good, -0.5)).toThrow(RangeError);
    expect(() => stageAt(good, -0.5)).toThrow(/stageAt needs a discharge ≥ 0 m³\/s; got -0.5/);
    expect(() => stageAt(good, Number.NaN)).toThrow(/finite discharge_m3s; got NaN/);
    expect(() => stageAt(good, Infinity)).toThrow(/finite discharge_m3s; got Infinity/);
    expect(() => stageAt(good, 1, Number.NaN)).toThrow(/finite shift_m; got NaN/);
  });
  it('isExtrapolated refuses a non-finite stage', () => {
    expect(() => isExtrapolated(good, Number.NaN)).toThrow(/finite stage_m; got NaN/);
  });
});

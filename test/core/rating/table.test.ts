import { describe, expect, it } from 'vitest';
import { RATING_TABLE_MAX_ROWS, ratingTable, type Rating } from '../../../core/rating/index';

const rating: Rating = {
  segments: [{ fromStage_m: 0, coefficient: 10, offset_m: 0.5, exponent: 2 }],
  gaugedRange_m: [0.6, 0.8],
};

describe('ratingTable', () => {
  // exact: 0.3 to 0.9 every 0.1 is 7 rows although (0.9 − 0.3)/0.1 = 5.999… in binary
  it('keeps both ends despite float drift', () => {
    const t = ratingTable(rating, 0.3, 0.9, 0.1);
    expect(t).toHaveLength(7);
    expect(t[0].stage_m).toBe(0.3);
    expect(t[6].stage_m).toBe(0.9);
    expect(t[3].stage_m).toBeCloseTo(0.6, 15);
  });
  // exact: Q = 10·(h − 0.5)² in each row, 0 at and below the offset
  it('gives the rating discharge in each row', () => {
    const t = ratingTable(rating, 0.5, 1.5, 0.25);
    expect(t.map((r) => r.discharge_m3s)).toEqual([0, 0.625, 2.5, 5.625, 10]);
  });
  // DOMAIN.md §2: every row outside the gauged range [0.6, 0.8] is marked extrapolated
  it('marks rows outside the gauged range', () => {
    const t = ratingTable(rating, 0.5, 0.9, 0.1);
    // exact: the row at the offset 0.5 m has Q = 0 by the power law itself, so it is not extrapolated (issue 20)
    expect(t.map((r) => r.extrapolated)).toEqual([false, false, false, false, true]);
    // a flowing row below the gauged range still is
    expect(ratingTable(rating, 0.55, 0.55, 0.1)[0].extrapolated).toBe(true);
  });
  // exact: a range that is not a whole number of steps still ends at to_m
  it('appends the end stage when the range is not a whole number of steps', () => {
    const t = ratingTable(rating, 1, 2, 0.3);
    const expected = [1, 1.3, 1.6, 1.9, 2];
    expect(t).toHaveLength(expected.length);
    t.forEach((row, k) => expect(row.stage_m).toBeCloseTo(expected[k], 14));
    expect(t[4].stage_m).toBe(2);
  });
  // exact: from = to gives one row; a constant shift evaluates at h + s
  it('one row and a shift', () => {
    expect(ratingTable(rating, 1, 1, 0.1)).toEqual([{ stage_m: 1, discharge_m3s: 2.5, extrapolated: true }]);
    expect(ratingTable(rating, 1, 1, 0.1, 0.5)[0].discharge_m3s).toBe(10);
  });
  it('refuses bad ranges', () => {
    expect(() => ratingTable(rating, 1, 0.5, 0.1)).toThrow(RangeError);
    expect(() => ratingTable(rating, 1, 0.5, 0.1)).toThrow(/to_m ≥ from_m.*from 1 m to 0.5 m/);
    expect(() => ratingTable(rating, 0, 1, 0)).toThrow(/step_m > 0; got 0/);
    expect(() => ratingTable(rating, 0, 1, -0.1)).toThrow(/step_m > 0; got -0.1/);
    expect(() => ratingTable(rating, Number.NaN, 1, 0.1)).toThrow(/finite from_m; got NaN/);
    expect(() => ratingTable(rating, 0, Infinity, 0.1)).toThrow(/finite to_m; got Infinity/);
    expect(() => ratingTable(rating, 0, 1000, 0.001)).toThrow(new RegExp(`at most ${RATING_TABLE_MAX_ROWS}.*larger step_m`));
  });
});

describe('ratingTable rows on the edge of the gauged range', () => {
  // exact: 0.1 + 2·0.1 in binary is 0.30000000000000004; the row must still be the gauged stage 0.3 and not extrapolated
  it('does not mark a row at the top of the gauged range as extrapolated through rounding', () => {
    const rows = ratingTable({ segments: [{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }], gaugedRange_m: [0.2, 0.3] }, 0.1, 0.4, 0.1);
    expect(rows.map((r) => r.stage_m)).toEqual([0.1, 0.2, 0.3, 0.4]);
    expect(rows.map((r) => r.extrapolated)).toEqual([false, false, false, true]); // 0.1 m is the zero-flow row
  });
});

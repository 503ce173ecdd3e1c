import { describe, expect, it } from 'vitest';
import { dischargeAt, isExtrapolated, ratingFromTable, ratingContinuity, validateRating } from '../../../core/rating/index';

// Invented table: a weir-like control Q = 4.2·(h − 0.18)^2.3 tabulated every 0.1 m.
const C = 4.2;
const E = 0.18;
const B = 2.3;
const power = (h: number) => C * (h - E) ** B;
const rows = [0.18, 0.3, 0.4, 0.5, 0.7, 1.0, 1.4].map((h) => ({ stage_m: h, discharge_m3s: h === E ? 0 : power(h) }));

describe('ratingFromTable (log–log interpolation between rows)', () => {
  // exact: ln Q is linear in ln(h − e) for a power law, so log–log interpolation of its table gives it back everywhere
  it('reproduces a power law between and beyond its rows', () => {
    const rating = ratingFromTable(rows);
    validateRating('test', rating);
    for (const h of [0.2, 0.25, 0.33, 0.45, 0.61, 0.95, 1.2, 1.4, 2.0]) {
      expect(dischargeAt(rating, h) / power(h) - 1).toBeCloseTo(0, 12);
    }
    expect(dischargeAt(rating, 0.18)).toBe(0);
    expect(dischargeAt(rating, 0.1)).toBe(0);
  });
  // exact: each row is a segment's start, so the rating passes through every row and is continuous at each
  it('passes through every row of a table that is not a power law, continuously', () => {
    const bumpy = [
      { stage_m: 0.2, discharge_m3s: 0 },
      { stage_m: 0.3, discharge_m3s: 0.11 },
      { stage_m: 0.5, discharge_m3s: 0.9 },
      { stage_m: 0.8, discharge_m3s: 2.1 },
      { stage_m: 1.2, discharge_m3s: 6.5 },
    ];
    const rating = ratingFromTable(bumpy);
    for (const r of bumpy.slice(1)) expect(dischargeAt(rating, r.stage_m) / r.discharge_m3s - 1).toBeCloseTo(0, 12);
    expect(ratingContinuity(rating).warnings).toEqual([]);
    // exact: halfway in ln(h − e) between two rows, log–log interpolation gives the geometric mean of their discharges
    const h = 0.2 + Math.sqrt((0.5 - 0.2) * (0.8 - 0.2));
    expect(dischargeAt(rating, h)).toBeCloseTo(Math.sqrt(0.9 * 2.1), 12);
  });
  it('takes an offset given by the user when the table has no dry row', () => {
    const wet = rows.slice(1);
    expect(() => ratingFromTable(wet)).toThrow(/stage of zero flow/);
    const rating = ratingFromTable(wet, E);
    expect(dischargeAt(rating, 0.6) / power(0.6) - 1).toBeCloseTo(0, 12);
    expect(() => ratingFromTable(wet, 0.3)).toThrow(/offset below the lowest row with flow \(0\.3 m\)/);
    // a table carries no gauged range of its own: nothing is extrapolated until one is set
    expect(isExtrapolated(rating, 5)).toBe(false);
  });
  // Issue 20: a dry row above a typed offset came back as 5.8e-6 m³/s; every row must be reproduced, so such a
  // table is refused with the row and what to change (exact: Q > 0 everywhere above the offset of a power law).
  it('refuses a zero-flow row above a typed offset rather than give it a flow', () => {
    const table = [{ stage_m: 0.15, discharge_m3s: 0 }, { stage_m: 0.2, discharge_m3s: 0.05 }, { stage_m: 0.4, discharge_m3s: 0.9 }, { stage_m: 0.6, discharge_m3s: 2.4 }];
    expect(() => ratingFromTable(table, 0.1)).toThrow(/cannot reproduce row 1: it gives no flow at 0\.15 m, above the stage of zero flow 0\.1 m; give the stage of zero flow at or above 0\.15 m, or remove that row/);
    const kept = ratingFromTable(table, 0.15);
    expect(dischargeAt(kept, 0.15)).toBe(0);
    expect(dischargeAt(kept, 0.4)).toBeCloseTo(0.9, 12);
  });
  it('refuses rows out of order, falling discharge and too few rows, naming the row (1-based)', () => {
    expect(() => ratingFromTable([rows[0], rows[2], rows[1]])).toThrow(/row 3 at 0\.3 m is not above row 2/);
    expect(() => ratingFromTable([{ stage_m: 0.1, discharge_m3s: 0 }, { stage_m: 0.2, discharge_m3s: 2 }, { stage_m: 0.3, discharge_m3s: 1 }])).toThrow(/row 3 has 1 m³\/s, not above row 2/);
    expect(() => ratingFromTable([{ stage_m: 0.1, discharge_m3s: 0 }, { stage_m: 0.2, discharge_m3s: 2 }])).toThrow(/at least 2 rows with discharge above 0; got 1/);
    expect(() => ratingFromTable([{ stage_m: Number.NaN, discharge_m3s: 1 }])).toThrow(/stage_m in row 1/);
    expect(() => ratingFromTable([{ stage_m: 0.1, discharge_m3s: -1 }])).toThrow(/row 1 has -1/);
  });
});

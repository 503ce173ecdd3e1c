// Drift correction of a logger record from check readings, against a worked example done by hand.
// Method (common practice; the USGS "gage-height corrections" between inspections, and DOMAIN.md §1):
// correction = staff − logger at each check, prorated linearly in time between checks, held before the
// first and after the last.
import { describe, expect, it } from 'vitest';
import { driftCorrections, driftTable, loggerValueAt } from '../../core';

const H = 3_600_000;
const D = 24 * H;
const T1 = Date.UTC(2026, 2, 2, 9); // first check, 2 March 2026 09:00 UTC (invented)
const T2 = T1 + 10 * D; // second check ten days later
const T3 = T2 + 4 * D; // third check four days after that

// Worked by hand:
//   check 1: staff 0.742, logger 0.730  →  c1 = 0.742 − 0.730 = +0.012 m
//   check 2: staff 0.615, logger 0.640  →  c2 = 0.615 − 0.640 = −0.025 m
//   check 3: staff 0.600, logger 0.600  →  c3 = 0
//   t = T1 + 2.5 d (a quarter of the way to check 2): c = 0.012 + 0.25 × (−0.025 − 0.012) = 0.012 − 0.00925 = +0.00275 m
//   t = T1 + 5 d (half way):                         c = 0.012 + 0.5 × (−0.037) = −0.0065 m; raw 0.700 → corrected 0.6935 m
//   t = T2 + 1 d (a quarter of the way to check 3):  c = −0.025 + 0.25 × (0 − (−0.025)) = −0.01875 m
//   before T1: held at +0.012; after T3: held at 0
const checks = [
  { time_ms: T2, staff_m: 0.615, logger_m: 0.64 },
  { time_ms: T1, staff_m: 0.742, logger_m: 0.73 },
  { time_ms: T3, staff_m: 0.6, logger_m: 0.6 },
];

describe('drift correction (worked example by hand, above)', () => {
  it('tabulates staff − logger at each check, oldest first', () => {
    const table = driftTable(checks);
    expect(table.map((r) => r.time_ms)).toEqual([T1, T2, T3]);
    expect(table[0].correction_m).toBeCloseTo(0.012, 12);
    expect(table[1].correction_m).toBeCloseTo(-0.025, 12);
    expect(table[2].correction_m).toBeCloseTo(0, 12);
  });

  it('prorates linearly between checks and holds outside them', () => {
    const times = [T1 - 3 * D, T1, T1 + 2.5 * D, T1 + 5 * D, T2, T2 + D, T3, T3 + 7 * D];
    const c = driftCorrections(checks, times);
    const expected = [0.012, 0.012, 0.00275, -0.0065, -0.025, -0.01875, 0, 0];
    expected.forEach((v, i) => expect(c[i]).toBeCloseTo(v, 12));
    const raw = 0.7;
    expect(raw + c[3]).toBeCloseTo(0.6935, 12);
  });

  it('gives the same corrections for times in any order', () => {
    const times = [T3 + D, T1 + 5 * D, T1 - D, T2 + D, T1 + 2.5 * D];
    const c = driftCorrections(checks, times);
    expect(Array.from(c).map((x) => Math.round(x * 1e6) / 1e6)).toEqual([0, -0.0065, 0.012, -0.01875, 0.00275]);
  });

  it('is zero without checks and constant with one', () => {
    expect(Array.from(driftCorrections([], [T1, T2]))).toEqual([0, 0]);
    const one = driftCorrections([{ time_ms: T2, staff_m: 1.01, logger_m: 1.0 }], [T1, T2, T3]);
    Array.from(one).forEach((v) => expect(v).toBeCloseTo(0.01, 12));
  });

  it('refuses two checks at the same time and non-finite values', () => {
    expect(() => driftTable([{ time_ms: T1, staff_m: 1, logger_m: 1 }, { time_ms: T1, staff_m: 1.1, logger_m: 1 }])).toThrow(/same time/);
    expect(() => driftTable([{ time_ms: T1, staff_m: Number.NaN, logger_m: 1 }])).toThrow(/staff_m/);
  });
});

describe('the logger value at a check time', () => {
  const t = [0, 15 * 60_000, 30 * 60_000];
  const v = [0.5, 0.6, 0.9];
  it('interpolates linearly between neighbours within the allowed gap', () => {
    // 5 min after 0.5 toward 0.6 over 15 min: 0.5 + (5/15)(0.1) = 0.53333…
    expect(loggerValueAt(t, v, 5 * 60_000, H)).toBeCloseTo(0.5 + 0.1 / 3, 12);
    expect(loggerValueAt(t, v, 15 * 60_000, H)).toBe(0.6);
  });
  it('gives nothing outside the record or across a gap', () => {
    expect(loggerValueAt(t, v, -1, H)).toBeUndefined();
    expect(loggerValueAt(t, v, 31 * 60_000, H)).toBeUndefined();
    expect(loggerValueAt(t, v, 20 * 60_000, 4 * 60_000)).toBeUndefined(); // 5 min to the one before: too far
  });
});

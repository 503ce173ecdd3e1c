// Plausibility checks on a typed reading (DOMAIN.md §1, trade practice) and its discharge, which must
// equal the power law evaluated by hand: Q = C·(h + s − e)^b.
import { describe, expect, it } from 'vitest';
import { checkReading, type DatedShift, type Rating } from '../../core';

const rating: Rating = { segments: [{ fromStage_m: 0.2, coefficient: 5, offset_m: 0.2, exponent: 2 }], gaugedRange_m: [0.3, 1.2] };
const NOW = Date.UTC(2026, 5, 1, 12);
const base = { time_ms: NOW - 60_000, now_ms: NOW, jumpLimit_m: 0.3, units: 'metric' as const, ratings: [] };
/** The rating in force from a year before NOW, with these dated shifts. */
const inForce = (shifts: DatedShift[] = []) => [{ ...rating, id: 'r1', validFrom_ms: NOW - 365 * 86_400_000, shifts }];

describe('checkReading', () => {
  it('gives the discharge of the power law inside the gauged range with no warning', () => {
    const r = checkReading({ ...base, stage_m: 0.7, ratings: inForce() });
    expect(r.discharge_m3s).toBeCloseTo(5 * 0.5 ** 2, 12); // exact: 1.25 m³/s
    expect(r.warnings).toEqual([]);
    expect(r.extrapolated).toBe(false);
  });

  it('applies the shift in force at that time', () => {
    const shifts: DatedShift[] = [{ time_ms: NOW - 86_400_000, curve: { points: [{ stage_m: 0, shift_m: -0.1 }] }, toNext: 'hold' }];
    const r = checkReading({ ...base, stage_m: 0.7, ratings: inForce(shifts) });
    expect(r.shift_m).toBeCloseTo(-0.1, 12);
    expect(r.discharge_m3s).toBeCloseTo(5 * 0.4 ** 2, 12); // exact: 0.8 m³/s
  });

  it('warns once for each case, in words', () => {
    const codes = (input: Parameters<typeof checkReading>[0]) => checkReading(input).warnings.map((w) => w.code);
    expect(codes({ ...base, stage_m: 0.5 })).toEqual(['no-rating']);
    expect(codes({ ...base, stage_m: 0.15, ratings: inForce() })).toEqual(['below-zero-flow']);
    expect(codes({ ...base, stage_m: 1.5, ratings: inForce() })).toEqual(['extrapolated']);
    expect(codes({ ...base, stage_m: 0.25, ratings: inForce() })).toEqual(['extrapolated']);
    expect(codes({ ...base, stage_m: 1.0, previous: { stage_m: 0.6, time_ms: base.time_ms - 3_600_000 }, ratings: inForce() })).toEqual(['jump']);
    expect(codes({ ...base, stage_m: 0.8, previous: { stage_m: 0.6, time_ms: base.time_ms - 3_600_000 }, ratings: inForce() })).toEqual([]);
    expect(codes({ ...base, time_ms: NOW + 3_600_000, stage_m: 0.8, ratings: inForce() })).toEqual(['future']);
    const jump = checkReading({ ...base, stage_m: 1.0, previous: { stage_m: 0.4, time_ms: base.time_ms - 3_600_000 }, ratings: inForce() }).warnings[0].text;
    expect(jump).toMatch(/rose 0\.600 m since the previous reading 60 min earlier/);
    // Two readings in the same minute: "just before", never "0 min earlier" (issue 10 item 11).
    const same = checkReading({ ...base, stage_m: 1.0, previous: { stage_m: 0.4, time_ms: base.time_ms - 20_000 }, ratings: inForce() }).warnings[0].text;
    expect(same).toMatch(/rose 0\.600 m since the previous reading just before, more than/);
    expect(same).not.toMatch(/0 min/);
    const us = checkReading({ ...base, units: 'us', stage_m: 1.5, ratings: inForce() }).warnings[0].text;
    expect(us).toMatch(/0\.98 ft to 3\.94 ft/); // 0.3 m and 1.2 m in international feet (NIST SP 811)
  });

  it('refuses a stage that is not a number', () => {
    expect(() => checkReading({ ...base, stage_m: Number.NaN })).toThrow(/finite stage/);
    expect(() => checkReading({ ...base, stage_m: 1, jumpLimit_m: 0 })).toThrow(/jump limit/);
  });
});

describe('a stage far outside what the site has seen (DOMAIN.md §1: ask before saving)', () => {
  const gaugedTo14: Rating = { segments: [{ fromStage_m: 0.1, coefficient: 4, offset_m: 0.1, exponent: 1.8 }], gaugedRange_m: [0.2, 1.4] };
  const ratings = [{ ...gaugedTo14, id: 'r2', validFrom_ms: NOW - 365 * 86_400_000, shifts: [] }];
  // Issue 20's slip: 45 m at a site gauged to 1.4 m; the rule's line is twice the highest gauged stage (2.8 m).
  it('asks about 45 m at a site gauged to 1.4 m', () => {
    const r = checkReading({ ...base, stage_m: 45, ratings });
    expect(r.slip).toBe('A stage of 45.000 m is more than 2 times the highest gauged stage (1.400 m). Is it a typing slip? Check the number before saving.');
  });
  it('does not ask inside twice the gauged range, nor without a rating', () => {
    expect(checkReading({ ...base, stage_m: 2.8, ratings }).slip).toBeUndefined();
    expect(checkReading({ ...base, stage_m: 2.81, ratings }).slip).toBeDefined();
    expect(checkReading({ ...base, stage_m: 45, ratings: [] }).slip).toBeUndefined();
  });
});

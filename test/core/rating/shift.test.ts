import { describe, expect, it } from 'vitest';
import {
  constantShift,
  dischargeAt,
  shiftAt,
  shiftFor,
  shiftFromCurve,
  type DatedShift,
  type Rating,
  type ShiftCurve,
} from '../../../core/rating/index';

const rating: Rating = { segments: [{ fromStage_m: 0.5, coefficient: 10, offset_m: 0.5, exponent: 2 }] };
const DAY_MS = 86_400_000;
const T0 = Date.UTC(2025, 2, 1);

describe('shiftFor', () => {
  // exact: s = e + (Q/C)^(1/b) − h = 0.5 + (40/10)^(1/2) − 2.3 = 0.2 (DOMAIN.md §2)
  it('passes the rating through one gauging', () => {
    const s = shiftFor(rating, { stage_m: 2.3, discharge_m3s: 40 });
    expect(s).toBeCloseTo(0.2, 14);
    expect(dischargeAt(rating, 2.3, s)).toBeCloseTo(40, 12);
    // fill or weed: less flow than rated, so the shift is negative
    expect(shiftFor(rating, { stage_m: 1.7, discharge_m3s: 10 })).toBeCloseTo(-0.2, 14);
  });
  // exact: zero flow at 0.8 m moves the zero-flow stage there, s = 0.5 − 0.8
  it('a gauging of no flow', () => {
    expect(shiftFor(rating, { stage_m: 0.8, discharge_m3s: 0 })).toBeCloseTo(-0.3, 14);
  });
  it('refuses bad gaugings', () => {
    expect(() => shiftFor(rating, { stage_m: 1, discharge_m3s: -1 })).toThrow(RangeError);
    expect(() => shiftFor(rating, { stage_m: 1, discharge_m3s: -1 })).toThrow(/gauged discharge ≥ 0 m³\/s; got -1/);
    expect(() => shiftFor(rating, { stage_m: Number.NaN, discharge_m3s: 1 })).toThrow(/finite gauging stage_m; got NaN/);
  });
});

describe('stage-variable shift', () => {
  const curve: ShiftCurve = { points: [{ stage_m: 0.5, shift_m: 0.1 }, { stage_m: 1.5, shift_m: 0.0 }, { stage_m: 2.5, shift_m: -0.04 }] };
  // exact: linear between points, constant beyond the ends
  it('interpolates linearly between points', () => {
    expect(shiftFromCurve(curve, 1.0)).toBeCloseTo(0.05, 15);
    expect(shiftFromCurve(curve, 2.0)).toBeCloseTo(-0.02, 15);
    expect(shiftFromCurve(curve, 1.5)).toBe(0);
    expect(shiftFromCurve(curve, 0.1)).toBe(0.1);
    expect(shiftFromCurve(curve, 9)).toBe(-0.04);
    expect(shiftFromCurve(constantShift(0.07), 3)).toBe(0.07);
  });
  it('refuses bad curves', () => {
    expect(() => shiftFromCurve({ points: [] }, 1)).toThrow(/at least one \(stage, shift\) point/);
    const unsorted = { points: [{ stage_m: 1, shift_m: 0 }, { stage_m: 1, shift_m: 0.1 }] };
    expect(() => shiftFromCurve(unsorted, 1)).toThrow(RangeError);
    expect(() => shiftFromCurve(unsorted, 1)).toThrow(/strictly ascending; point 1 at 1 m is not above point 0 at 1 m/);
    expect(() => shiftFromCurve({ points: [{ stage_m: 1, shift_m: Number.NaN }] }, 1)).toThrow(/finite shift_m of shift point 0; got NaN/);
    expect(() => constantShift(Infinity)).toThrow(/finite shift_m; got Infinity/);
  });
});

describe('shiftAt', () => {
  const shifts: DatedShift[] = [
    { time_ms: T0, curve: constantShift(0.1), toNext: 'prorate' },
    { time_ms: T0 + 10 * DAY_MS, curve: { points: [{ stage_m: 0, shift_m: 0.3 }, { stage_m: 2, shift_m: -0.1 }] }, toNext: 'hold' },
    { time_ms: T0 + 20 * DAY_MS, curve: constantShift(-0.05), toNext: 'prorate' },
  ];
  // exact: linear proration in time between two dated shifts (DOMAIN.md §2)
  it('prorates linearly in time and follows the stage', () => {
    // a quarter of the way from 0.1 to the second curve's 0.2 at 0.5 m
    expect(shiftAt(shifts, T0 + 2.5 * DAY_MS, 0.5)).toBeCloseTo(0.125, 15);
    expect(shiftAt(shifts, T0 + 5 * DAY_MS, 0)).toBeCloseTo(0.2, 15);
    expect(shiftAt(shifts, T0 + 5 * DAY_MS, 2)).toBeCloseTo(0, 15);
    expect(shiftAt(shifts, T0 + 7.5 * DAY_MS, 0)).toBeCloseTo(0.25, 15);
  });
  // exact: 'hold' keeps the earlier curve until the next date; the last one holds after it
  it('holds, and applies nothing before the first shift', () => {
    expect(shiftAt(shifts, T0 + 15 * DAY_MS, 1)).toBeCloseTo(0.1, 15);
    expect(shiftAt(shifts, T0 + 20 * DAY_MS, 1)).toBe(-0.05);
    expect(shiftAt(shifts, T0 + 400 * DAY_MS, 1)).toBe(-0.05);
    expect(shiftAt(shifts, T0 - 1, 1)).toBe(0);
    expect(shiftAt([], T0, 1)).toBe(0);
  });
  // exact: shifts are plain data, so a JSON round trip gives the same answers
  it('works on shifts read back from JSON', () => {
    const copy = JSON.parse(JSON.stringify(shifts)) as DatedShift[];
    expect(shiftAt(copy, T0 + 5 * DAY_MS, 0)).toBe(shiftAt(shifts, T0 + 5 * DAY_MS, 0));
  });
  it('refuses bad schedules', () => {
    const backwards = [shifts[1], shifts[0]];
    expect(() => shiftAt(backwards, T0, 1)).toThrow(RangeError);
    expect(() => shiftAt(backwards, T0, 1)).toThrow(/sorted by time_ms, strictly ascending; shift 1/);
    const badKind = [{ ...shifts[0], toNext: 'smooth' }] as unknown as DatedShift[];
    expect(() => shiftAt(badKind, T0, 1)).toThrow(/toNext 'prorate' or 'hold' in dated shift 0; got smooth/);
    expect(() => shiftAt(shifts, Number.NaN, 1)).toThrow(/finite time_ms; got NaN/);
    expect(() => shiftAt(shifts, T0, Infinity)).toThrow(/finite stage_m; got Infinity/);
    expect(() => shiftAt([{ ...shifts[0], curve: { points: [] } }], T0, 1)).toThrow(/dated shift 0.*at least one/);
  });
});

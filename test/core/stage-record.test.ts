// The stage record of a site: spot readings and logger days joined in time order (DOMAIN.md §1, one
// stage record). Checked against exact hand-made cases and, with fast-check, against the plain
// definition of the join (every value once, ordered by time, spot readings first at a shared time).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { joinStageRecord, READING_SOURCE_CODES, splitLoggerDays, stageRecordWithDischarge, type StageLoggerDay } from '../../core';
import { rating, reading, T0, QUARTER_HOUR_MS as Q } from '../support/records';

const DAY = 86_400_000;
const ctx = { siteId: 's1', fileName: 'kc01.csv', checks: [] };

describe('joining spot readings and logger days', () => {
  it('puts logger values (raw + correction) and spot readings in one time order, spot first at a shared time (exact case)', () => {
    const days = splitLoggerDays({ time_ms: [T0, T0 + Q, T0 + DAY], raw_m: [0.5, 0.6, 0.7], correction_m: [0.01, 0.02, 0.03] }, ctx);
    const spots = { time_ms: [T0 + Q, T0 + 2 * Q], stage_m: [0.63, 0.64], source: [0, 0] };
    const r = joinStageRecord(spots, days, -Infinity, Infinity);
    expect(Array.from(r.time_ms)).toEqual([T0, T0 + Q, T0 + Q, T0 + 2 * Q, T0 + DAY]);
    expect(Array.from(r.spot)).toEqual([-1, 0, -1, 1, -1]);
    expect(Array.from(r.day)).toEqual([0, -1, 0, -1, 1]);
    expect(r.stage_m[2]).toBeCloseTo(0.62, 12); // 0.60 + 0.02, exact arithmetic
    expect(r.raw_m[2]).toBe(0.6);
    expect(r.correction_m[2]).toBe(0.02);
    expect(Number.isNaN(r.raw_m[1]) && Number.isNaN(r.correction_m[1])).toBe(true);
    expect(r.source[4]).toBe(READING_SOURCE_CODES.logger);
  });

  it('keeps a window inclusive at both ends and leaves out deleted days', () => {
    const days: StageLoggerDay[] = splitLoggerDays({ time_ms: [T0, T0 + Q, T0 + DAY], raw_m: [1, 2, 3], correction_m: [0, 0, 0] }, ctx);
    const r = joinStageRecord({ time_ms: [], stage_m: [], source: [] }, days, T0 + Q, T0 + DAY);
    expect(Array.from(r.time_ms)).toEqual([T0 + Q, T0 + DAY]);
    const gone = joinStageRecord({ time_ms: [], stage_m: [], source: [] }, [{ ...days[0], deleted: true }, days[1]], -Infinity, Infinity);
    expect(Array.from(gone.stage_m)).toEqual([3]);
  });

  it('keeps a time held by two records of one day once, with the first record’s value', () => {
    const [a] = splitLoggerDays({ time_ms: [T0, T0 + 2 * Q], raw_m: [1, 3], correction_m: [0, 0] }, ctx);
    const [b] = splitLoggerDays({ time_ms: [T0 + Q, T0 + 2 * Q], raw_m: [2, 9], correction_m: [0, 0] }, ctx);
    const r = joinStageRecord({ time_ms: [], stage_m: [], source: [] }, [a, b], -Infinity, Infinity);
    expect(Array.from(r.time_ms)).toEqual([T0, T0 + Q, T0 + 2 * Q]);
    expect(Array.from(r.stage_m)).toEqual([1, 2, 3]);
  });

  it('refuses a window that ends before it starts, and spot readings out of order', () => {
    expect(() => joinStageRecord({ time_ms: [], stage_m: [], source: [] }, [], 2, 1)).toThrow(/from_ms ≤ to_ms/);
    expect(() => joinStageRecord({ time_ms: [2, 1], stage_m: [0, 0], source: [0, 0] }, [], -Infinity, Infinity)).toThrow(/time order/);
  });

  it('a window with spot readings only or logger values only gives every field by the plain definition', () => {
    // Spot readings as typed arrays (as the phone's series store gives them), window inside them: each value
    // its own spot index, no raw value or correction (NaN), no day (−1).
    const st = Float64Array.from({ length: 8 }, (_, i) => T0 + i * Q);
    const spots = { time_ms: st, stage_m: Float64Array.from(st, (_, i) => 0.4 + i / 100), source: Uint8Array.from(st, (_, i) => i % 3) };
    const r = joinStageRecord(spots, [], T0 + 2 * Q, T0 + 5 * Q);
    expect(Array.from(r.time_ms)).toEqual([2, 3, 4, 5].map((i) => T0 + i * Q));
    expect(Array.from(r.stage_m)).toEqual([2, 3, 4, 5].map((i) => 0.4 + i / 100));
    expect(Array.from(r.source)).toEqual([2, 0, 1, 2]);
    expect(Array.from(r.spot)).toEqual([2, 3, 4, 5]);
    expect(Array.from(r.day)).toEqual([-1, -1, -1, -1]);
    expect(Array.from(r.raw_m).every(Number.isNaN) && Array.from(r.correction_m).every(Number.isNaN)).toBe(true);
    // Logger values only (no spot reading in the window): stage = raw + correction, the logger's code, its day.
    const days = splitLoggerDays({ time_ms: [T0, T0 + Q, T0 + DAY], raw_m: [0.5, 0.6, 0.7], correction_m: [0.01, 0.02, 0.03] }, ctx);
    const g = joinStageRecord({ time_ms: [T0 + 9 * DAY], stage_m: [1], source: [0] }, days, -Infinity, T0 + 2 * DAY);
    expect(Array.from(g.time_ms)).toEqual([T0, T0 + Q, T0 + DAY]);
    expect(Array.from(g.stage_m)).toEqual([0.5 + 0.01, 0.6 + 0.02, 0.7 + 0.03]);
    expect(Array.from(g.raw_m)).toEqual([0.5, 0.6, 0.7]);
    expect(Array.from(g.correction_m)).toEqual([0.01, 0.02, 0.03]);
    expect(Array.from(g.source)).toEqual([1, 1, 1].map(() => READING_SOURCE_CODES.logger));
    expect(Array.from(g.spot)).toEqual([-1, -1, -1]);
    expect(Array.from(g.day)).toEqual([0, 0, 1]);
  });

  it('matches the plain definition of the join on random records (fast-check)', () => {
    fc.assert(fc.property(
      fc.uniqueArray(fc.integer({ min: 0, max: 3 * 96 }), { maxLength: 120 }),
      fc.array(fc.integer({ min: 0, max: 3 * 96 }), { maxLength: 20 }),
      (loggerSteps, spotSteps) => {
        const lt = [...loggerSteps].sort((x, y) => x - y).map((k) => T0 + k * Q);
        const days = splitLoggerDays({ time_ms: lt, raw_m: lt.map((_, i) => i), correction_m: lt.map(() => 0.5) }, ctx);
        const st = [...spotSteps].sort((x, y) => x - y).map((k) => T0 + k * Q);
        const r = joinStageRecord({ time_ms: st, stage_m: st.map(() => -1), source: st.map(() => 0) }, days, -Infinity, Infinity);
        const expected = [...st.map((t) => [t, 0]), ...lt.map((t) => [t, 1])].sort((x, y) => x[0] - y[0] || x[1] - y[1]);
        expect(Array.from(r.time_ms)).toEqual(expected.map((e) => e[0]));
        expect(Array.from(r.source)).toEqual(expected.map((e) => (e[1] === 1 ? READING_SOURCE_CODES.logger : 0)));
      },
    ), { numRuns: 200 });
  });
});

describe('the stage record with discharge', () => {
  it('gives each value the discharge of its corrected stage through the rating (Q = 10·(h − 0.2)², evaluated by hand)', () => {
    const days = splitLoggerDays({ time_ms: [T0 + Q], raw_m: [0.68], correction_m: [0.02] }, ctx);
    const spot = { ...reading('s1', T0, 0.6), id: 'r1', rev: 'x', updated_ms: 0 };
    const gone = { ...reading('s1', T0 + 2 * Q, 0.9), id: 'r2', rev: 'x', updated_ms: 0, deleted: true as const };
    const r = stageRecordWithDischarge([{ ...rating('s1', T0 - DAY), id: 'q1' }], [gone, spot], days);
    expect(r.time_ms.length).toBe(2);
    expect(r.readings[r.spot[0]].id).toBe('r1');
    expect(r.discharge_m3s[0]).toBeCloseTo(10 * 0.4 ** 2, 12); // 1.6 m³/s
    expect(r.discharge_m3s[1]).toBeCloseTo(10 * 0.5 ** 2, 12); // corrected 0.70 m → 2.5 m³/s
  });
});

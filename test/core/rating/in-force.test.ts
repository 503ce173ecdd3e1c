// The discharge of a stage at a time: the rating in force, its dated shift, the discharge and the
// extrapolated flag, against the power law worked by hand and against the one-point functions.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  dischargeAt, dischargeAtTime, dischargeThrough, hasDischarge, isExtrapolated, NO_DISCHARGE, ratingInForce, shiftAt,
  type DatedRating,
} from '../../../core';

const H = 3_600_000;
const T0 = Date.UTC(2026, 2, 1);

/** Q = 10·(h − 0.2)², gauged 0.3–1.5 m (invented; the ISO 18320 power-law form). */
function rating(id: string, validFrom_ms: number, over: Partial<DatedRating> = {}): DatedRating {
  return {
    id, validFrom_ms, shifts: [], gaugedRange_m: [0.3, 1.5],
    segments: [{ fromStage_m: 0.2, coefficient: 10, offset_m: 0.2, exponent: 2 }], ...over,
  };
}

describe('ratingInForce', () => {
  const a = rating('a', T0);
  const b = rating('b', T0 + 10 * H);
  const gone = rating('c', T0 + 5 * H, { deleted: true });
  it('is the latest validFrom at or before the time, never a deleted one, and none before the first', () => {
    const list = [b, gone, a]; // any order
    expect(ratingInForce(list, T0 - 1)).toBeUndefined();
    expect(ratingInForce(list, T0)?.id).toBe('a');
    expect(ratingInForce(list, T0 + 6 * H)?.id).toBe('a'); // the deleted one from 05:00 never applies
    expect(ratingInForce(list, T0 + 10 * H)?.id).toBe('b');
    expect(ratingInForce([], T0)).toBeUndefined();
  });
  it('between two from the same time takes the higher id (the order of the [siteId, validFrom_ms] index)', () => {
    expect(ratingInForce([rating('z', T0), rating('m', T0)], T0 + 1)?.id).toBe('z');
  });
});

describe('dischargeThrough', () => {
  it('gives the power law worked by hand, with the shift prorated in time, and NaN where no rating is in force', () => {
    // Shift +0.1 m from 02:00 prorated to −0.1 m at 06:00: at 04:00 it is 0.0 m (linear in time).
    const shifted = rating('s', T0, {
      shifts: [
        { time_ms: T0 + 2 * H, toNext: 'prorate', curve: { points: [{ stage_m: 0, shift_m: 0.1 }] } },
        { time_ms: T0 + 6 * H, toNext: 'hold', curve: { points: [{ stage_m: 0, shift_m: -0.1 }] } },
      ],
    });
    const q = dischargeThrough([shifted], [T0 - H, T0 + H, T0 + 2 * H, T0 + 4 * H, T0 + 7 * H], [0.7, 0.7, 0.7, 0.7, 0.7]);
    expect(q.discharge_m3s[0]).toBeNaN();
    expect(hasDischarge(q.discharge_m3s[0])).toBe(false);
    expect(q.ratingIndex[0]).toBe(-1);
    expect(q.discharge_m3s[1]).toBeCloseTo(10 * 0.5 ** 2, 12); // exact: 2.5 m³/s
    expect(q.shift_m[2]).toBeCloseTo(0.1, 12);
    expect(q.discharge_m3s[2]).toBeCloseTo(10 * 0.6 ** 2, 12); // exact: 3.6 m³/s
    expect(q.shift_m[3]).toBeCloseTo(0, 12);
    expect(q.discharge_m3s[3]).toBeCloseTo(2.5, 12);
    expect(q.discharge_m3s[4]).toBeCloseTo(10 * 0.4 ** 2, 12); // exact: 1.6 m³/s
    expect(q.ratingIds).toEqual(['s']);
    expect(Array.from(q.ratingIndex)).toEqual([-1, 0, 0, 0, 0]);
  });

  it('flags a stage outside the gauged range as extrapolated, but not a stage with no flow', () => {
    const q = dischargeThrough([rating('a', T0)], [T0, T0, T0, T0], [1.9, 0.25, 0.1, 1.0]);
    expect(Array.from(q.extrapolated)).toEqual([1, 1, 0, 0]);
    expect(q.discharge_m3s[2]).toBe(0); // exact: below the 0.2 m offset
    expect(q.discharge_m3s[1]).toBeCloseTo(10 * 0.05 ** 2, 12); // exact: 0.025 m³/s
  });

  it('switches rating at validFrom and lists the ratings used in order of use', () => {
    const a = rating('a', T0);
    const b = rating('b', T0 + 2 * H, { segments: [{ fromStage_m: 0.1, coefficient: 4, offset_m: 0.1, exponent: 1.5 }] });
    const q = dischargeThrough([b, a], [T0 + H, T0 + 2 * H], [0.5, 0.5]);
    expect(q.discharge_m3s[0]).toBeCloseTo(10 * 0.3 ** 2, 12); // exact: 0.9 m³/s
    expect(q.discharge_m3s[1]).toBeCloseTo(4 * 0.4 ** 1.5, 12); // exact: 4·0.4^1.5 = 1.01193 m³/s
    expect(q.ratingIds).toEqual(['a', 'b']);
  });

  it('checks a rating only when it is in force, and refuses a bad one in force', () => {
    const bad = rating('bad', T0 + 5 * H, { segments: [{ fromStage_m: 0, coefficient: -1, offset_m: 0, exponent: 2 }] });
    expect(() => dischargeThrough([rating('a', T0), bad], [T0 + H], [0.5])).not.toThrow();
    expect(() => dischargeThrough([rating('a', T0), bad], [T0 + 6 * H], [0.5])).toThrow(/coefficient > 0/);
    expect(() => dischargeThrough([rating('a', T0)], [T0], [Number.NaN])).toThrow(RangeError);
    expect(() => dischargeThrough([rating('a', T0)], [T0, T0], [0.5])).toThrow(/one stage/);
  });

  it('agrees with dischargeAt, shiftAt and isExtrapolated point by point, in any time order', () => {
    const a = rating('a', T0 + 3 * H, {
      segments: [
        { fromStage_m: 0.12, coefficient: 6, offset_m: 0.12, exponent: 2.2 },
        { fromStage_m: 0.55, coefficient: 5.2, offset_m: 0.02, exponent: 1.7 },
      ],
      shifts: [{ time_ms: T0 + 4 * H, toNext: 'prorate', curve: { points: [{ stage_m: 0.3, shift_m: 0.02 }, { stage_m: 1, shift_m: -0.03 }] } },
        { time_ms: T0 + 30 * H, toNext: 'hold', curve: { points: [{ stage_m: 0, shift_m: 0.05 }] } }],
    });
    const b = rating('b', T0 + 40 * H);
    const point = fc.record({ t: fc.integer({ min: T0, max: T0 + 60 * H }), h: fc.double({ min: -0.5, max: 3, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(point, { minLength: 1, maxLength: 40 }), (pts) => {
        const q = dischargeThrough([a, b], pts.map((p) => p.t), pts.map((p) => p.h));
        pts.forEach((p, i) => {
          const r = p.t >= b.validFrom_ms ? b : p.t >= a.validFrom_ms ? a : undefined;
          const one = dischargeAtTime([a, b], p.t, p.h);
          if (!r) {
            expect(q.discharge_m3s[i]).toBeNaN();
            expect(one.ratingId).toBeUndefined();
            return;
          }
          const s = shiftAt(r.shifts, p.t, p.h);
          const expected = dischargeAt(r, p.h, s);
          expect(q.shift_m[i]).toBe(s);
          expect(q.discharge_m3s[i]).toBe(expected);
          expect(q.extrapolated[i]).toBe(expected > 0 && isExtrapolated(r, p.h) ? 1 : 0);
          expect(one).toEqual({ discharge_m3s: expected, shift_m: s, extrapolated: q.extrapolated[i] === 1, ratingId: r.id });
        });
      }),
    );
  });

  it('spells "no discharge" one way', () => {
    expect(NO_DISCHARGE).toBeNaN();
    expect(dischargeAtTime([], T0, 0.5)).toEqual({ discharge_m3s: NO_DISCHARGE, shift_m: 0, extrapolated: false, ratingId: undefined });
  });
});

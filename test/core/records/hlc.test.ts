// Revisions: hybrid-logical-clock properties (Kulkarni, Demirbas et al. 2014, "Logical Physical
// Clocks"): monotonic per device, causality across devices, total order, string order = clock order.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compareRev, formatRev, maxRev, nextRev, parseRev, REV_MAX_COUNTER } from '../../../core/records/index';

const wall = fc.integer({ min: 0, max: 4_102_444_800_000 });
const device = fc.stringMatching(/^[A-Za-z0-9_-]{1,64}$/);

describe('nextRev', () => {
  it('is strictly increasing on one device whatever the wall clock does', () => {
    // HLC property 1 (Kulkarni 2014): l.j > l.e for successive events e → j on one process.
    fc.assert(
      fc.property(device, fc.array(wall, { minLength: 1, maxLength: 50 }), (d, clocks) => {
        let prev: string | undefined;
        for (const t of clocks) {
          const rev = nextRev(prev, t, d);
          if (prev !== undefined) expect(compareRev(rev, prev)).toBe(1);
          prev = rev;
        }
      }),
    );
  });

  it('never falls behind the wall clock and stays within the max of clock and previous revision', () => {
    // HLC property: l ≥ pt and l = max(pt, previous l) (Kulkarni 2014, §3).
    fc.assert(
      fc.property(device, wall, wall, fc.integer({ min: 0, max: 1000 }), (d, t1, t2, c) => {
        const prev = formatRev({ wall_ms: t1, counter: c, deviceId: 'other' });
        const p = parseRev(nextRev(prev, t2, d));
        expect(p.wall_ms).toBe(Math.max(t1, t2));
        expect(p.counter).toBe(t2 > t1 ? 0 : c + 1);
        expect(p.deviceId).toBe(d);
      }),
    );
  });

  it('orders a change made after seeing another device’s change above it (causality)', () => {
    // exact: device B, with a slower clock, edits after receiving A's revision; B's must sort higher.
    const a = nextRev(undefined, 1_767_225_600_500, 'device-a');
    const bSeen = maxRev(nextRev(undefined, 1_767_225_600_000, 'device-b'), a);
    const b = nextRev(bSeen, 1_767_225_600_100, 'device-b');
    expect(compareRev(b, a)).toBe(1);
    expect(parseRev(b)).toEqual({ wall_ms: 1_767_225_600_500, counter: 1, deviceId: 'device-b' });
  });

  it('breaks ties between devices by device id, so two devices never give equal revisions', () => {
    // exact: same wall time and counter, device ids "a" < "b".
    const ra = nextRev(undefined, 1000, 'a');
    const rb = nextRev(undefined, 1000, 'b');
    expect(compareRev(ra, rb)).toBe(-1);
    expect(compareRev(rb, ra)).toBe(1);
    expect(compareRev(ra, ra)).toBe(0);
  });

  it('sorts as strings exactly as by (wall, counter, device)', () => {
    fc.assert(
      fc.property(wall, fc.integer({ min: 0, max: REV_MAX_COUNTER }), device, wall, fc.integer({ min: 0, max: REV_MAX_COUNTER }), device,
        (w1, c1, d1, w2, c2, d2) => {
          const a = formatRev({ wall_ms: w1, counter: c1, deviceId: d1 });
          const b = formatRev({ wall_ms: w2, counter: c2, deviceId: d2 });
          const tupleOrder = w1 !== w2 ? Math.sign(w1 - w2) : c1 !== c2 ? Math.sign(c1 - c2) : d1 < d2 ? -1 : d1 > d2 ? 1 : 0;
          expect(compareRev(a, b)).toBe(tupleOrder);
          expect([a, b].sort()[0]).toBe(tupleOrder <= 0 ? a : b);
        }),
    );
  });

  it('moves on by one millisecond when the counter is full', () => {
    // exact: counter 999999 at wall 5000 → wall 5001, counter 0.
    const full = formatRev({ wall_ms: 5000, counter: REV_MAX_COUNTER, deviceId: 'd' });
    expect(parseRev(nextRev(full, 4000, 'd'))).toEqual({ wall_ms: 5001, counter: 0, deviceId: 'd' });
  });

  it('round-trips parse and format', () => {
    fc.assert(fc.property(wall, fc.integer({ min: 0, max: REV_MAX_COUNTER }), device, (w, c, d) => {
      expect(parseRev(formatRev({ wall_ms: w, counter: c, deviceId: d }))).toEqual({ wall_ms: w, counter: c, deviceId: d });
    }));
  });

  it('refuses a bad clock, device id or revision with a RangeError saying what is needed', () => {
    expect(() => nextRev(undefined, Number.NaN, 'd')).toThrow(/nextRev needs a clock reading/);
    expect(() => nextRev(undefined, 1000, 'has space')).toThrow(/device id of 1–64/);
    expect(() => compareRev('12-3-x', nextRev(undefined, 1, 'd'))).toThrow(RangeError);
    expect(() => parseRev('1767225600000-00000-d')).toThrow(/parseRev needs a revision/);
  });
});

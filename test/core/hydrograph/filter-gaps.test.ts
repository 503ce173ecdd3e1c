import { describe, expect, it } from 'vitest';
import { bridgingLimit_ms, separateBaseflowDetailed, summarizeEvent, type Series } from '../../../core/hydrograph/index';
import { DAY, H, T0, gammaSeries } from '../../support/hydrograph-series';

const MIN = 60_000;

/** A copy of a series with readings first..last (inclusive) marked missing (NaN). */
function withMissing(s: Series, first: number, last: number): Series {
  const q = Float64Array.from(s.discharge_m3s);
  q.fill(NaN, first, last + 1);
  return { time_ms: Float64Array.from(s.time_ms), discharge_m3s: q };
}

/** A copy of a series with readings first..last (inclusive) removed altogether (no times). */
function withoutReadings(s: Series, first: number, last: number): Series {
  const keep = (_: number, i: number) => i < first || i > last;
  return { time_ms: Float64Array.from(s.time_ms).filter(keep), discharge_m3s: Float64Array.from(s.discharge_m3s).filter(keep) };
}

const FILTERS = [
  { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 },
  { kind: 'chapman-maxwell', recession: 0.98 },
] as const;

describe('the bridging limit (DOMAIN.md §4: max(12 × step, 1 h), never above 6 h)', () => {
  // the worked figures DOMAIN.md §4 gives: 5-minute data 1 h, 15-minute 3 h, hourly 6 h; plus both bounds
  it.each([
    [1 * MIN, 1 * H],
    [5 * MIN, 1 * H],
    [15 * MIN, 3 * H],
    [1 * H, 6 * H],
    [1 * DAY, 6 * H],
  ])('a %d ms step bridges up to %d ms', (step, limit) => {
    expect(bridgingLimit_ms(step)).toBe(limit);
  });
  it('refuses a step that is not a positive time', () => {
    expect(() => bridgingLimit_ms(0)).toThrow(/usual step as a time above 0 ms; got 0/);
  });
});

describe('recursive filters across a gap', () => {
  // Exact: for a constant input Q₂ the one-store filter b_k = carry·b_{k−1} + gain·Q₂ is the geometric
  // approach b_k = b∞ + (b_K − b∞)·carry^(k−K), b∞ = gain·Q₂/(1 − carry) (closed form of a linear
  // recurrence). A gap inside the constant stretch is bridged at exactly Q₂, so the filter must follow the
  // same curve straight across it; a restart would jump to the start value instead.
  it.each(FILTERS)('$kind follows the closed form straight across a bridged gap', (method) => {
    const n = 200;
    const q = Float64Array.from({ length: n }, (_, i) => (i < 20 ? 2 : 10));
    const s: Series = { time_ms: Float64Array.from({ length: n }, (_, i) => T0 + i * 5 * MIN), discharge_m3s: q };
    const gapped = withMissing(s, 60, 67); // 8 readings, a 45 min hole between the readings either side
    const r = separateBaseflowDetailed(gapped, method);
    const step = 5 * MIN / DAY;
    const a = method.recession ** step; // c^(Δt/1 day), the stated per-step rule
    const { carry, gain } =
      method.kind === 'eckhardt'
        ? { carry: ((1 - method.bfiMax) * a) / (1 - a * method.bfiMax), gain: ((1 - a) * method.bfiMax) / (1 - a * method.bfiMax) }
        : { carry: a / (2 - a), gain: (1 - a) / (2 - a) };
    const bInf = (gain * 10) / (1 - carry);
    const bK = r.baseflow[20];
    for (const k of [40, 59, 60, 64, 67, 68, 120, 199]) {
      expect(r.baseflow[k]).toBeCloseTo(bInf + (bK - bInf) * carry ** (k - 20), 10);
    }
    expect(r.restarts).toEqual([]);
    expect(r.notes.join(' ')).toMatch(/A 0\.75 h gap \(8 missing\) from .* was bridged by a straight line in discharge/);
  });

  // Issue 20's case: a 5-minute storm record with 8 readings missing on the rising limb gave Eckhardt
  // 8,890 m³ instead of 24,119 m³ (−63 %). The same storm with and without the gap must give the same
  // direct runoff within 2 % (our tolerance: the straight-line bridge of 40 min of a rising limb is the only
  // difference), whether the readings are marked missing or absent altogether.
  const storm = gammaSeries(1.2, 18, 5, 4, 5 / 60, 36); // invented: 36 h of 5-minute readings
  const rising = (i: number) => i * 5 / 60 > 2.5 && i * 5 / 60 < 5;
  const first = Array.from(storm.time_ms, (_, i) => i).findIndex(rising);
  it.each([
    ...FILTERS,
    { kind: 'lyne-hollick' } as const,
  ])('$kind: the same storm with and without an 8-reading gap on the rise', (method) => {
    const whole = separateBaseflowDetailed(storm, method);
    const vWhole = summarizeEvent(storm, whole.baseflow).directVolume_m3;
    for (const gapped of [withMissing(storm, first, first + 7), withoutReadings(storm, first, first + 7)]) {
      const r = separateBaseflowDetailed(gapped, method);
      const v = summarizeEvent(gapped, r.baseflow).directVolume_m3;
      expect(Math.abs(v - vWhole) / vWhole).toBeLessThan(0.02);
      expect(r.restarts).toEqual([]);
      expect(r.notes.join(' ')).toMatch(/ran across it \(gaps up to 1 h are bridged\)/);
    }
  });

  // Beyond the limit the filter restarts, and says where and why (DOMAIN.md §4: never silently).
  it('restarts after a gap beyond the limit and says where and why', () => {
    const gapped = withMissing(storm, first, first + 23); // 24 readings: a 2 h 5 min hole on 5-minute data
    const r = separateBaseflowDetailed(gapped, FILTERS[0]);
    expect(r.restarts).toHaveLength(1);
    expect(r.restarts?.[0].from_ms).toBe(storm.time_ms[first - 1]);
    expect(r.restarts?.[0].to_ms).toBe(storm.time_ms[first + 24]);
    expect(r.notes.join(' ')).toMatch(/A 2\.08 h gap \(24 missing\) from 2024-03-01 0\d:\d\d UTC to 2024-03-01 0\d:\d\d UTC is longer than the 1 h this record can be bridged over, so Eckhardt was restarted after it/);
    // the restart sets b = BFImax·Q at the first reading after the gap (Eckhardt 2005's start)
    expect(r.baseflow[first + 24]).toBeCloseTo(0.8 * storm.discharge_m3s[first + 24], 10);
  });
});

import { describe, expect, it } from 'vitest';
import {
  BFI_MAX_PRESETS,
  defaultLyneHollick,
  defaultSmoothedMinima,
  localMinimumInterval_days,
  separateBaseflow,
  separateBaseflowDetailed,
} from '../../../core/hydrograph/index';
import { lyneHollick } from '../../../core/hydrograph/filters/lyne-hollick';
import { DAY, T0 } from '../../support/hydrograph-series';

const daily = (q: readonly number[]) => ({
  time_ms: Float64Array.from(q, (_, i) => T0 + i * DAY),
  discharge_m3s: Float64Array.from(q),
});

describe('Eckhardt (2005)', () => {
  it('presets: 0.80 perennial porous, 0.50 ephemeral porous, 0.25 perennial hard rock', () => {
    // Eckhardt 2005, Hydrological Processes 19(2): BFImax by aquifer type
    expect(BFI_MAX_PRESETS['perennial-porous']).toBe(0.8);
    expect(BFI_MAX_PRESETS['ephemeral-porous']).toBe(0.5);
    expect(BFI_MAX_PRESETS['perennial-hard-rock']).toBe(0.25);
  });

  for (const [name, bfiMax] of Object.entries(BFI_MAX_PRESETS)) {
    it(`settles at BFImax·Q on steady flow (${name}), approaching it geometrically`, () => {
      // exact, from Eckhardt 2005: with Q constant the fixed point of
      // b = ((1−B)·a·b + (1−a)·B·Q)/(1 − a·B) is b = B·Q, and the distance to it shrinks by r = (1−B)·a/(1 − a·B)
      // each step. The record steps from 4 to 10 m³/s; the filter starts at its steady value B·4.
      const a = 0.98;
      const q = [4, ...Array(2000).fill(10)];
      const b = separateBaseflow(daily(q), { kind: 'eckhardt', bfiMax, recession: a });
      const r = ((1 - bfiMax) * a) / (1 - a * bfiMax);
      const first = ((1 - bfiMax) * a * bfiMax * 4 + (1 - a) * bfiMax * 10) / (1 - a * bfiMax);
      expect(b[1]).toBeCloseTo(first, 12);
      expect(b[50] - bfiMax * 10).toBeCloseTo((first - bfiMax * 10) * r ** 49, 10);
      expect(b[400] - bfiMax * 10).toBeCloseTo((first - bfiMax * 10) * r ** 399, 10);
      expect(b[2000]).toBeCloseTo(bfiMax * 10, 9);
    });
  }
});

describe('Chapman & Maxwell (1996)', () => {
  it('settles at Q/2 on steady flow', () => {
    // exact: the fixed point of b = k/(2−k)·b + (1−k)/(2−k)·Q is b = Q/2 for every k
    for (const k of [0.9, 0.925, 0.98]) {
      const b = separateBaseflow(daily([2, ...Array(2000).fill(6)]), { kind: 'chapman-maxwell', recession: k });
      expect(b[2000]).toBeCloseTo(3, 9);
      expect(b[1]).toBeCloseTo((k / (2 - k)) * 1 + ((1 - k) / (2 - k)) * 6, 12);
    }
  });
});

describe('Lyne & Hollick (1979)', () => {
  it('defaults: α = 0.925, three passes, 30 reflected values (Nathan & McMahon 1990; Ladson et al. 2013)', () => {
    expect(defaultLyneHollick).toEqual({ alpha: 0.925, passes: 3, reflect: 30 });
  });

  it('one forward pass on a step, by hand from the filter equation', () => {
    // exact, by hand: f_k = α·f_{k−1} + (1+α)/2·(Q_k − Q_{k−1}), kept in [0, Q_k]; b = Q − f.
    // Q = 1, 1, 3, 3, 3: f = 0, 0, 1.925, 1.780625, 1.647078125 → b = 1, 1, 1.075, 1.219375, 1.352921875
    const b = lyneHollick(Float64Array.of(1, 1, 3, 3, 3), 0.925, 1, 0);
    const expected = [1, 1, 1.075, 1.219375, 1.352921875];
    for (let i = 0; i < 5; i++) expect(b[i]).toBeCloseTo(expected[i], 12);
  });

  it('the quickflow constraint keeps f ≥ 0 on a fall (by hand)', () => {
    // by hand: Q = 0, 10, 0, 0 with α = 0.925: f1 = 0.9625·10 = 9.625 (b = 0.375);
    // f2 = 0.925·9.625 − 0.9625·10 = −0.721875 < 0 → 0 (b = Q = 0); f3 = 0 (b = 0)
    const b = lyneHollick(Float64Array.of(0, 10, 0, 0), 0.925, 1, 0);
    expect(Array.from(b)).toEqual([0, b[1], 0, 0]);
    expect(b[1]).toBeCloseTo(0.375, 12);
  });

  it('a steady record is all baseflow after any number of passes (exact: ΔQ = 0 keeps f = 0)', () => {
    const b = separateBaseflow(daily(Array(100).fill(7.5)), { kind: 'lyne-hollick' });
    for (const v of b) expect(v).toBe(7.5);
  });

  it('three passes on a storm: less baseflow than one pass, never above Q', () => {
    const q = Array.from({ length: 120 }, (_, i) => 2 + 40 * Math.exp(-((i - 40) ** 2) / 30));
    const one = separateBaseflow(daily(q), { kind: 'lyne-hollick', passes: 1 });
    const three = separateBaseflow(daily(q), { kind: 'lyne-hollick' });
    let sumOne = 0;
    let sumThree = 0;
    for (let i = 0; i < q.length; i++) {
      sumOne += one[i];
      sumThree += three[i];
      expect(three[i]).toBeLessThanOrEqual(q[i]);
    }
    expect(sumThree).toBeLessThan(sumOne);
  });
});

// Hand-checkable daily series (invented), 25 days = five 5-day blocks.
// day:  0   1    2  3  4 | 5  6   7    8  9 | 10  11   12 13 14 | 15 16 17 18 19 | 20 21 22  23 24
const Q = [10, 4.8, 6, 7, 9, 20, 15, 4.9, 12, 11, 9, 4.46, 25, 14, 10, 8, 4, 6, 7, 9, 12, 6, 5.5, 7, 8];

describe('smoothed minima (Institute of Hydrology 1980; Gustard et al. 1992, IH Report 108)', () => {
  it('defaults: 5-day blocks, factor 0.9', () => expect(defaultSmoothedMinima).toEqual({ block_days: 5, factor: 0.9 }));

  it('turning points and baseflow, worked by hand', () => {
    // Block minima: 4.8 (day 1), 4.9 (day 7), 4.46 (day 11), 4 (day 16), 5.5 (day 22).
    // Turning point when 0.9 × minimum ≤ both neighbouring minima:
    //   day 7: 4.41 ≤ 4.8 and ≤ 4.46 → yes; day 11: 4.014 ≤ 4.9 but > 4 → no; day 16: 3.6 ≤ 4.46 and ≤ 5.5 → yes.
    //   (first and last blocks have one neighbour only: never turning points)
    // Baseflow: 4.9 held before day 7 (capped at Q on day 1: 4.8), straight from 4.9 (day 7) to 4 (day 16),
    // i.e. −0.1 per day (capped on day 11: line 4.5 > Q 4.46), 4 held after day 16.
    const expected = [
      4.9, 4.8, 4.9, 4.9, 4.9, 4.9, 4.9, 4.9, 4.8, 4.7, 4.6, 4.46, 4.4, 4.3, 4.2, 4.1, 4, 4, 4, 4, 4, 4, 4, 4, 4,
    ];
    const b = separateBaseflow(daily(Q), { kind: 'smoothed-minima' });
    for (let i = 0; i < Q.length; i++) expect(b[i]).toBeCloseTo(expected[i], 12);
  });

  it('throws when the record has fewer than three whole blocks, saying how many days it has and needs', () => {
    // 14 daily flows are 14 days; three 5-day blocks need 15 (IH 1980 block rule)
    const call = () => separateBaseflow(daily(Q.slice(0, 14)), { kind: 'smoothed-minima' });
    expect(call).toThrow(RangeError);
    expect(call).toThrow(
      'Smoothed minima needs at least 15 days of flows (three 5-day blocks); this window has 14 days. Widen the window.',
    );
    // 6-minute readings over 9.2 days (2208 steps): 9 whole days of daily means, one 5-day block
    const n = 2209;
    const sub = { time_ms: Float64Array.from({ length: n }, (_, i) => T0 + i * 360_000), discharge_m3s: new Float64Array(n).fill(3) };
    expect(() => separateBaseflow(sub, { kind: 'smoothed-minima' })).toThrow(
      'Smoothed minima needs at least 15 days of flows (three 5-day blocks); this window has 9.2 days. Widen the window.',
    );
  });
});

describe('local minimum (Sloto & Crouse 1996, USGS WRIR 96-4040)', () => {
  it('interval 2N*: the odd integer from 3 to 11 nearest to 2N', () => {
    // exact, derived from the rule with N = A^0.2 (A in mi²): 2N = 4, 6, 8, 10 at A = 32, 243, 1024, 3125 mi²
    const mi2 = 2.589988110336; // NIST SP 811 (exact)
    expect(localMinimumInterval_days(1 * mi2)).toBe(3);
    expect(localMinimumInterval_days(100 * mi2)).toBe(5);
    expect(localMinimumInterval_days(500 * mi2)).toBe(7);
    expect(localMinimumInterval_days(2000 * mi2)).toBe(9);
    expect(localMinimumInterval_days(50000 * mi2)).toBe(11);
  });

  it('local minima and baseflow on the same daily series, worked by hand', () => {
    // 100 mi² → 2N* = 5 days: a day is a local minimum when lowest within 2 days either side:
    // days 1 (4.8), 7 (4.9), 11 (4.46), 16 (4), 22 (5.5). Linear between them, held at the ends.
    const expected = [
      4.8, 4.8, 4.8 + 0.1 / 6, 4.8 + 0.2 / 6, 4.8 + 0.3 / 6, 4.8 + 0.4 / 6, 4.8 + 0.5 / 6, 4.9,
      4.79, 4.68, 4.57, 4.46, 4.368, 4.276, 4.184, 4.092, 4, 4.25, 4.5, 4.75, 5, 5.25, 5.5, 5.5, 5.5,
    ];
    const b = separateBaseflow(daily(Q), { kind: 'local-minimum' }, { area_km2: 100 * 2.589988110336 });
    for (let i = 0; i < Q.length; i++) expect(b[i]).toBeCloseTo(expected[i], 12);
    const same = separateBaseflowDetailed(daily(Q), { kind: 'local-minimum', interval_days: 5 });
    expect(Array.from(same.baseflow)).toEqual(Array.from(b));
    expect(same.notes.join(' ')).toMatch(/interval is 5 days/);
  });

  it('needs an interval or an area', () => {
    expect(() => separateBaseflow(daily(Q), { kind: 'local-minimum' })).toThrow(/interval_days or a catchment area_km2/);
  });
});

// On sub-daily records both minima methods work on daily mean flows, as published (IH 1980; Sloto & Crouse 1996).
describe('minima methods on sub-daily readings', () => {
  // The hand-checkable daily series above as 6-hourly readings with a made-up ripple (invented). The test
  // computes its own daily means by the trapezoid rule and feeds them to the daily method checked by hand above.
  const step = 6 * 3_600_000;
  const n = Q.length * 4 + 1;
  const time_ms = Float64Array.from({ length: n }, (_, i) => T0 + i * step);
  const discharge_m3s = Float64Array.from({ length: n }, (_, i) => Q[Math.min(Q.length - 1, Math.floor(i / 4))] * (1 + 0.2 * Math.sin(i)));
  const sub = { time_ms, discharge_m3s };

  /** The test's own daily means: trapezoid rule over each whole day from the first reading. */
  function ownDailyMeans(): number[] {
    const means: number[] = [];
    for (let d = 0; (d + 1) * 4 < n; d++) {
      let sum = 0;
      for (let i = d * 4; i < d * 4 + 4; i++) sum += (discharge_m3s[i] + discharge_m3s[i + 1]) / 2;
      means.push(sum / 4);
    }
    return means;
  }

  for (const method of [{ kind: 'smoothed-minima' }, { kind: 'local-minimum', interval_days: 5 }] as const) {
    it(`${method.kind}: the daily method on daily means, interpolated to the readings between day middles, capped at Q`, () => {
      const means = ownDailyMeans();
      expect(means.length).toBe(Q.length);
      const onDays = separateBaseflow(daily(means), method);
      const r = separateBaseflowDetailed(sub, method);
      for (let i = 0; i < n; i++) {
        // the day middle of day d is at 4d + 2 readings; held level before the first and after the last middle
        const x = (i - 2) / 4;
        const d = Math.max(0, Math.min(means.length - 1, Math.floor(x)));
        const v =
          x <= 0 ? onDays[0] : x >= means.length - 1 ? onDays[means.length - 1] : onDays[d] + (onDays[d + 1] - onDays[d]) * (x - d);
        expect(r.baseflow[i]).toBeCloseTo(Math.min(v, discharge_m3s[i]), 12);
      }
      expect(r.notes.join(' ')).toMatch(/means of the 25 whole days/);
    });
  }

  it('local minimum needs at least one whole day on sub-daily readings', () => {
    const short = { time_ms: time_ms.subarray(0, 4), discharge_m3s: discharge_m3s.subarray(0, 4) };
    expect(() => separateBaseflow(short, { kind: 'local-minimum', interval_days: 5 })).toThrow(
      /at least one whole day of readings for local minimum .* this window has 0.7 days/,
    );
  });
});

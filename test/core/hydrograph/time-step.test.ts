import { describe, expect, it } from 'vitest';
import { separateBaseflow, separateBaseflowDetailed, type Series } from '../../../core/hydrograph/index';
import { DAY, H, T0 } from '../../support/hydrograph-series';

const MIN15 = 15 * 60_000;

/** Q = Q₀·a^t (t in days) sampled every step_ms over span_days, from T0. */
function recession(q0: number, a: number, step_ms: number, span_days: number): Series {
  const count = Math.round((span_days * DAY) / step_ms) + 1;
  const time_ms = Float64Array.from({ length: count }, (_, i) => T0 + i * step_ms);
  const discharge_m3s = Float64Array.from(time_ms, (t) => q0 * Math.pow(a, (t - T0) / DAY));
  return { time_ms, discharge_m3s };
}

describe('filter constants are per day and applied at the record step as c^(Δt / 1 day)', () => {
  it('Eckhardt on an exponential recession with the same daily constant: hourly and daily records agree once settled', () => {
    // exact, from Eckhardt 2005's filter: if Q_k = a·Q_{k−1} with the filter's own a, then b = Q solves
    // b_k = ((1−B)·a·b_{k−1} + (1−a)·B·Q_k)/(1 − a·B), and Q − b shrinks by (1−B)·a/(1 − a·B) each step.
    // A recession of 0.98 per day falls by 0.98^(1/24) per hour, so both records must settle at b = Q.
    const a = 0.98;
    const bfiMax = 0.8;
    const daily = recession(50, a, DAY, 400);
    const hourly = recession(50, a, H, 400);
    const bd = separateBaseflow(daily, { kind: 'eckhardt', bfiMax, recession: a });
    const bh = separateBaseflow(hourly, { kind: 'eckhardt', bfiMax, recession: a });
    for (let day = 300; day <= 400; day += 10) {
      const q = daily.discharge_m3s[day];
      expect(Math.abs(bh[day * 24] - bd[day]) / q).toBeLessThan(1e-8);
      expect(Math.abs(bd[day] - q) / q).toBeLessThan(1e-8);
    }
  });

  it('Eckhardt on the hourly recession: Q − b shrinks by the per-hour carry factor, exactly', () => {
    // exact (derivation above): e_k = Q_k − b_k = carry^k·e₀ with carry = (1−B)·a_h/(1 − a_h·B), a_h = a^(1/24),
    // and e₀ = (1 − B)·Q₀ because the filter starts at B·Q₀.
    const a = 0.98;
    const bfiMax = 0.5;
    const s = recession(10, a, H, 3);
    const b = separateBaseflow(s, { kind: 'eckhardt', bfiMax, recession: a });
    const ah = Math.pow(a, 1 / 24);
    const carry = ((1 - bfiMax) * ah) / (1 - ah * bfiMax);
    for (const k of [1, 24, 72]) {
      expect(s.discharge_m3s[k] - b[k]).toBeCloseTo(Math.pow(carry, k) * (1 - bfiMax) * 10, 10);
    }
  });

  it('a constant that does not match the recession leaves b below Q (so the check above can fail)', () => {
    // exact: with Q falling by ρ per step and the filter's constant a ≠ ρ, b/Q tends to gain·ρ/(ρ − carry) ≠ 1.
    // 0.98 applied per hour (as the filters did before, per sample) is 0.98^24 per day: a faster recession
    // than the record's 0.98 per day, so b stays well below Q.
    const s = recession(50, 0.98, H, 40);
    const b = separateBaseflow(s, { kind: 'eckhardt', bfiMax: 0.8, recession: Math.pow(0.98, 24) });
    const last = s.discharge_m3s.length - 1;
    expect(b[last] / s.discharge_m3s[last]).toBeLessThan(0.99);
  });

  it('Eckhardt on a steady 15-minute record stays at, or settles at, BFImax·Q', () => {
    // exact, Eckhardt 2005: the fixed point of the filter for constant Q is BFImax·Q whatever a is; the filter
    // starts at BFImax·Q₀, so a record steady from its start stays there, and after a step it approaches it
    // (by (1−B)·a/(1 − a·B) per step: 0.99958 per 15 min here, so 400 days leave e^(−16) of the step).
    const n = 96 * 400 + 1;
    const steady = {
      time_ms: Float64Array.from({ length: n }, (_, i) => T0 + i * MIN15),
      discharge_m3s: new Float64Array(n).fill(10),
    };
    const b = separateBaseflow(steady, { kind: 'eckhardt', bfiMax: 0.5, recession: 0.98 });
    for (const k of [0, 1, 96, n - 1]) expect(b[k]).toBeCloseTo(5, 12);
    const stepped = { time_ms: steady.time_ms, discharge_m3s: Float64Array.from(steady.discharge_m3s, (v, i) => (i === 0 ? 4 : v)) };
    const bs = separateBaseflow(stepped, { kind: 'eckhardt', bfiMax: 0.5, recession: 0.98 });
    expect(bs[96]).toBeLessThan(4.9);
    expect(bs[n - 1]).toBeCloseTo(5, 5);
  });

  it('notes say in one sentence what was applied', () => {
    // 0.98^(1/96) = e^(ln 0.98 / 96) = 0.99978957…; 0.925^(1/96) = 0.99918828…
    const s = recession(5, 0.98, MIN15, 2);
    const eck = separateBaseflowDetailed(s, { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 });
    expect(eck.notes).toContain('Recession constant 0.98 per day applied as 0.999790 per 15-min step.');
    const lh = separateBaseflowDetailed(s, { kind: 'lyne-hollick' });
    expect(lh.notes).toContain('Lyne–Hollick α 0.925 per day applied as 0.999188 per 15-min step.');
    const cm = separateBaseflowDetailed(recession(5, 0.98, H, 2), { kind: 'chapman-maxwell', recession: 0.925 });
    expect(cm.notes).toContain('Recession constant 0.925 per day applied as 0.996757 per 1-h step.');
    const daily = separateBaseflowDetailed(recession(5, 0.98, DAY, 20), { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 });
    expect(daily.notes).toEqual(['Recession constant 0.98 per day applied as is to the daily readings.']);
  });

  it('Lyne–Hollick: after a step rise the quickflow falls by α = 0.925 per day on 15-minute data as on daily data', () => {
    // exact, from the filter equation: with Q constant after the rise, f_k = α·f_{k−1} (constraints inactive),
    // so over one day the quickflow falls by α_step^96 = α_day. One forward pass; the flat start keeps f = 0.
    const stepAt = 96 * 5;
    const n = 96 * 10 + 1;
    const s = {
      time_ms: Float64Array.from({ length: n }, (_, i) => T0 + i * MIN15),
      discharge_m3s: Float64Array.from({ length: n }, (_, i) => (i < stepAt ? 1 : 3)),
    };
    const b = separateBaseflow(s, { kind: 'lyne-hollick', passes: 1 });
    const f = (k: number) => 3 - b[k];
    expect(f(stepAt + 96) / f(stepAt)).toBeCloseTo(0.925, 10);
    expect(f(stepAt + 192) / f(stepAt)).toBeCloseTo(0.925 ** 2, 10);
    const daily = {
      time_ms: Float64Array.from({ length: 11 }, (_, i) => T0 + i * DAY),
      discharge_m3s: Float64Array.from({ length: 11 }, (_, i) => (i < 5 ? 1 : 3)),
    };
    const bd = separateBaseflow(daily, { kind: 'lyne-hollick', passes: 1 });
    expect((3 - bd[6]) / (3 - bd[5])).toBeCloseTo(0.925, 12);
  });

  it('typed arrays (filtered with the checks in the same loop) and plain arrays give the same baseflow', () => {
    // the same filter equations either way; plain arrays go through the general checks first
    const s = recession(20, 0.9, MIN15, 3);
    const plain = { time_ms: Array.from(s.time_ms), discharge_m3s: Array.from(s.discharge_m3s, (v, i) => v + (i % 7 === 0 ? 3 : 0)) };
    const typed = { time_ms: Float64Array.from(plain.time_ms), discharge_m3s: Float64Array.from(plain.discharge_m3s) };
    for (const method of [
      { kind: 'lyne-hollick' },
      { kind: 'eckhardt', bfiMax: 0.5, recession: 0.98 },
      { kind: 'chapman-maxwell', recession: 0.925 },
    ] as const) {
      expect(Array.from(separateBaseflow(typed, method))).toEqual(Array.from(separateBaseflow(plain, method)));
    }
  });
});

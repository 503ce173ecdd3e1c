// The one-store recursive filter (core/hydrograph/filters/first-order.ts), which takes the recursion two
// readings at a time. Checked against the one-step recursion written out here as Eckhardt (2005, Hydrological
// Processes 19(2)) and Chapman & Maxwell (1996) publish it, and against the record checks it promises: a bad
// value anywhere (either reading of a pair, the odd last one, a later stretch) sends the caller to the
// general path.
import { describe, expect, it } from 'vitest';
import { firstOrderFilter, firstOrderFilterChecked } from '../../../core/hydrograph/filters/first-order';
import { eckhardtCoefficients } from '../../../core/hydrograph/filters/eckhardt';
import { chapmanMaxwellCoefficients } from '../../../core/hydrograph/filters/chapman-maxwell';
import { normalGenerator } from '../../support/noise';

const STEP = 900_000;
const T0 = Date.UTC(2025, 6, 1);
const none = { takeBelow: () => undefined };

/** The recursion one reading at a time: b₀ = start·Q₀, b_k = min(carry·b_{k−1} + gain·Q_k, Q_k). */
function oneStep(q: Float64Array, carry: number, gain: number, start: number): Float64Array {
  const b = new Float64Array(q.length);
  if (q.length === 0) return b;
  b[0] = start * q[0];
  for (let k = 1; k < q.length; k++) b[k] = Math.min(carry * b[k - 1] + gain * q[k], q[k]);
  return b;
}

/** An invented 15-minute record of n readings: flashy storms on low flow with seeded noise, so the cap b ≤ Q binds often. */
function flashy(n: number, seed: number): { t: Float64Array; q: Float64Array } {
  const z = normalGenerator(seed);
  const t = Float64Array.from({ length: n }, (_, i) => T0 + i * STEP);
  const q = Float64Array.from({ length: n }, (_, i) => Math.max(0, 0.4 + 12 * Math.max(0, Math.sin(i / 37)) ** 6 + 0.05 * z()));
  return { t, q };
}

/** Published coefficients: Eckhardt 2005 with BFImax B and a per step; Chapman & Maxwell 1996 with k per step. */
const eck = (B: number, a: number) => ({ carry: ((1 - B) * a) / (1 - a * B), gain: ((1 - a) * B) / (1 - a * B) });
const cm = (k: number) => ({ carry: k / (2 - k), gain: (1 - k) / (2 - k) });

const filters = [
  ['Eckhardt, BFImax 0.8, a 0.98 per step', eck(0.8, 0.98), eckhardtCoefficients(0.8, 0.98), 0.8],
  ['Eckhardt, BFImax 0.5, a 0.98 per day at 15 minutes', eck(0.5, 0.98 ** (1 / 96)), eckhardtCoefficients(0.5, 0.98 ** (1 / 96)), 0.5],
  ['Eckhardt, BFImax 1 (carry 0: baseflow is the discharge)', eck(1, 0.95), eckhardtCoefficients(1, 0.95), 1],
  ['Chapman–Maxwell, k 0.925 per step', cm(0.925), chapmanMaxwellCoefficients(0.925), 0.5],
] as const;

describe('the recursion taken two readings at a time', () => {
  for (const [name, published, { drain, gain }, start] of filters) {
    it(`${name}: equals the published one-step recursion to rounding, odd and even lengths`, () => {
      for (const n of [0, 1, 2, 3, 4, 5, 1_000, 1_001, 20_001]) {
        const { q } = flashy(n, n + 3);
        const got = firstOrderFilter(q, drain, gain, start);
        const expected = oneStep(q, published.carry, published.gain, start);
        expect(got.length).toBe(n);
        let worst = 0;
        let capped = 0;
        for (let k = 0; k < n; k++) {
          worst = Math.max(worst, Math.abs(got[k] - expected[k]) / Math.max(expected[k], 1e-300));
          // Exactly b ≤ Q and b ≥ 0, not just to rounding.
          expect(got[k] <= q[k] && got[k] >= 0).toBe(true);
          if (got[k] === q[k]) capped++;
        }
        expect(worst).toBeLessThan(1e-12);
        // The cap is tried: it binds on the falling limbs of these flashy records.
        if (n > 1_000) expect(capped).toBeGreaterThan(0);
      }
    });
  }
});

describe('steady flow', () => {
  it('stays at BFImax·Q (Eckhardt) and Q/2 (Chapman–Maxwell) to the last digits, at every step from 15 minutes to a day', () => {
    // exact: with Q constant the fixed point of Eckhardt's filter is BFImax·Q whatever a is (Eckhardt 2005), and
    // of Chapman–Maxwell's Q/2; both filters start there, so a steady record must stay there. A year of 5-minute
    // readings lets any drift of the carried level show.
    const n = 105_121;
    for (const perDayRecession of [0.9, 0.98, 0.995]) {
      for (const readingsPerDay of [1, 24, 96, 288]) {
        const a = perDayRecession ** (1 / readingsPerDay);
        for (const Q of [10, 0.37, 123.4, 0.003]) {
          const q = new Float64Array(n).fill(Q);
          for (const [B, { drain, gain }] of [
            [0.25, eckhardtCoefficients(0.25, a)],
            [0.8, eckhardtCoefficients(0.8, a)],
            [0.5, chapmanMaxwellCoefficients(a)],
          ] as const) {
            const b = firstOrderFilter(q, drain, gain, B);
            let worst = 0;
            for (let k = 0; k < n; k++) worst = Math.max(worst, Math.abs(b[k] - B * Q) / (B * Q));
            expect(worst, `B ${B}, a ${perDayRecession} per day at ${readingsPerDay} a day, Q ${Q}`).toBeLessThan(1e-15);
          }
        }
      }
    }
  });
});

describe('the checked pass', () => {
  const { drain, gain } = eckhardtCoefficients(0.8, 0.98);
  for (const n of [3, 4, 4_097, 4_098, 12_289, 12_290]) {
    it(`gives firstOrderFilter's values bit for bit on a clean record of ${n} readings`, () => {
      const { t, q } = flashy(n, 11);
      const checked = firstOrderFilterChecked(t, q, drain, gain, 0.8, none);
      expect(checked).not.toBeNull();
      expect(Array.from(checked!)).toEqual(Array.from(firstOrderFilter(q, drain, gain, 0.8)));
    });
  }

  it('tells its follower how far it got, ending at the last reading', () => {
    const { t, q } = flashy(10_000, 5);
    const ends: number[] = [];
    firstOrderFilterChecked(t, q, drain, gain, 0.8, { takeBelow: (end) => ends.push(end) });
    expect(ends).toEqual([4_097, 8_193, 10_000]);
  });

  // 12,289 readings: stretches of 4,096 from reading 1 leave one reading over at the end (index 12,288).
  const n = 12_289;
  const places = [0, 1, 2, 4_095, 4_096, 4_097, 9_000, 9_001, n - 2, n - 1];
  const badDischarges = [NaN, Infinity, -Infinity, -1e-300, -5e-324, -3];

  it('refuses (null) a non-finite or negative discharge in any place', () => {
    for (const place of places) {
      for (const bad of badDischarges) {
        const { t, q } = flashy(n, 2);
        q[place] = bad;
        expect(firstOrderFilterChecked(t, q, drain, gain, 0.8, none), `Q[${place}] = ${bad}`).toBeNull();
      }
    }
  });

  it('takes a discharge of −0 (it is ≥ 0) and a very large finite one', () => {
    const { t, q } = flashy(n, 2);
    q[4_096] = -0;
    q[9_001] = 1e300;
    expect(firstOrderFilterChecked(t, q, drain, gain, 0.8, none)).not.toBeNull();
  });

  it('refuses a non-finite time, or one off the regular step by more than the rule allows, in any place', () => {
    // The rule (prepareSeries): every step within one part in a million of the first. A reading 2 ms off a
    // 15-minute grid changes two steps by 2 ms each (2.2 parts in a million); 0.2 ms off is within it.
    for (const place of places.filter((p) => p > 1)) {
      for (const bad of [NaN, Infinity, -Infinity, T0 + place * STEP + 2, T0 + place * STEP - 2]) {
        const { t, q } = flashy(n, 2);
        t[place] = bad;
        expect(firstOrderFilterChecked(t, q, drain, gain, 0.8, none), `t[${place}] = ${bad}`).toBeNull();
      }
      const { t, q } = flashy(n, 2);
      t[place] += 0.2;
      expect(firstOrderFilterChecked(t, q, drain, gain, 0.8, none), `t[${place}] 0.2 ms off`).not.toBeNull();
    }
  });
});

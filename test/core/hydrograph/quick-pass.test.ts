// The recursive filters' quick pass (the filter's own loop checks a clean regular record, and the noise
// note's samples are taken behind it in stretches) gives what the general path gives, value for value.
import { describe, expect, it } from 'vitest';
import { separateBaseflowDetailed } from '../../../core/hydrograph/index';
import { filterNoiseNote } from '../../../core/hydrograph/filter-noise';
import { medianStepChange, noiseSigma, StridedDifferences } from '../../../core/hydrograph/noise';
import { normalGenerator } from '../../support/noise';

const T0 = Date.UTC(2025, 3, 1);
const STEP = 300_000;

/** An invented 5-minute record of n readings: a slow storm on steady flow, with seeded noise of σ m³/s. */
function noisyRecord(n: number, sigma: number, seed: number) {
  const z = normalGenerator(seed);
  const time_ms = Float64Array.from({ length: n }, (_, i) => T0 + i * STEP);
  const discharge_m3s = Float64Array.from({ length: n }, (_, i) => {
    const h = (i * STEP) / 3_600_000;
    return Math.max(0, 2 + 6 * Math.exp(-(((h - 200) / 40) ** 2)) + sigma * z());
  });
  return { time_ms, discharge_m3s };
}

describe('the quick pass of the recursive filters', () => {
  // Longer than several stretches (4,096 readings each) and not a multiple of one.
  const record = noisyRecord(20_011, 0.05, 7);

  it('Eckhardt: the baseflow is the published recursion, value for value', () => {
    // Eckhardt 2005, Hydrological Processes 19(2): b_k = ((1−B)·a·b_{k−1} + (1−a)·B·Q_k)/(1 − a·B), b ≤ Q,
    // with a per step = a_day^(Δt/1 day) (exact for an exponential recession); b₀ = B·Q₀.
    const B = 0.8;
    const a = Math.pow(0.98, STEP / 86_400_000);
    const q = record.discharge_m3s;
    const expected = new Float64Array(q.length);
    expected[0] = B * q[0];
    for (let k = 1; k < q.length; k++) {
      const b = ((1 - B) * a * expected[k - 1] + (1 - a) * B * q[k]) / (1 - a * B);
      expected[k] = Math.min(b, q[k]);
    }
    const got = separateBaseflowDetailed(record, { kind: 'eckhardt', bfiMax: B, recession: 0.98 }).baseflow;
    let worst = 0;
    for (let k = 0; k < q.length; k++) worst = Math.max(worst, Math.abs(got[k] - expected[k]));
    expect(worst).toBeLessThan(1e-12);
  });

  for (const method of [
    { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 },
    { kind: 'chapman-maxwell', recession: 0.95 },
  ] as const) {
    it(`${method.kind}: baseflow and notes equal the general path's (forced by giving a bridging limit)`, () => {
      const quick = separateBaseflowDetailed(record, method);
      const general = separateBaseflowDetailed(record, method, { maxBridge_ms: 3_600_000 });
      expect(Array.from(quick.baseflow)).toEqual(Array.from(general.baseflow));
      expect(quick.notes).toEqual(general.notes);
      // The noise (0.05 m³/s) is large beside the usual 5-minute change of this slow storm: the note is there.
      expect(quick.notes.join(' ')).toMatch(/noise .* is large for its step/);
    });
  }

  it('a record with one bad reading past the first stretch takes the general path and is refused alike', () => {
    const bad = { time_ms: record.time_ms, discharge_m3s: Float64Array.from(record.discharge_m3s) };
    bad.discharge_m3s[9_000] = -1;
    expect(() => separateBaseflowDetailed(bad, { kind: 'eckhardt', bfiMax: 0.8, recession: 0.98 })).toThrow(RangeError);
  });
});

describe('strided differences taken in pieces', () => {
  it('give the same noise σ, step change and note as taken at once', () => {
    const q = noisyRecord(10_007, 0.02, 11).discharge_m3s;
    for (const order of [1, 2] as const) {
      const pieces = new StridedDifferences(q, order, undefined, 4096);
      for (let end = 1; end < q.length; end += 997) pieces.takeBelow(end);
      pieces.takeBelow(q.length);
      const whole = order === 2 ? noiseSigma(q, undefined, 4096) * 0.6745 * Math.sqrt(6) : medianStepChange(q, undefined, 4096);
      expect(pieces.median()).toBeCloseTo(whole, 14);
    }
    expect(filterNoiseNote(q, 'Eckhardt')).toMatch(/noise/);
  });
});

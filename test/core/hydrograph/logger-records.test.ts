// The automatic storm answer on 100 seeded simulated logger records per time step (model and its ranges in
// test/support/logger-records.ts): key points within stated bounds, direct volumes near the noise-free answer.
import { describe, expect, it } from 'vitest';
import {
  findEventPoints,
  findEventPointsDetailed,
  runoffDuration_days,
  separateBaseflowDetailed,
  summarizeEvent,
  type Series,
} from '../../../core/hydrograph/index';
import { HOUR_MS, hoursToShare, loggerRecord, noiseFree, ORIGIN_MS, singleStorm, truePeak_h, type StormModel } from '../../support/logger-records';

const AREA_KM2 = 50; // invented catchment; N = 0.827·50^0.2 = 1.81 days (Linsley, Kohler & Paulhus)
const SEEDS = Array.from({ length: 100 }, (_, i) => i + 1);
const STEPS_MIN = [5, 15, 60];
const noiseSeed = (seed: number, step: number) => seed * 7919 + step;

/**
 * Our bounds (stated before the runs, from the model; no published source):
 * - rise start: from 2 h before the onset of direct runoff to the first reading after the direct runoff
 *   reaches 10 % of its peak (the start of a gamma pulse is gradual: "where it starts" is a band, not a time);
 * - peak: within 0.15·t_p + one step of the true peak (noise of a few mm moves the highest reading along the
 *   flat top: for Q ≈ Q_p(1 − n/2·(δ/t_p)²), a 0.5 % wiggle moves it by about 0.1·t_p);
 * - end of runoff: the peak + N (the rule itself), so within the same band of the true peak + N.
 */
function keyPointsWithinBounds(model: StormModel, record: Series): string | null {
  const burst = model.bursts[0];
  const p = findEventPoints(record, { area_km2: AREA_KM2 });
  const step_h = model.step_min / 60;
  const rise_h = (p.riseStart_ms - ORIGIN_MS) / HOUR_MS;
  const peak_h = (p.peak_ms - ORIGIN_MS) / HOUR_MS;
  const end_h = (p.runoffEnd_ms - ORIGIN_MS) / HOUR_MS;
  const truePeak = truePeak_h(model);
  const peakBand = 0.15 * burst.tp_h + step_h;
  const n_h = 24 * runoffDuration_days(AREA_KM2);
  if (rise_h < burst.onset_h - 2 || rise_h > burst.onset_h + hoursToShare(burst, 0.1) + step_h) return `rise start ${rise_h.toFixed(2)} h`;
  if (Math.abs(peak_h - truePeak) > peakBand) return `peak ${peak_h.toFixed(2)} h, true ${truePeak.toFixed(2)} h`;
  if (Math.abs(end_h - (truePeak + n_h)) > peakBand + 1e-6) return `end ${end_h.toFixed(2)} h`;
  return null;
}

/** Direct runoff volume (m³) by a method with automatic key points and the area rule, from rise start to end of runoff. */
function directVolume(record: Series, kind: 'straight-line' | 'concave' | 'variable-slope'): number {
  const r = separateBaseflowDetailed(record, { kind }, { area_km2: AREA_KM2 });
  const p = r.points;
  if (p === undefined) throw new Error('event methods always return their key points');
  return summarizeEvent(record, r.baseflow, { from_ms: p.riseStart_ms, to_ms: p.runoffEnd_ms, baseflowAtPoints: r.baseflowAtPoints }).directVolume_m3;
}

describe('key points on simulated logger records (5-, 15- and 60-minute steps, 100 seeds each)', () => {
  for (const step of STEPS_MIN) {
    it(`${step}-minute records: rise start, peak and end of runoff within the bounds in at least 95 of 100`, () => {
      const misses: string[] = [];
      for (const seed of SEEDS) {
        const model = singleStorm(seed, step);
        const miss = keyPointsWithinBounds(model, loggerRecord(model, noiseSeed(seed, step)));
        if (miss !== null) misses.push(`seed ${seed}: ${miss}`);
      }
      expect(misses.length, misses.join('; ')).toBeLessThanOrEqual(5);
    });
  }
  it('the noise-free records meet the same bounds every time (so the bounds are about noise, not the method)', () => {
    for (const step of STEPS_MIN) {
      for (const seed of SEEDS.slice(0, 20)) {
        const model = noiseFree(singleStorm(seed, step));
        expect(keyPointsWithinBounds(model, loggerRecord(model, 1))).toBeNull();
      }
    }
  });
});

describe('direct volumes on simulated logger records stay near the noise-free answer', () => {
  // Our criterion (issue 12): within 10 % (straight line) and 15 % (concave, variable slope, whose recession
  // extensions amplify noise) of the same method on the noise-free record, in at least 90 of 100 seeds.
  const limits = { 'straight-line': 0.1, concave: 0.15, 'variable-slope': 0.15 } as const;
  for (const step of [5, 15]) {
    for (const kind of ['straight-line', 'concave', 'variable-slope'] as const) {
      it(`${kind}, ${step}-minute records`, () => {
        const misses: string[] = [];
        for (const seed of SEEDS) {
          const model = singleStorm(seed, step);
          const clean = directVolume(loggerRecord(noiseFree(model), 1), kind);
          const noisy = directVolume(loggerRecord(model, noiseSeed(seed, step)), kind);
          const off = Math.abs(noisy / clean - 1);
          if (!(off <= limits[kind])) misses.push(`seed ${seed}: ${(100 * off).toFixed(1)} %`);
        }
        expect(misses.length, misses.join('; ')).toBeLessThanOrEqual(10);
      });
    }
  }
});

describe('two-burst storms and flat records', () => {
  it('a storm in two bursts starts before the first rise in at least 95 of 100 (15-minute records)', () => {
    const misses: string[] = [];
    for (const seed of SEEDS) {
      const base = singleStorm(seed, 15);
      const first = base.bursts[0];
      // a second, larger burst starting 0.8·t_p after the first: the dip between them stays well above the base
      const second = { ...first, onset_h: first.onset_h + 0.8 * first.tp_h, peak_m3s: 1.3 * first.peak_m3s };
      const model: StormModel = { ...base, bursts: [first, second] };
      const r = findEventPointsDetailed(loggerRecord(model, noiseSeed(seed, 15)), { area_km2: AREA_KM2 });
      const rise_h = (r.points.riseStart_ms - ORIGIN_MS) / HOUR_MS;
      if (rise_h > first.onset_h + hoursToShare(first, 0.1) + 0.25 || rise_h < first.onset_h - 2) misses.push(`seed ${seed}: ${rise_h.toFixed(2)} h`);
    }
    expect(misses.length, misses.join('; ')).toBeLessThanOrEqual(5);
  });
  it('a flat record with logger noise is refused at every step', () => {
    for (const step of STEPS_MIN) {
      for (const seed of SEEDS.slice(0, 20)) {
        const model = { ...singleStorm(seed, step), bursts: [] };
        expect(() => findEventPoints(loggerRecord(model, noiseSeed(seed, step)))).toThrow(/No storm was found/);
      }
    }
  });
});

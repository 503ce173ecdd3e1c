// Storms found only where the record is continuous (DOMAIN.md §4, gaps and spot readings). Records are
// stated models (gamma-shaped pulses on a constant base; exact peak times), and the bridging limit is
// checked against the figures DOMAIN.md states (5-minute data 1 h, 15-minute 3 h, hourly 6 h).
import { describe, expect, it } from 'vitest';
import {
  bridgingLimit_ms, continuousStretches, demoLoggerRecord, demoRating, demoScenario, dischargeAt, findEventPointsDetailed, findStorms, separateBaseflowDetailed, STORM_PEAK_RATIO, summarizeEvent,
} from '../../core';

const H = 3_600_000;
const Q = 15 * 60_000;
const t0 = Date.UTC(2026, 0, 1);
const method = { kind: 'variable-slope' } as const;

/** Gamma pulse (shape 3) peaking 12 h after it starts (exact: the mode of t³e^(−3t/12) is t = 12 h). */
const pulse = (h: number, startH: number, peak: number) => {
  const tau = h - startH;
  return tau <= 0 ? 0 : peak * Math.pow(tau / 12, 3) * Math.exp(3 * (1 - tau / 12));
};

/** A record every step_ms for `hours`, 1 m³/s plus pulses starting at the given hours. */
function record(step_ms: number, hours: number, pulses: [number, number][]) {
  const n = Math.floor((hours * H) / step_ms) + 1;
  const time_ms = Float64Array.from({ length: n }, (_, i) => t0 + i * step_ms);
  const discharge_m3s = Float64Array.from(time_ms, (t) => 1 + pulses.reduce((sum, [start, peak]) => sum + pulse((t - t0) / H, start, peak), 0));
  return { time_ms, discharge_m3s };
}

describe('the bridging limit', () => {
  it('is max(12 × step, 1 h), at most 6 h (DOMAIN.md §4)', () => {
    expect(bridgingLimit_ms(5 * 60_000)).toBe(1 * H);
    expect(bridgingLimit_ms(15 * 60_000)).toBe(3 * H);
    expect(bridgingLimit_ms(60 * 60_000)).toBe(6 * H);
    expect(bridgingLimit_ms(60_000)).toBe(1 * H);
    expect(() => bridgingLimit_ms(Number.NaN)).toThrow(/step/);
  });

  it('cuts a record at every step longer than the limit', () => {
    expect(continuousStretches([0, 1, 2, 10, 11, 30], 5)).toEqual([[0, 3], [3, 5], [5, 6]]);
    expect(continuousStretches([], 5)).toEqual([]);
  });
});

describe('storms in a record', () => {
  const hourly = record(H, 30 * 24, [[8 * 24, 6], [20 * 24, 3]]);

  it('finds both storms of a continuous record, newest first, at the model peaks (12 h after each start)', () => {
    const storms = findStorms(hourly, { area_km2: 50, method });
    expect(storms).toHaveLength(2);
    expect(storms[0].points.peak_ms).toBe(t0 + (20 * 24 + 12) * H);
    expect(storms[1].points.peak_ms).toBe(t0 + (8 * 24 + 12) * H);
    expect(storms[0].peak_m3s).toBeCloseTo(4, 9);
    expect(storms[1].peak_m3s).toBeCloseTo(7, 9);
  });

  it('finds no storm in a steady record', () => {
    expect(findStorms({ ...hourly, discharge_m3s: new Float64Array(hourly.time_ms.length).fill(1) }, { area_km2: 50, method })).toEqual([]);
    expect(STORM_PEAK_RATIO).toBeGreaterThan(1);
  });

  it('gives each storm the depth of the analysis it opens: its window, points found there, the same method', () => {
    for (const s of findStorms(hourly, { area_km2: 50, method })) {
      const keep = Array.from(hourly.time_ms, (t) => t >= s.window.from_ms && t <= s.window.to_ms);
      const w = { time_ms: hourly.time_ms.filter((_, i) => keep[i]), discharge_m3s: hourly.discharge_m3s.filter((_, i) => keep[i]) };
      const points = findEventPointsDetailed(w, { area_km2: 50 }).points;
      const sep = separateBaseflowDetailed(w, method, { points, area_km2: 50 });
      const summary = summarizeEvent(w, sep.baseflow, { area_km2: 50, from_ms: points.riseStart_ms, to_ms: points.runoffEnd_ms, baseflowAtPoints: sep.baseflowAtPoints });
      expect(s.points).toEqual(points);
      expect(s.depth_mm).toBe(summary.runoffDepth_mm);
      expect(s.volume_m3).toBe(summary.directVolume_m3);
    }
  });

  it('never spans a gap longer than the limit: a storm cut by a 5 h hole in 15-minute data is not joined across it', () => {
    const whole = record(Q, 10 * 24, [[4 * 24, 5]]);
    // A hole from 2 h before the peak to 3 h after it (5 h, beyond the 3 h limit of 15-minute data).
    const peak = t0 + (4 * 24 + 12) * H;
    const keep = Array.from(whole.time_ms, (t) => t <= peak - 2 * H || t >= peak + 3 * H);
    const holed = { time_ms: whole.time_ms.filter((_, i) => keep[i]), discharge_m3s: whole.discharge_m3s.filter((_, i) => keep[i]) };
    for (const s of findStorms(holed, { area_km2: 20, method })) {
      expect(s.points.riseStart_ms < peak - 2 * H && s.points.runoffEnd_ms > peak + 3 * H).toBe(false);
      expect(s.window.from_ms >= peak + 3 * H || s.window.to_ms <= peak - 2 * H).toBe(true);
    }
    // The same record without the hole has its storm at the model peak.
    expect(findStorms(whole, { area_km2: 20, method })[0].points.peak_ms).toBe(peak);
  });

  it('finds no storm in scattered spot readings, whatever their values', () => {
    // Three readings a day for 20 days, rising to a big "peak" on day 10: never a continuous record.
    const time_ms = Float64Array.from({ length: 60 }, (_, i) => t0 + Math.floor(i / 3) * 24 * H + (i % 3) * 4 * H);
    const discharge_m3s = Float64Array.from(time_ms, (t) => 1 + 20 * Math.exp(-Math.abs((t - t0) / H - 240) / 30));
    expect(findStorms({ time_ms, discharge_m3s }, { area_km2: 20, method })).toEqual([]);
  });

  it('keeps a logger storm and leaves out a spot reading 2 days after the record ends', () => {
    const logger = record(Q, 10 * 24, [[4 * 24, 5]]);
    const n = logger.time_ms.length;
    const time_ms = Float64Array.from([...logger.time_ms, logger.time_ms[n - 1] + 2 * 24 * H]);
    const discharge_m3s = Float64Array.from([...logger.discharge_m3s, 9]);
    const storms = findStorms({ time_ms, discharge_m3s }, { area_km2: 20, method });
    expect(storms.map((s) => s.points.peak_ms)).toEqual([t0 + (4 * 24 + 12) * H]);
    expect(storms[0].window.to_ms).toBeLessThanOrEqual(logger.time_ms[n - 1]);
  });
});

describe('the demo record', () => {
  it('finds the demo storm (the model pulse starting on day 13.5) first', () => {
    const s = demoScenario(Date.UTC(2026, 10, 30));
    const logger = demoLoggerRecord(s);
    const rating = demoRating();
    const series = { time_ms: logger.time_ms, discharge_m3s: Float64Array.from(logger.stage_m, (h) => dischargeAt(rating, h)) };
    const storms = findStorms(series, { area_km2: s.site.area_km2, method });
    const start = logger.time_ms[0];
    // Model peak 8 h after the pulse starts on day 13.5 (demoFlow), within the record's 15-minute step and noise.
    expect(Math.abs(storms[0].points.peak_ms - (start + 13.5 * 24 * H + 8 * H))).toBeLessThanOrEqual(2 * H);
  });
});

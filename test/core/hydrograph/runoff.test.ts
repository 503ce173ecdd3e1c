import { describe, expect, it } from 'vitest';
import { phiIndex, recessionConstant, summarizeEvent, unitHydrograph } from '../../../core/hydrograph/index';
import { DAY, fromHours, H, T0, triangleSeries } from '../../support/hydrograph-series';

describe('summarizeEvent', () => {
  // Triangle of 10 m³/s over a 6 h base on 1 m³/s: direct ½·10·6·3600 = 108 000 m³ (exact).
  const s = triangleSeries(() => 1, 10, 2, 4, 8, 0.25, 12);
  const base = new Float64Array(s.time_ms.length).fill(1);

  it('volumes, BFI, depth and runoff coefficient (exact)', () => {
    const sum = summarizeEvent(s, base, { area_km2: 10.8, rainfall_mm: 25 });
    expect(sum.peak_m3s).toBe(11);
    expect(sum.peakTime_ms).toBe(T0 + 4 * H);
    expect(sum.directVolume_m3).toBeCloseTo(108_000, 6);
    expect(sum.baseflowVolume_m3).toBeCloseTo(1 * 12 * 3600, 6);
    expect(sum.totalVolume_m3).toBeCloseTo(108_000 + 43_200, 6);
    expect(sum.baseflowIndex).toBeCloseTo(43_200 / 151_200, 12);
    // exact: 108 000 m³ over 10.8 km² = 10.8·10⁶ m² is 0.01 m = 10 mm; 10 mm of 25 mm rain is 0.4
    expect(sum.runoffDepth_mm).toBeCloseTo(10, 12);
    expect(sum.runoffCoefficient).toBeCloseTo(0.4, 12);
  });

  it('leaves out depth and coefficient without an area or rainfall', () => {
    const sum = summarizeEvent(s, base);
    expect(sum.runoffDepth_mm).toBeUndefined();
    expect(sum.runoffCoefficient).toBeUndefined();
  });

  it('rejects rainfall without an area, a bad window, and a baseflow above the flow', () => {
    expect(() => summarizeEvent(s, base, { rainfall_mm: 20 })).toThrow(/needs area_km2 with rainfall_mm/);
    expect(() => summarizeEvent(s, base, { area_km2: 10, rainfall_mm: 0 })).toThrow(/rainfall_mm above 0/);
    expect(() => summarizeEvent(s, base, { from_ms: T0 + 5 * H, to_ms: T0 + 4 * H })).toThrow(/from_ms ≤ to_ms/);
    expect(() => summarizeEvent(s, base.map((v) => v + 1))).toThrow(/0 ≤ baseflow ≤ discharge/);
    expect(() => summarizeEvent(s, base.subarray(1))).toThrow(/one baseflow value per reading/);
  });
});

describe('unitHydrograph', () => {
  it('the SCS triangular unit hydrograph peak 2.08·A/T_p (Chow, Maidment & Mays 1988, §7.7)', () => {
    // Chow, Maidment & Mays 1988, Applied Hydrology §7.7 (from memory): the SCS triangular unit hydrograph has
    // base t_b = 2.67·T_p and peak q_p = 2.08·A/T_p (m³/s per cm of runoff, A in km², T_p in h). The constant
    // follows exactly from the triangle: q_p = 2·(0.01 m·A·10⁶ m²)/(2.67·T_p·3600 s) = 2.0807·A/T_p.
    const area = 100;
    const tp = 3;
    // an event with any height: its unit hydrograph per 10 mm (= 1 cm) must be the SCS triangle
    const s = triangleSeries(() => 4, 57, 0.99, 0.99 + tp, 0.99 + 2.67 * tp, 0.03, 15); // corners on readings
    const base = new Float64Array(s.time_ms.length).fill(4);
    const uh = unitHydrograph(s, base, { area_km2: area });
    const peak = Math.max(...Array.from(uh.discharge_m3s));
    expect(peak).toBeCloseTo((2 * 0.01 * area * 1e6) / (2.67 * tp * 3600), 9); // exact, derived
    expect(Math.abs(peak / ((2.08 * area) / tp) - 1)).toBeLessThan(1e-3); // the rounded handbook constant
    expect(uh.time_ms).toBe(s.time_ms);
  });

  it('ordinates per depth_mm: 1 mm is a tenth of 10 mm, and the volume is depth × area', () => {
    const s = triangleSeries(() => 0, 20, 0, 2, 10, 0.5, 12);
    const zero = new Float64Array(s.time_ms.length);
    const ten = unitHydrograph(s, zero, { area_km2: 50 });
    const one = unitHydrograph(s, zero, { area_km2: 50, depth_mm: 1 });
    let v = 0;
    for (let i = 1; i < s.time_ms.length; i++) v += ((one.discharge_m3s[i] + one.discharge_m3s[i - 1]) / 2) * 1800;
    expect(v).toBeCloseTo(0.001 * 50e6, 6); // exact: 1 mm over 50 km² = 50 000 m³
    for (let i = 0; i < s.time_ms.length; i++) expect(ten.discharge_m3s[i]).toBeCloseTo(10 * one.discharge_m3s[i], 12);
  });

  it('needs an area and some direct runoff', () => {
    const s = triangleSeries(() => 2, 0, 0, 2, 10, 0.5, 12);
    const same = Float64Array.from(s.discharge_m3s);
    expect(() => unitHydrograph(s, same, { area_km2: 10 })).toThrow(/some direct runoff/);
    expect(() => unitHydrograph(s, same, { area_km2: -1 })).toThrow(/area above 0 km²/);
  });
});

describe('recessionConstant: Q_t = Q₀·k^t, K = −1/ln k', () => {
  it('recovers k and K from an exact exponential recession', () => {
    // exact: Q = 12·0.85^t (t in days), so k = 0.85 per day and K = −1/ln 0.85 = 6.1531… days
    const days = [0, 0.5, 1, 2, 3, 4.5, 6];
    const s = { time_ms: Float64Array.from(days, (d) => T0 + d * DAY), discharge_m3s: Float64Array.from(days, (d) => 12 * 0.85 ** d) };
    const r = recessionConstant(s, T0, T0 + 6 * DAY);
    expect(r.k_perDay).toBeCloseTo(0.85, 12);
    expect(r.K_days).toBeCloseTo(-1 / Math.log(0.85), 10);
    expect(r.q0_m3s).toBeCloseTo(12, 10);
    expect(r.readings).toBe(7);
  });

  it('refuses a rising segment', () => {
    const s = fromHours([0, 1, 2], [1, 2, 3]);
    expect(() => recessionConstant(s, T0, T0 + 2 * H)).toThrow(/needs a falling segment/);
    expect(() => recessionConstant(s, T0, T0)).toThrow(/to_ms after from_ms/);
  });
});

describe('phiIndex: Σ max(P_j − φ·Δt, 0) = R (Chow, Maidment & Mays 1988, §5)', () => {
  it('worked by hand on an invented hourly hyetograph', () => {
    // P = 5, 15, 25, 10, 5 mm; R = 20 mm. Largest first: 25, 15, 10, 5, 5.
    // m = 1: φΔt = (25 − 20)/1 = 5 < 15 (next) → too low; m = 2: (40 − 20)/2 = 10, between 10 and 15 → φ = 10 mm/h.
    // Check: excess 0, 5, 15, 0, 0 → 20 mm over 2 h.
    const r = phiIndex([5, 15, 25, 10, 5], 1, 20);
    expect(r.phi_mm_per_h).toBeCloseTo(10, 12);
    expect(Array.from(r.excess_mm)).toEqual([0, 5, 15, 0, 0]);
    expect(r.excessDuration_h).toBe(2);
  });

  it('30-minute steps: φ is per hour', () => {
    // by hand: P = 4, 8, 2 mm per 30 min, R = 6: m = 2: (12 − 6)/2 = 3 mm per step, between 2 and 4 → φ = 6 mm/h
    const r = phiIndex([4, 8, 2], 0.5, 6);
    expect(r.phi_mm_per_h).toBeCloseTo(6, 12);
    expect(r.excessDuration_h).toBe(1);
  });

  it('rejects runoff above the rainfall and bad steps', () => {
    expect(() => phiIndex([5, 5], 1, 11)).toThrow(/at most the rainfall/);
    expect(() => phiIndex([5, 5], 0, 1)).toThrow(/step_h above 0/);
    expect(() => phiIndex([5, -1], 1, 1)).toThrow(/rainfall ≥ 0 mm/);
  });
});

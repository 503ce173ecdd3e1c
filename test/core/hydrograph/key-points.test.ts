import { describe, expect, it } from 'vitest';
import {
  findEventPoints,
  findEventPointsDetailed,
  findInflection,
  findInflectionDetailed,
  inflectionByNewtonPolynomial,
  runoffDuration_days,
} from '../../../core/hydrograph/index';
import { DAY, fromHours, gammaSeries, H, T0, triangleSeries } from '../../support/hydrograph-series';

// NIST SP 811, Appendix B: 1 mi² = 2.589 988 110 336 km² (exact, 1.609344²).
const KM2_PER_MI2 = 2.589988110336;

describe('runoffDuration_days: N = 0.827·A^0.2 (A in km²)', () => {
  // Linsley, Kohler & Paulhus, Hydrology for Engineers: N = A^0.2 days with A in square miles.
  // 0.827 is 2.589988110336^−0.2 = 0.82669… rounded to three figures, so the two forms agree to 0.05 %.
  for (const area_mi2 of [1, 10, 100, 1000, 10000]) {
    it(`${area_mi2} mi² agrees with the square-mile form`, () => {
      const n = runoffDuration_days(area_mi2 * KM2_PER_MI2);
      expect(Math.abs(n / Math.pow(area_mi2, 0.2) - 1)).toBeLessThan(5e-4);
    });
  }
  it('is exactly 0.827 for 1 km² and 0.827·2 for 32 km²', () => {
    expect(runoffDuration_days(1)).toBe(0.827); // exact: 1^0.2 = 1
    expect(runoffDuration_days(32)).toBeCloseTo(1.654, 12); // exact: 32^0.2 = 2
  });
  it('rejects an area ≤ 0', () => {
    expect(() => runoffDuration_days(0)).toThrow(RangeError);
    expect(() => runoffDuration_days(-5)).toThrow(/area above 0 km²; got -5/);
  });
});

describe('findEventPoints', () => {
  // Triangle on a flat base of 2 m³/s: rise at 10 h, peak 10 m³/s above base at 14 h, back at 30 h, hourly.
  const tri = triangleSeries(() => 2, 10, 10, 14, 30, 1, 72);

  it('peak is the time of the highest reading; rise start the last reading at the pre-event level', () => {
    const p = findEventPoints(tri);
    expect(p.peak_ms).toBe(T0 + 14 * H);
    expect(p.riseStart_ms).toBe(T0 + 10 * H);
    expect(p.inflection_ms).toBeGreaterThan(p.peak_ms);
    expect(p.runoffEnd_ms).toBeGreaterThan(p.inflection_ms);
  });

  it('rise start after a falling pre-event recession is the trough before the rise', () => {
    const q = [9, 8, 7.2, 6.5, 6, 5.6, 9, 15, 12, 9, 7, 6, 5.5, 5.2, 5];
    const p = findEventPoints(fromHours(q.map((_, i) => i), q));
    expect(p.riseStart_ms).toBe(T0 + 5 * H);
    expect(p.peak_ms).toBe(T0 + 7 * H);
  });

  it('with an area the end of runoff is the peak + N days', () => {
    const long = triangleSeries(() => 2, 10, 10, 14, 30, 1, 24 * 10);
    const area = 32; // N = 0.827·32^0.2 = 1.654 days, exact
    const p = findEventPoints(long, { area_km2: area });
    expect(p.runoffEnd_ms).toBeCloseTo(T0 + 14 * H + 1.654 * DAY, 0);
  });

  it('clamps the end of runoff to the last reading and says so', () => {
    const r = findEventPointsDetailed(tri, { area_km2: 5000 }); // N = 0.827·5000^0.2 ≈ 4.3 days > 58 h of record
    expect(r.points.runoffEnd_ms).toBe(T0 + 72 * H);
    expect(r.notes.join(' ')).toMatch(/after the last reading; it was set to the last reading/);
  });

  it('without an area, the end is the break between two straight lines on a semi-log plot', () => {
    // exact: ln Q falls at 0.5 per hour from the peak to 20 h, then at 0.02 per hour. Both parts are straight
    // in ln Q and the 20 h reading lies on both, so the two-line fit is exact with 20 h ending the first line
    // or starting the second: the break is the 20 h or the 21 h reading.
    const hours: number[] = [];
    const q: number[] = [];
    for (let h = 0; h <= 60; h++) {
      hours.push(h);
      if (h < 8) q.push(1 + h);
      else if (h <= 20) q.push(9 * Math.exp(-0.5 * (h - 8)));
      else q.push(9 * Math.exp(-0.5 * 12) * Math.exp(-0.02 * (h - 20)));
    }
    const p = findEventPoints(fromHours(hours, q));
    expect(p.peak_ms).toBe(T0 + 8 * H);
    expect([T0 + 20 * H, T0 + 21 * H]).toContain(p.runoffEnd_ms);
  });

  it('ignores a later event when looking for the falling limb', () => {
    // two invented events: the second (smaller) begins at 40 h
    const q: number[] = [];
    for (let h = 0; h <= 80; h++) {
      const first = h < 10 ? 0 : 20 * ((h - 10) / 6) ** 3 * Math.exp(3 * (1 - (h - 10) / 6));
      const second = h < 40 ? 0 : 8 * ((h - 40) / 6) ** 3 * Math.exp(3 * (1 - (h - 40) / 6));
      q.push(1 + first + second);
    }
    const p = findEventPoints(fromHours(q.map((_, i) => i), q));
    expect(p.peak_ms).toBe(T0 + 16 * H);
    expect(p.runoffEnd_ms).toBeLessThanOrEqual(T0 + 41 * H);
    // exact, derived: inflection at 10 + 6(1 + 1/√3) = 19.46 h (the second event adds nothing before 40 h)
    expect(Math.abs((p.inflection_ms - T0) / H - (16 + 6 / Math.sqrt(3)))).toBeLessThan(0.2);
  });

  it('returns every time as a whole millisecond (records store integer ms)', () => {
    // N = 0.827·7^0.2 days is not a whole number of ms; the inflection root and the semi-log break are not either.
    const storm = gammaSeries(1.5, 20, 9, 3, 0.25, 96);
    for (const options of [undefined, { area_km2: 7 }, { area_km2: 123.4 }]) {
      const r = findEventPointsDetailed(storm, options);
      for (const v of Object.values(r.points)) expect(Number.isInteger(v)).toBe(true);
      expect(findEventPoints(storm, options)).toEqual(r.points);
    }
    const found = findInflectionDetailed(storm, T0 + 9 * H, T0 + 60 * H);
    expect(Number.isInteger(found.inflection_ms)).toBe(true);
    for (const v of found.bracket_ms ?? []) expect(Number.isInteger(v)).toBe(true);
    expect(Number.isInteger(findInflection(storm, T0 + 9 * H, T0 + 60 * H))).toBe(true);
    expect(Number.isInteger(inflectionByNewtonPolynomial(storm, T0 + 9 * H, T0 + 40 * H).inflection_ms)).toBe(true);
    // the area rule still holds to the millisecond: peak + N days, rounded (Linsley, Kohler & Paulhus)
    const p = findEventPoints(storm, { area_km2: 7 });
    expect(p.runoffEnd_ms).toBe(Math.round(p.peak_ms + 0.827 * Math.pow(7, 0.2) * DAY));
  });

  it('throws a RangeError when there is no rise or no fall', () => {
    expect(() => findEventPoints(fromHours([0, 1, 2, 3], [5, 4, 3, 2]))).toThrow(/rise before the peak/);
    expect(() => findEventPoints(fromHours([0, 1, 2, 3], [1, 2, 3, 4]))).toThrow(/readings after the peak/);
    expect(() => findEventPoints(fromHours([0, 1, 2], [1, 2, 1]))).toThrow(/at least 4 readings; got 3/);
    expect(() => findEventPoints(tri, { area_km2: 0 })).toThrow(/area above 0 km²/);
  });
});

import { describe, expect, it } from 'vitest';
import { constantShift, dischargeAt, type DatedRating, type GaugingRecord } from '../../core';
import { gaugingCheck } from '../../web/screens/Gaugings/check';
import { ratingPlotData } from '../../web/screens/Ratings/plot-data';

const rating: DatedRating = {
  id: 'r1', validFrom_ms: 0, shifts: [], segments: [{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }], gaugedRange_m: [0.3, 0.9],
};
const g = (h: number, f: number, i: number) => ({ id: `g${i}`, time_ms: i, meanStage_m: h, discharge_m3s: dischargeAt(rating, h) * f, grade: 'good' }) as GaugingRecord;
const gaugings = [g(0.5, 1.01, 2), g(0.35, 1.2, 1), g(0.8, 0.97, 3)];

describe('ratingPlotData', () => {
  it('puts the gaugings on one ascending discharge axis with the curve, numbered oldest first', () => {
    const d = ratingPlotData(rating, gaugings, 'arithmetic', 'metric');
    for (let i = 1; i < d.x.length; i++) expect(d.x[i]).toBeGreaterThanOrEqual(d.x[i - 1]);
    expect(d.points.map((p) => [p.label, p.gauging.id, p.checks])).toEqual([[1, 'g1', false], [2, 'g2', true], [3, 'g3', true]]);
    const at = d.gaugingAt.indexOf(1);
    expect(d.gaugings[at]).toBe(0.5);
    // exact: the curve passes through (Q(h), h), so at a gauging's x the curve is at the stage giving that discharge
    expect(d.gauged[at]).toBeCloseTo(0.1 + Math.sqrt((dischargeAt(rating, 0.5) * 1.01) / 5), 12);
    expect(d.band).toEqual([0.3, 0.9]);
  });
  it('dashes only outside the gauged range, with the two parts meeting', () => {
    const d = ratingPlotData(rating, [], 'arithmetic', 'metric');
    d.x.forEach((_, i) => {
      const y = Number.isFinite(d.gauged[i]) ? d.gauged[i] : d.extrapolated[i];
      if (y > 0.31 && y < 0.89) expect(Number.isNaN(d.extrapolated[i])).toBe(true);
      if (y < 0.29 || y > 0.91) expect(Number.isNaN(d.gauged[i])).toBe(true);
    });
    const both = d.x.filter((_, i) => Number.isFinite(d.gauged[i]) && Number.isFinite(d.extrapolated[i]));
    expect(both.length).toBeGreaterThanOrEqual(2);
  });
  // exact: with a constant shift s in force, Q = C·(h + s − e)^b; a gauging on the shifted curve checks, one on
  // the base curve is off by more than the grade allows; the plot and the gauging list say the same (one home).
  it('marks a gauging as checking the rating with the shift in force at its time, as the gauging list does', () => {
    const shifted: DatedRating = { ...rating, shifts: [{ time_ms: 0, curve: constantShift(0.05), toNext: 'hold' }] };
    const onShifted = { id: 's1', time_ms: 10, meanStage_m: 0.5, discharge_m3s: 5 * (0.5 + 0.05 - 0.1) ** 2, grade: 'good' } as GaugingRecord;
    const onBase = { ...onShifted, id: 's2', time_ms: 11, discharge_m3s: 5 * (0.5 - 0.1) ** 2 };
    const d = ratingPlotData(shifted, [onShifted, onBase], 'arithmetic', 'metric');
    expect(d.points.map((p) => [p.gauging.id, p.checks])).toEqual([['s1', true], ['s2', false]]);
    for (const p of d.points) expect(p.checks).toBe(gaugingCheck(p.gauging, [shifted])!.checks);
    expect(gaugingCheck(onShifted, [shifted])!.deviation_pct).toBeCloseTo(0, 10);
    expect(gaugingCheck(onShifted, [shifted])!.appliedShift_m).toBeCloseTo(0.05, 12);
  });
  // exact: on log axes a power law Q = C·(h − e)^b is a straight line of slope 1/b in (ln Q, ln(h − e))
  it('plots stage above the offset on log axes, where the curve is straight', () => {
    const d = ratingPlotData({ ...rating, gaugedRange_m: undefined }, [], 'log', 'metric');
    expect(d.offset).toBe(0.1);
    const i = 10;
    const j = d.x.length - 10;
    expect(Math.log(d.gauged[j] / d.gauged[i]) / Math.log(d.x[j] / d.x[i])).toBeCloseTo(0.5, 10);
  });
});

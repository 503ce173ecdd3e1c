import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { midSection, type Vertical } from '../../../core/gauging/index';

// Random sections: 2–40 verticals at strictly ascending stations, depths ≥ 0 with some water, velocities
// of either sign, optional angle coefficients.
const sectionArb: fc.Arbitrary<Vertical[]> = fc
  .array(
    fc.record({
      gap: fc.double({ min: 0.05, max: 3, noNaN: true }),
      depth_m: fc.double({ min: 0, max: 4, noNaN: true }),
      velocity_mps: fc.double({ min: -0.5, max: 3, noNaN: true }),
      angle: fc.option(fc.double({ min: 0.3, max: 1, noNaN: true }), { nil: undefined }),
    }),
    { minLength: 2, maxLength: 40 },
  )
  .map((rows) => {
    let station = 0;
    return rows.map((r, i) => {
      if (i > 0) station += r.gap;
      const v: Vertical = { station_m: station, depth_m: i === 1 ? r.depth_m + 0.1 : r.depth_m, velocity_mps: r.velocity_mps };
      if (r.angle !== undefined) v.angleCoefficient = r.angle;
      return v;
    });
  });

function close(a: number, b: number, scale: number): void {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-12 * Math.max(1, scale));
}

describe('midSection properties (fast-check)', () => {
  // exact: Q = Σ v_i·k_i·d_i·w_i is linear in the velocities
  it('Q scales linearly with velocity', () => {
    fc.assert(
      fc.property(sectionArb, fc.double({ min: 0.1, max: 10, noNaN: true }), (section, k) => {
        const base = midSection(section);
        const scaled = midSection(section.map((v) => ({ ...v, velocity_mps: k * v.velocity_mps })));
        const scale = section.reduce((s, v) => s + Math.abs(v.velocity_mps) * v.depth_m, 0) * base.width_m * k;
        close(scaled.discharge_m3s, k * base.discharge_m3s, scale);
        expect(scaled.area_m2).toBe(base.area_m2);
      }),
      { numRuns: 300 },
    );
  });
  // exact: the partial widths do not depend on which bank the stations start from
  it('is invariant to reversing the station order', () => {
    fc.assert(
      fc.property(sectionArb, (section) => {
        const forward = midSection(section);
        const reversed = midSection([...section].reverse());
        const scale = section.reduce((s, v) => s + Math.abs(v.velocity_mps) * v.depth_m, 0) * forward.width_m;
        close(reversed.discharge_m3s, forward.discharge_m3s, scale);
        close(reversed.area_m2, forward.area_m2, forward.area_m2);
        expect(reversed.width_m).toBe(forward.width_m);
        expect(reversed.subsections.map((s) => s.width_m)).toEqual([...forward.subsections].reverse().map((s) => s.width_m));
      }),
      { numRuns: 300 },
    );
  });
  // exact: the partial widths add up to the section width
  it('partial widths add up to the width', () => {
    fc.assert(
      fc.property(sectionArb, (section) => {
        const r = midSection(section);
        close(r.subsections.reduce((s, x) => s + x.width_m, 0), r.width_m, r.width_m);
      }),
      { numRuns: 300 },
    );
  });
});

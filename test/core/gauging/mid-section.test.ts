import { describe, expect, it } from 'vitest';
import { midSection, WADING_LIMIT_M2S, type Vertical } from '../../../core/gauging/index';

function rectangle(stations: number[], depth_m: number, velocity_mps: number): Vertical[] {
  return stations.map((station_m) => ({ station_m, depth_m, velocity_mps }));
}
const evenly = (n: number, width: number) => Array.from({ length: n }, (_, k) => (width * k) / (n - 1));

describe('midSection', () => {
  // exact: a rectangular channel with vertical walls (full depth at both edges) and uniform velocity
  // gives Q = width × depth × velocity, because the partial widths add up to the width
  it('rectangular channel: Q = W·d·v exactly', () => {
    const r = midSection(rectangle(evenly(21, 8), 1.25, 0.5));
    expect(r.width_m).toBe(8);
    expect(r.area_m2).toBe(10);
    expect(r.discharge_m3s).toBe(5);
    expect(r.meanVelocity_mps).toBe(0.5);
    expect(r.warnings).toEqual([]);
    // uneven spacing as well
    const uneven = midSection(rectangle([0, 0.5, 1.5, 2, 3.75, 4], 2, 0.25));
    expect(uneven.discharge_m3s).toBe(2);
    expect(uneven.subsections.map((s) => s.width_m)).toEqual([0.25, 0.75, 0.75, 1.125, 1, 0.125]);
  });
  // exact: q_i = v_i·k_i·d_i·(x_{i+1} − x_{i−1})/2 by hand (Turnipseed & Sauer 2010 formula)
  it('partial widths, areas, discharges and shares', () => {
    const verticals: Vertical[] = [
      { station_m: 0, depth_m: 0, velocity_mps: 0 },
      { station_m: 1, depth_m: 0.5, velocity_mps: 0.4 },
      { station_m: 2, depth_m: 1, velocity_mps: 0.8, angleCoefficient: 0.5 },
      { station_m: 4, depth_m: 0.5, velocity_mps: 0.2 },
      { station_m: 5, depth_m: 0, velocity_mps: 0 },
    ];
    const r = midSection(verticals);
    expect(r.subsections.map((s) => s.width_m)).toEqual([0.5, 1, 1.5, 1.5, 0.5]);
    expect(r.subsections.map((s) => s.area_m2)).toEqual([0, 0.5, 1.5, 0.75, 0]);
    [0, 0.2, 0.6, 0.15, 0].forEach((q, i) => expect(r.subsections[i].discharge_m3s).toBeCloseTo(q, 15));
    expect(r.discharge_m3s).toBeCloseTo(0.95, 15);
    expect(r.area_m2).toBe(2.75);
    expect(r.meanVelocity_mps).toBeCloseTo(0.95 / 2.75, 15);
    expect(r.subsections[2].share).toBeCloseTo(0.6 / 0.95, 15);
    expect(r.subsections.reduce((s, x) => s + x.share, 0)).toBeCloseTo(1, 14);
  });
  // ISO 748 / common practice (from memory): no subsection above 10 % of Q; at least 20 verticals
  it('warns on a large subsection and on few verticals', () => {
    const r = midSection(rectangle(evenly(6, 5), 0.5, 0.3));
    expect(r.warnings).toContainEqual(expect.stringMatching(/station 1 m carries 20\.0 % of the discharge; .* more than 10 %/));
    expect(r.warnings).toContainEqual('Only 6 verticals; at least 20 are needed (25–30 recommended).');
    // 21 equal verticals: interior shares are 5 %, edges 2.5 %, so no warning
    expect(midSection(rectangle(evenly(21, 5), 0.5, 0.3)).warnings).toEqual([]);
  });
  // USGS practice, from memory: do not wade when depth × velocity ≥ 10 ft²/s ≈ 0.93 m²/s
  it('warns at the wading limit', () => {
    const verticals = rectangle(evenly(21, 10), 0.6, 0.5);
    verticals[10] = { station_m: verticals[10].station_m, depth_m: 1.0, velocity_mps: -1.0 };
    const r = midSection(verticals);
    expect(r.warnings).toEqual([expect.stringMatching(/station 5 m depth × velocity is 1\.00 m²\/s, at or above the wading limit 0\.93 m²\/s/)]);
    const below = rectangle(evenly(21, 10), 1.0, 0.92);
    expect(midSection(below).warnings).toEqual([]);
    expect(WADING_LIMIT_M2S).toBeCloseTo(0.9290304, 15);
  });
  // exact: all velocities zero gives Q = 0 with zero shares and a warning, not NaN
  it('zero total discharge', () => {
    const r = midSection(rectangle(evenly(21, 4), 1, 0));
    expect(r.discharge_m3s).toBe(0);
    expect(r.meanVelocity_mps).toBe(0);
    expect(r.subsections.every((s) => s.share === 0)).toBe(true);
    expect(r.warnings).toEqual([expect.stringMatching(/total discharge is 0\.00 m³\/s, not positive/)]);
  });
});

describe('midSection bad input', () => {
  const ok = rectangle(evenly(5, 4), 1, 0.5);
  const cases: [string, readonly Vertical[], RegExp][] = [
    ['one vertical', ok.slice(0, 1), /at least 2 verticals \(the two edges\); got 1/],
    ['NaN depth', [ok[0], { ...ok[1], depth_m: Number.NaN }, ok[2]], /finite depth_m at vertical 1; got NaN/],
    ['negative depth', [ok[0], { ...ok[1], depth_m: -0.2 }, ok[2]], /depth_m ≥ 0 at vertical 1; got -0.2/],
    ['infinite velocity', [ok[0], ok[1], { ...ok[2], velocity_mps: Infinity }], /finite velocity_mps at vertical 2; got Infinity/],
    ['NaN station', [{ ...ok[0], station_m: Number.NaN }, ok[1]], /finite station_m at vertical 0; got NaN/],
    ['unsorted stations', [ok[0], ok[2], ok[1], ok[3]], /strictly ascending or strictly descending.*vertical 2 at 1 m breaks the order after 2 m/],
    ['repeated station', [ok[0], ok[1], ok[1], ok[2]], /vertical 2 at 1 m breaks the order/],
    ['angle coefficient 0', [ok[0], { ...ok[1], angleCoefficient: 0 }, ok[2]], /angleCoefficient in \(0, 1\] at vertical 1; got 0/],
    ['angle coefficient above 1', [ok[0], { ...ok[1], angleCoefficient: 1.2 }, ok[2]], /angleCoefficient in \(0, 1\] at vertical 1; got 1.2/],
    ['no wetted area', rectangle([0, 1, 2], 0, 0.5), /needs some wetted area/],
  ];
  it.each(cases)('%s', (_name, verticals, message) => {
    expect(() => midSection(verticals)).toThrow(RangeError);
    expect(() => midSection(verticals)).toThrow(message);
  });
  it('not a list', () => {
    expect(() => midSection(undefined as unknown as Vertical[])).toThrow(/at least 2 verticals .*got no list/);
  });
});

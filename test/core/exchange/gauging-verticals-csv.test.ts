// The verticals CSV: read back by papaparse (a general-purpose CSV parser, test-only oracle); every
// subsection figure worked by hand with the mid-section rule q_i = v_i·k_i·d_i·(x_{i+1} − x_{i−1})/2,
// edges with the half-width to their neighbour (Turnipseed & Sauer 2010, USGS TM 3-A8; ISO 748); mean
// velocity of 0.2 and 0.8 depth as their average (Buchanan & Somers 1969, USGS TWRI 3-A8); 1 ft = 0.3048 m
// exactly (NIST SP 811).
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { CSV_BOM, gaugingVerticalsToCsv, validateGaugingBody, type GaugingRecord } from '../../../core';

function parse(csv: string): { fields: string[]; rows: Record<string, string>[] } {
  expect(csv.startsWith(CSV_BOM)).toBe(true);
  const r = Papa.parse<Record<string, string>>(csv.slice(1), { header: true, skipEmptyLines: true, delimiter: ',' });
  expect(r.errors).toEqual([]);
  return { fields: r.meta.fields ?? [], rows: r.data };
}

const env = { rev: '0001764547200000-000000-devA', updated_ms: 0 };
// Invented 4-vertical section: edges at 0 and 3 m, two verticals between.
const gauging: GaugingRecord = {
  id: 'c1000000-0000-4000-8000-000000000001', ...env, siteId: 's', time_ms: Date.UTC(2026, 11, 2, 9), meanStage_m: 0.41,
  discharge_m3s: 0.39, method: 'velocity-area', grade: 'good', observer: '', note: '',
  verticals: [
    { station_m: 0, depth_m: 0, velocity_mps: 0, observed: { kind: 'six-tenths', v06_mps: 0 } },
    { station_m: 1, depth_m: 0.5, velocity_mps: 0.4, observed: { kind: 'six-tenths', v06_mps: 0.4 } },
    { station_m: 2, depth_m: 0.9, velocity_mps: 0.5, angleCoefficient: 0.9, observed: { kind: 'two-point', v02_mps: 0.6, v08_mps: 0.4 } },
    { station_m: 3, depth_m: 0, velocity_mps: 0 },
  ],
};

describe('verticals CSV', () => {
  it('one row per vertical with its subsection, worked by hand (metric)', () => {
    const { fields, rows } = parse(gaugingVerticalsToCsv([gauging, { ...gauging, id: 'c1000000-0000-4000-8000-000000000002', verticals: undefined }], { siteCode: 'XY-1', timeZone: 'UTC', units: 'metric' }));
    expect(fields).toEqual([
      'gauging_id', 'site', 'vertical', 'station_m', 'depth_m', 'velocity_0.2_m/s', 'velocity_0.6_m/s', 'velocity_0.8_m/s',
      'mean_velocity_m/s', 'angle_coefficient', 'width_m', 'area_m²', 'discharge_m³/s', 'share_percent',
    ]);
    // The gauging without verticals adds no rows.
    expect(rows).toHaveLength(4);
    expect(rows.map((r) => r.gauging_id)).toEqual(Array(4).fill(gauging.id));
    // Vertical 2: width (2 − 0)/2 = 1 m, area 0.5 m², q = 0.4·0.5 = 0.2 m³/s.
    // Vertical 3: width (3 − 1)/2 = 1 m, area 0.9 m², q = 0.5·0.9·0.9 = 0.405 m³/s. Q = 0.605 m³/s.
    expect(rows[1]).toMatchObject({ vertical: '2', station_m: '1', depth_m: '0.5', 'velocity_0.6_m/s': '0.4', 'velocity_0.2_m/s': '', 'mean_velocity_m/s': '0.4', angle_coefficient: '1', width_m: '1', 'area_m²': '0.5', 'discharge_m³/s': '0.2' });
    expect(rows[2]).toMatchObject({ 'velocity_0.2_m/s': '0.6', 'velocity_0.6_m/s': '', 'velocity_0.8_m/s': '0.4', 'mean_velocity_m/s': '0.5', angle_coefficient: '0.9', 'area_m²': '0.9', 'discharge_m³/s': '0.405' });
    expect(Number(rows[1].share_percent)).toBeCloseTo((100 * 0.2) / 0.605, 2);
    expect(Number(rows[2].share_percent)).toBeCloseTo((100 * 0.405) / 0.605, 2);
    // Edges: half-width 0.5 m, no area; the last has no point velocities typed.
    expect(rows[0]).toMatchObject({ width_m: '0.5', 'area_m²': '0', share_percent: '0' });
    expect(rows[3]['velocity_0.6_m/s']).toBe('');
  });
  it('US units: feet, ft/s, ft² and ft³/s', () => {
    const { rows } = parse(gaugingVerticalsToCsv([gauging], { siteCode: 'XY-1', timeZone: 'UTC', units: 'us' }));
    expect(Number(rows[1].station_ft)).toBeCloseTo(1 / 0.3048, 4);
    expect(Number(rows[1]['area_ft²'])).toBeCloseTo(0.5 / 0.3048 ** 2, 3);
    expect(Number(rows[2]['discharge_ft³/s'])).toBeCloseTo(0.405 / 0.3048 ** 3, 3);
  });
});

describe('point velocities kept with a vertical', () => {
  it('are accepted when their mean is the vertical’s velocity and refused otherwise', () => {
    const { id: _i, rev: _r, updated_ms: _u, ...body } = gauging;
    expect(() => validateGaugingBody(body)).not.toThrow();
    const wrong = { ...body, verticals: [body.verticals![0], { ...body.verticals![2], velocity_mps: 0.45 }] };
    expect(() => validateGaugingBody(wrong)).toThrow(/verticals\[1\]\.observed/);
    const noKind = { ...body, verticals: [{ ...body.verticals![1], observed: { v06_mps: 0.4 } }] };
    expect(() => validateGaugingBody(noKind)).toThrow(/observed\.kind/);
  });
});

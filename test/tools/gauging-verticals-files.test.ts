// `freshet csv` writes each site's gauging verticals table with the writer the phone's Data screen uses
// (core's gaugingVerticalsToCsv, called there on the site's gaugings in time order): the office file is the
// phone's file byte for byte. Read back by papaparse (test-only oracle), the discharges of the verticals add
// up to the gauging's total worked here by hand with the mid-section rule q_i = v_i·k_i·d_i·(x_{i+1} − x_{i−1})/2
// (ISO 748; Turnipseed & Sauer 2010, USGS TM 3-A8) and the shares to 100 % within their printed rounding
// (four significant figures).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_SITE_ID, gaugingVerticalsToCsv, makeBundle, toSyncRecord, type GaugingRecord } from '../../core';
import { demoRecords } from '../../office/cli/commands/demo';
import { run } from '../../office/cli/index';

const END = Date.UTC(2026, 10, 20, 6, 0);
const HOUR_MS = 3_600_000;
const env = { rev: '1790000000000-000000-test', updated_ms: END };

// Invented section 4 m wide, verticals 0.8 m apart, dry edges; vertical 4 read at 0.2 and 0.8 depth with an
// angle coefficient of 0.95. By hand: q2 = 0.30·0.30·0.8 = 0.072, q3 = 0.50·0.50·0.8 = 0.2,
// q4 = 0.42·0.95·0.45·0.8 = 0.14364, q5 = 0.20·0.25·0.8 = 0.04 m³/s; Q = 0.45564 m³/s.
const Q_BY_HAND = 0.45564;
const section: GaugingRecord = {
  id: 'c2000000-0000-4000-8000-000000000001', ...env, siteId: DEMO_SITE_ID, time_ms: END - 2 * HOUR_MS, meanStage_m: 0.52,
  discharge_m3s: Q_BY_HAND, method: 'velocity-area', grade: 'good', observer: '', note: '',
  verticals: [
    { station_m: 0, depth_m: 0, velocity_mps: 0 },
    { station_m: 0.8, depth_m: 0.3, velocity_mps: 0.3, observed: { kind: 'six-tenths', v06_mps: 0.3 } },
    { station_m: 1.6, depth_m: 0.5, velocity_mps: 0.5, observed: { kind: 'six-tenths', v06_mps: 0.5 } },
    { station_m: 2.4, depth_m: 0.45, velocity_mps: 0.42, angleCoefficient: 0.95, observed: { kind: 'two-point', v02_mps: 0.5, v08_mps: 0.34 } },
    { station_m: 3.2, depth_m: 0.25, velocity_mps: 0.2, observed: { kind: 'six-tenths', v06_mps: 0.2 } },
    { station_m: 4, depth_m: 0, velocity_mps: 0 },
  ],
};
// An earlier one of three verticals (Q = 0.25·0.4·1 = 0.1 m³/s), to check the order of the gaugings too.
const earlier: GaugingRecord = {
  ...section, id: 'c2000000-0000-4000-8000-000000000002', time_ms: END - 30 * HOUR_MS, discharge_m3s: 0.1,
  verticals: [{ station_m: 0, depth_m: 0, velocity_mps: 0 }, { station_m: 1, depth_m: 0.4, velocity_mps: 0.25 }, { station_m: 2, depth_m: 0, velocity_mps: 0 }],
};

const dir = mkdtempSync(join(tmpdir(), 'freshet-verticals-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('freshet csv: the gauging verticals table', () => {
  it('is the phone’s verticals file for the same gaugings, and adds up to each gauging’s discharge', async () => {
    const records = [...demoRecords(END, END), toSyncRecord('gauging', section), toSyncRecord('gauging', earlier)];
    writeFileSync(join(dir, 'b.json'), JSON.stringify(makeBundle({ id: 'b2000000-0000-4000-8000-000000000001', device: 'test', created_ms: END, records })));
    let out = '';
    let err = '';
    const code = await run(['csv', 'b.json', '--out', 'tables'], { stdout: (t) => (out += t), stderr: (t) => (err += t), cwd: dir });
    expect([code, err]).toEqual([0, '']);
    expect(out).toMatch(/^Wrote 5 CSV files for 1 site/);
    const office = readFileSync(join(dir, 'tables', 'PB-03_gauging_verticals.csv'), 'utf8');

    // The phone: the site's gaugings entered by verticals, in time order (web/db's by-site-time index),
    // through the same writer with the site's code, zone and units (the demo site: metric, Pacific/Auckland).
    const phone = gaugingVerticalsToCsv([earlier, section], { siteCode: 'PB-03', timeZone: 'Pacific/Auckland', units: 'metric' });
    expect(office).toBe(phone);

    const parsed = Papa.parse<Record<string, string>>(office.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.map((r) => r.gauging_id)).toEqual([...Array(3).fill(earlier.id), ...Array(6).fill(section.id)]);
    for (const [g, total] of [[section, Q_BY_HAND], [earlier, 0.1]] as const) {
      const rows = parsed.data.filter((r) => r.gauging_id === g.id);
      expect(rows.map((r) => r.vertical)).toEqual(g.verticals!.map((_, i) => String(i + 1)));
      expect(rows.every((r) => r.site === 'PB-03')).toBe(true);
      // Six significant figures a discharge: the sum within a unit of the sixth figure per row.
      const q = rows.reduce((s, r) => s + Number(r['discharge_m³/s']), 0);
      expect(Math.abs(q - total)).toBeLessThanOrEqual(rows.length * 5e-7);
      expect(Math.abs(q - g.discharge_m3s)).toBeLessThanOrEqual(rows.length * 5e-7);
      // Shares to four significant figures (below 100 %: two decimals at most off by 0.005 each): 100 % within that.
      const share = rows.reduce((s, r) => s + Number(r.share_percent), 0);
      expect(Math.abs(share - 100)).toBeLessThanOrEqual(rows.length * 0.005);
    }
    // Vertical 4 of the section, by hand: width 0.8 m, area 0.36 m², q 0.14364 m³/s, 31.52 % of Q.
    const v4 = parsed.data.filter((r) => r.gauging_id === section.id)[3];
    expect(v4).toMatchObject({ 'velocity_0.2_m/s': '0.5', 'velocity_0.8_m/s': '0.34', 'mean_velocity_m/s': '0.42', angle_coefficient: '0.95', width_m: '0.8', 'area_m²': '0.36', 'discharge_m³/s': '0.14364' });
    expect(v4.share_percent).toBe('31.52');
  });
});

// The office command's storm CSV: a saved analysis separated again from the bundle's readings. Read back
// with papaparse (test-only oracle); direct runoff is discharge minus baseflow in every row, and its volume
// by the trapezoid rule over the key points (done here by hand) matches core's event summary.
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
  DEMO_SITE_ID, defaultEckhardt, makeBundle, findEventPoints, separateBaseflow, seriesFromReadings, summarizeEvent, toSyncRecord, READING_SOURCE_CODES,
  type AnalysisRecord, type SyncRecord,
} from '../../core';
import { demoRecords } from '../../office/cli/commands/demo';
import { sitesOf } from '../../office/cli/site-data';
import { stormFiles } from '../../office/cli/storm-files';
import { run } from '../../office/cli/index';

const END = Date.UTC(2026, 10, 20, 6, 0);
const DAY_MS = 86_400_000;

describe('storm CSV from a saved analysis', () => {
  const records = demoRecords(END, END);
  const [plain] = sitesOf(records);
  const rows = plain.readings.filter((r) => r.reading.time_ms >= END - 14 * DAY_MS);
  const made = seriesFromReadings({
    time_ms: rows.map((r) => r.reading.time_ms), discharge_m3s: rows.map((r) => r.discharge_m3s ?? NaN),
    source: rows.map((r) => READING_SOURCE_CODES[r.reading.source]), extrapolated: rows.map((r) => (r.extrapolated ? 1 : 0)),
  });
  if (made.kind !== 'ready') throw new Error('the demo window should be rated');
  const found = findEventPoints(made.series, { area_km2: 12.4 });
  const points = { riseStart_ms: Math.round(found.riseStart_ms), peak_ms: Math.round(found.peak_ms), inflection_ms: Math.round(found.inflection_ms), runoffEnd_ms: Math.round(found.runoffEnd_ms) };
  const method = { kind: 'eckhardt' as const, ...defaultEckhardt };
  const summary = summarizeEvent(made.series, separateBaseflow(made.series, method, { points, area_km2: 12.4 }), { area_km2: 12.4, from_ms: points.riseStart_ms, to_ms: points.runoffEnd_ms });
  const analysis: AnalysisRecord = {
    id: 'a0000000-0000-4000-8000-000000000001', rev: '1790000000000-000000-test', updated_ms: END, siteId: DEMO_SITE_ID,
    from_ms: END - 14 * DAY_MS, to_ms: END, method, points, area_km2: 12.4, results: { ...summary } as AnalysisRecord['results'], note: '',
  };
  const withAnalysis: SyncRecord[] = [...records, toSyncRecord('analysis', analysis)];

  it('writes discharge, baseflow and direct runoff per time; the direct volume matches the summary', () => {
    const [site] = sitesOf(withAnalysis);
    const { files, skipped } = stormFiles(site, 'PB-03');
    expect(skipped).toEqual([]);
    expect(files.map((f) => f.name)).toEqual(['PB-03_storm_2026-11-06.csv']); // NZDT date of the window's start
    const parsed = Papa.parse<Record<string, string>>(files[0].text.slice(1), { header: true, skipEmptyLines: true, dynamicTyping: false });
    expect(parsed.errors).toEqual([]);
    const data = parsed.data.map((r) => ({ t: Date.parse(r.time), q: Number(r['discharge_m³/s']), b: Number(r['baseflow_m³/s']), d: Number(r['direct_runoff_m³/s']) }));
    expect(data).toHaveLength(made.series.time_ms.length);
    for (const r of data) {
      expect(r.b).toBeLessThanOrEqual(r.q + 1e-9);
      // Each of the three is printed to 6 significant figures: up to three half-units of the 6th digit apart.
      expect(Math.abs(r.d - (r.q - r.b))).toBeLessThanOrEqual(1.5e-5 * Math.max(1, r.q));
    }
    let volume = 0;
    for (let i = 1; i < data.length; i++) {
      if (data[i - 1].t < points.riseStart_ms || data[i].t > points.runoffEnd_ms) continue;
      volume += ((data[i].d + data[i - 1].d) / 2) * ((data[i].t - data[i - 1].t) / 1000);
    }
    // Six significant figures in the file; key points fall on reading times (found by core on the same series).
    expect(volume / summary.directVolume_m3).toBeCloseTo(1, 3);
  });

  it('says why an analysis could not be written instead of dropping it silently', () => {
    const odd = { ...analysis, method: { kind: 'guesswork' } } as unknown as AnalysisRecord;
    const outside = { ...analysis, id: 'a0000000-0000-4000-8000-000000000002', from_ms: END - 400 * DAY_MS, to_ms: END - 300 * DAY_MS };
    const [site] = sitesOf([...records, toSyncRecord('analysis', odd), toSyncRecord('analysis', outside)]);
    const { files, skipped } = stormFiles(site, 'PB-03');
    expect(files).toEqual([]);
    expect(skipped).toEqual([
      'the storm analysis of PB-03 from 2025-10-16 has no readings in its window in this bundle',
      'the storm analysis of PB-03 from 2026-11-06 uses a separation method this version does not know ("guesswork")',
    ]);
  });

  it('makes freshet csv name the analysis it could not write and exit with status 1, the other files written', async () => {
    const outside = { ...analysis, id: 'a0000000-0000-4000-8000-000000000003', from_ms: END - 400 * DAY_MS, to_ms: END - 300 * DAY_MS };
    const dir = mkdtempSync(join(tmpdir(), 'freshet-storm-files-'));
    try {
      const bundle = makeBundle({ id: 'b0000000-0000-4000-8000-000000000001', device: 'test', created_ms: END, records: [...withAnalysis, toSyncRecord('analysis', outside)] });
      writeFileSync(join(dir, 'b.json'), JSON.stringify(bundle));
      let out = '';
      let err = '';
      const code = await run(['csv', 'b.json', '--out', 'tables'], { stdout: (t) => (out += t), stderr: (t) => (err += t), cwd: dir });
      expect(code).toBe(1);
      expect(err).toContain('not written: the storm analysis of PB-03 from 2025-10-16 has no readings in its window in this bundle');
      expect(err).not.toMatch(/_ms\b|separateBaseflow/);
      expect(out).toMatch(/^Wrote 6 CSV files/);
      expect(readdirSync(join(dir, 'tables')).sort()).toEqual(['PB-03_gauging_verticals.csv', 'PB-03_gaugings.csv', 'PB-03_rating_segments.csv', 'PB-03_rating_tables.csv', 'PB-03_readings.csv', 'PB-03_storm_2026-11-06.csv']);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

// A logger record end to end, phone to office: a site, a rating by hand, a 15-minute logger file of ten
// days (a storm, a slow drift corrected from three check readings) stored as logger days, and a spot
// reading two days after it on the phone (fake IndexedDB); the phone's outbox bundle taken in by the
// office (`freshet office import`, the bundle-file path of sync); then `freshet csv` and `freshet waterml`
// from the office database. Oracles: papaparse reads the CSV back, the OGC WaterML 2.0 schema kit
// validates the documents, and the phone's own export of the same records is the expected CSV, byte for byte.
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, describe, expect, it } from 'vitest';
import { driftCorrections, readingsToCsv, stageExportRows } from '../../core';
import { importLoggerRecord, nextOutgoing, saveRating, saveReading, saveSite, stageRecordIn } from '../../web/db';
import { useFreshDb } from '../support/db';
import { rating, reading, site, T0 } from '../support/records';
import { validateWaterml } from '../support/waterml-kit';
import { freshet } from '../support/office/run-freshet';

useFreshDb();
const dir = mkdtempSync(join(tmpdir(), 'freshet-logger-office-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const Q = 15 * 60_000;
const H = 3_600_000;
const N = 961; // ten days of 15-minute values, both ends included

/** The invented logger file's values: a gamma-shaped storm on a 0.30 m base, read 0–9 mm low by a slow drift. */
function loggerValues() {
  const time_ms = Float64Array.from({ length: N }, (_, i) => T0 + i * Q);
  const true_m = Float64Array.from(time_ms, (t) => {
    const tau = (t - T0) / H - 96;
    return Math.round((0.3 + (tau > 0 ? 0.9 * Math.pow(tau / 10, 3) * Math.exp(3 * (1 - tau / 10)) : 0)) * 1000) / 1000;
  });
  const raw_m = Float64Array.from(true_m, (h, i) => Math.round((h - 0.009 * (i / (N - 1))) * 1000) / 1000);
  const checks = [0, 480, 960].map((i) => ({ time_ms: time_ms[i], staff_m: true_m[i], logger_m: raw_m[i] }));
  return { time_ms, raw_m, correction_m: driftCorrections(checks, time_ms), checks };
}

describe('a logger record from the phone to the office exports', () => {
  it('reaches freshet csv and freshet waterml with every logger value, as the phone exports it', async () => {
    const s = await saveSite(site({ code: 'KC-07', name: 'Kettle Creek at the ford (invented)', timeZone: 'UTC' }));
    await saveRating(rating(s.id, T0 - 30 * 86_400_000));
    const logger = loggerValues();
    const stored = await importLoggerRecord({ siteId: s.id, fileName: 'kc07-logger.csv', ...logger });
    expect(stored.stored).toBe(N);
    await saveReading(reading(s.id, T0 + (N - 1) * Q + 2 * 86_400_000, 0.31));

    // The phone's export of its whole stage record.
    const phone = readingsToCsv(stageExportRows(await stageRecordIn(s.id, -Infinity, Infinity)), { siteCode: 'KC-07', timeZone: 'UTC', units: 'metric' });

    // The phone's outbox bundle, taken in by the office as a file.
    const entry = await nextOutgoing();
    expect(entry).toBeDefined();
    const file = join(dir, 'from-phone.json');
    writeFileSync(file, JSON.stringify(entry!.bundle));
    const data = join(dir, 'office');
    const taken = await freshet(['office', 'import', file, '--data', data]);
    expect(taken.code, taken.err).toBe(0);

    const csvOut = join(dir, 'csv');
    const csv = await freshet(['csv', '--data', data, '--site', 'KC-07', '--out', csvOut]);
    expect(csv.err).toBe('');
    expect(csv.code).toBe(0);
    const office = readFileSync(join(csvOut, 'KC-07_readings.csv'), 'utf8');
    expect(office).toBe(phone);
    const rows = Papa.parse<Record<string, string>>(office.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
    expect(rows.errors).toEqual([]);
    const loggerRows = rows.data.filter((r) => r.source === 'logger');
    expect(loggerRows).toHaveLength(N);
    expect(rows.data.filter((r) => r.source === 'staff')).toHaveLength(1);
    loggerRows.forEach((r, i) => {
      expect(Date.parse(r.time)).toBe(logger.time_ms[i]);
      expect(Number(r.logger_raw_m)).toBe(logger.raw_m[i]);
      // stage = raw + correction, each printed to 0.1 mm
      expect(Math.abs(Number(r.stage_m) - (Number(r.logger_raw_m) + Number(r.correction_m)))).toBeLessThanOrEqual(1.5e-4);
      // Q = 10·(h − 0.2)² (the invented rating), written to three significant figures
      const h = logger.raw_m[i] + logger.correction_m[i];
      expect(r['discharge_m³/s']).toBe(String(Number((10 * (h - 0.2) ** 2).toPrecision(3))));
    });

    const wmlOut = join(dir, 'wml');
    const wml = await freshet(['waterml', '--data', data, '--site', 'KC-07', '--out', wmlOut]);
    expect(wml.code, wml.err).toBe(0);
    const files = readdirSync(wmlOut).map((f) => join(wmlOut, f));
    const v = validateWaterml(files);
    expect(v.output).not.toMatch(/INVALID|ERROR|NOTE/);
    expect(v.status, v.output).toBe(0);
    const doc = readFileSync(files.find((f) => f.endsWith('_timeseries.xml'))!, 'utf8');
    const loggerStage = doc.split('<wml2:observationMember>').find((m) => m.includes('Stage') && m.includes('logger values'))!;
    expect(loggerStage.match(/<wml2:MeasurementTVP>/g)).toHaveLength(N);
  }, 120_000);
});

// Logger records as per-site, per-day records in IndexedDB (fake-indexeddb): one transaction for a whole
// import, duplicates (same site and time) reported and not doubled, all-or-nothing on a stop, the series
// that plots and storm analysis read sees logger days and staff readings alike, and upgrade step 3.
import { describe, expect, it } from 'vitest';
import { openDB } from 'idb';
import { driftCorrections, loggerDayId } from '../../core';
import { importLoggerRecord, importReadings, onRecordsChanged, saveReading, saveSite, seriesWithDischarge, saveRating, StorageError } from '../../web/db/index';
import { DB_NAME, DB_VERSION, type FreshetDB } from '../../web/db/schema';
import { getDb } from '../../web/db/connection';
import { listLoggerDays } from '../../web/db/logger-days';
import { readingSeries } from '../../web/db/series-read';
import { READING_SOURCE_CODES } from '../../core/records/index';
import { upgradeFreshetDb } from '../../web/db/upgrade';
import { closeDbForTests } from '../../web/db/testing';
import { useFreshDb } from '../support/db';
import { loggerSeries, QUARTER_HOUR_MS, rating, reading, site, T0 } from '../support/records';

useFreshDb();
const DAY = 86_400_000;

/** n logger values every 15 minutes from start_ms: raw 0.5 + i/1000 m, no correction. */
function record(siteId: string, start_ms: number, n: number, fileName = 'kc01.csv') {
  const time_ms = Float64Array.from({ length: n }, (_, i) => start_ms + i * QUARTER_HOUR_MS);
  const raw_m = Float64Array.from({ length: n }, (_, i) => 0.5 + i / 1000);
  return { siteId, fileName, time_ms, raw_m, correction_m: new Float64Array(n), checks: [] };
}

describe('importing a logger record', () => {
  it('writes one record per UTC day with its own rev, raw values and corrections kept', async () => {
    const s = await saveSite(site());
    const checks = [{ time_ms: T0, staff_m: 0.52, logger_m: 0.5 }, { time_ms: T0 + 2 * DAY, staff_m: 0.6, logger_m: 0.6 }];
    const input = record(s.id, T0, 3 * 96);
    const correction_m = driftCorrections(checks, input.time_ms);
    const progress: number[] = [];
    const result = await importLoggerRecord({ ...input, correction_m, checks }, { batchDays: 2, onProgress: (p) => progress.push(p.written) });
    expect(result).toMatchObject({ stored: 288, days: 3, duplicates: [] });
    expect(progress).toEqual([2, 3]);
    const days = await listLoggerDays(s.id, -Infinity, Infinity);
    expect(days.map((d) => d.day)).toEqual([T0 / DAY, T0 / DAY + 1, T0 / DAY + 2]);
    expect(days.every((d) => d.rev === result.rev && d.id === loggerDayId(s.id, d.day))).toBe(true);
    expect(days[0].offset_ms.length).toBe(96);
    expect(days[0].raw_m[0]).toBe(0.5);
    // At T0 the correction is the first check's: 0.52 − 0.5 = 0.02 m; a day later, half way to 0: 0.01 m.
    expect(days[0].correction_m[0]).toBeCloseTo(0.02, 12);
    expect(days[1].correction_m[0]).toBeCloseTo(0.01, 12);
    expect(days[0].checks).toEqual(checks);
    // The series (what plots and storm analysis read) holds the corrected stages, as logger source.
    const series = await readingSeries(s.id, -Infinity, Infinity);
    expect(series.time_ms.length).toBe(288);
    expect(series.stage_m[0]).toBeCloseTo(0.52, 12);
    expect(series.stage_m[96]).toBeCloseTo(0.5 + 96 / 1000 + 0.01, 12);
    expect(series.source.every((c) => c === READING_SOURCE_CODES.logger)).toBe(true);
  });

  it('reports the same file imported twice as duplicates and stores nothing more', async () => {
    const s = await saveSite(site());
    const first = await importLoggerRecord(record(s.id, T0, 200));
    const second = await importLoggerRecord(record(s.id, T0, 200));
    expect(second.stored).toBe(0);
    expect(second.days).toBe(0);
    expect(second.duplicates).toHaveLength(200);
    expect(second.duplicates[0]).toEqual({ time_ms: T0, existingId: loggerDayId(s.id, T0 / DAY), existingKind: 'logger-day' });
    const days = await listLoggerDays(s.id, -Infinity, Infinity);
    expect(days.reduce((n, d) => n + d.offset_ms.length, 0)).toBe(200);
    expect(days.every((d) => d.rev === first.rev)).toBe(true);
  });

  it('adds an overlapping file\'s new times only, in the same day records', async () => {
    const s = await saveSite(site());
    await importLoggerRecord(record(s.id, T0, 100));
    const r = await importLoggerRecord(record(s.id, T0 + 50 * QUARTER_HOUR_MS, 100, 'next.csv'));
    expect(r.stored).toBe(50);
    expect(r.duplicates).toHaveLength(50);
    expect(r.duplicates[0].time_ms).toBe(T0 + 50 * QUARTER_HOUR_MS);
    const series = await readingSeries(s.id, -Infinity, Infinity);
    expect(series.time_ms.length).toBe(150);
    expect(Array.from(series.time_ms.slice(98, 102))).toEqual([98, 99, 100, 101].map((i) => T0 + i * QUARTER_HOUR_MS));
  });

  it('does not double a time already stored as a single logger reading', async () => {
    const s = await saveSite(site());
    await importReadings(loggerSeries(s.id, T0, 4));
    const r = await importLoggerRecord(record(s.id, T0 + 2 * QUARTER_HOUR_MS, 4));
    expect(r.stored).toBe(2);
    expect(r.duplicates.map((d) => [d.time_ms, d.existingKind])).toEqual([[T0 + 2 * QUARTER_HOUR_MS, 'reading'], [T0 + 3 * QUARTER_HOUR_MS, 'reading']]);
    const series = await readingSeries(s.id, -Infinity, Infinity);
    expect(Array.from(series.time_ms)).toEqual([0, 1, 2, 3, 4, 5].map((i) => T0 + i * QUARTER_HOUR_MS));
  });

  it('shows staff readings and logger values in one series, in time order, with discharges', async () => {
    const s = await saveSite(site());
    await importLoggerRecord(record(s.id, T0, 8));
    await saveReading(reading(s.id, T0 + QUARTER_HOUR_MS, 0.55, { loggerCheck: { logger_m: 0.501 } }));
    await saveReading(reading(s.id, T0 + 5 * QUARTER_HOUR_MS + 60_000, 0.56));
    await saveRating(rating(s.id, 0));
    const w = await seriesWithDischarge(s.id, T0, T0 + 7 * QUARTER_HOUR_MS);
    const { staff, logger } = READING_SOURCE_CODES;
    expect(Array.from(w.source)).toEqual([logger, staff, logger, logger, logger, logger, logger, staff, logger, logger]);
    expect(w.time_ms[1]).toBe(T0 + QUARTER_HOUR_MS); // the staff check sorts before the logger value at the same time
    // Q = 10 (h − 0.2)² for the logger's 0.5 m at T0: 10 × 0.3² = 0.9 m³/s.
    expect(w.discharge_m3s[0]).toBeCloseTo(0.9, 12);
  });

  it('writes nothing when stopped, and tells the screens after a write', async () => {
    const s = await saveSite(site());
    const ac = new AbortController();
    const err = await importLoggerRecord(record(s.id, T0, 960), { batchDays: 2, onProgress: () => ac.abort(), signal: ac.signal }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(StorageError);
    expect((err as StorageError).message).toBe('The import was stopped and nothing was written.');
    expect(await listLoggerDays(s.id, -Infinity, Infinity)).toEqual([]);
    const kinds: string[][] = [];
    const stop = onRecordsChanged((c) => kinds.push(c.kinds));
    await importLoggerRecord(record(s.id, T0, 10));
    stop();
    expect(kinds.flat().sort()).toEqual(['logger-day', 'reading']);
  });

  it('refuses a bad value before writing anything, naming the day and field', async () => {
    const s = await saveSite(site());
    const bad = record(s.id, T0, 200);
    bad.raw_m[150] = Number.NaN;
    await expect(importLoggerRecord(bad)).rejects.toThrow(/raw_m\[54\]/);
    expect(await listLoggerDays(s.id, -Infinity, Infinity)).toEqual([]);
  });
});

describe('upgrade step 3', () => {
  it('adds the logger day store to a version 1 database, keeping its records', async () => {
    await closeDbForTests();
    const old = await openDB<FreshetDB>(DB_NAME, 1, { upgrade: (db, oldVersion, _n, tx) => upgradeFreshetDb(db, oldVersion, tx, 1) });
    const s = { ...site(), id: '00000000-0000-4000-8000-000000000001', rev: '1767225600000-000001-dev', updated_ms: 1_767_225_600_000 };
    await old.put('sites', s);
    expect(old.objectStoreNames.contains('loggerDays')).toBe(false);
    old.close();
    const db = await getDb();
    expect(db.version).toBe(DB_VERSION);
    expect(DB_VERSION).toBeGreaterThanOrEqual(3);
    expect(await db.getAll('sites')).toEqual([s]);
    expect(await db.getAll('loggerDays')).toEqual([]);
    const names = Array.from(db.transaction('loggerDays').store.indexNames).sort();
    expect(names).toEqual(['by-rev', 'by-site-day']);
    const r = await importLoggerRecord(record(s.id, T0, 3));
    expect(r.stored).toBe(3);
  });
});

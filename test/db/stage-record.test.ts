// A site's stage record read from IndexedDB (fake-indexeddb): the whole-record read the list and the
// exports use and the compact series the plots and storms use give the same join value for value, and the
// latest time of the record counts logger values. Invented values; the join itself is checked in
// test/core/stage-record.test.ts (exact cases and fast-check against its plain definition).
import { describe, expect, it } from 'vitest';
import { importLoggerRecord, latestStageTime, saveRating, saveReading, saveSite, seriesWithDischarge, stageRecordIn } from '../../web/db';
import { useFreshDb } from '../support/db';
import { rating, reading, site, T0, QUARTER_HOUR_MS as Q } from '../support/records';

useFreshDb();

describe('the stage record in storage', () => {
  it('reads the same join as whole records and as the compact series, and its latest time counts logger values', async () => {
    const s = await saveSite(site());
    await saveRating(rating(s.id, T0 - 86_400_000));
    const n = 200;
    const time_ms = Float64Array.from({ length: n }, (_, i) => T0 + i * Q);
    await saveReading(reading(s.id, T0 + 10 * Q, 0.61));
    expect(await latestStageTime(s.id)).toBe(T0 + 10 * Q);
    await importLoggerRecord({ siteId: s.id, fileName: 'kc.csv', checks: [], time_ms, raw_m: Float64Array.from(time_ms, (_, i) => 0.5 + i / 1000), correction_m: new Float64Array(n).fill(0.01) });
    expect(await latestStageTime(s.id)).toBe(T0 + (n - 1) * Q);
    await saveReading(reading(s.id, T0 + (n + 100) * Q, 0.7));
    expect(await latestStageTime(s.id)).toBe(T0 + (n + 100) * Q);
    const records = await stageRecordIn(s.id, -Infinity, Infinity);
    const series = await seriesWithDischarge(s.id, -Infinity, Infinity);
    expect(records.time_ms.length).toBe(n + 2);
    expect(Array.from(records.time_ms)).toEqual(Array.from(series.time_ms));
    expect(Array.from(records.stage_m)).toEqual(Array.from(series.stage_m));
    expect(Array.from(records.discharge_m3s)).toEqual(Array.from(series.discharge_m3s));
    expect(Array.from(records.source)).toEqual(Array.from(series.source));
    expect(records.raw_m[0]).toBe(0.5);
    expect(records.correction_m[0]).toBe(0.01);
  });
});

// Bulk import of logger readings: one transaction, all or nothing, progress per batch, duplicates
// reported and not doubled.
import { describe, expect, it, vi } from 'vitest';
import { importReadings, listReadings, saveReading, saveSite, StorageError } from '../../web/db/index';
import { useFreshDb } from '../support/db';
import { loggerSeries, QUARTER_HOUR_MS, reading, site, T0 } from '../support/records';

useFreshDb();

describe('importReadings', () => {
  // 30,000 here (fake-indexeddb is slow); the 100,000-reading import runs in Chromium (test/browser/db-storage).
  it('writes many readings in one call with a progress event after each batch', async () => {
    const s = await saveSite(site());
    const series = loggerSeries(s.id, T0, 30_000);
    const progress: number[] = [];
    const result = await importReadings(series, { batchSize: 4_000, onProgress: (p) => progress.push(p.written) });
    expect(result.imported).toBe(30_000);
    expect(result.duplicates).toEqual([]);
    // exact: seven full batches of 4,000 and a last one of 2,000.
    expect(progress).toEqual([4_000, 8_000, 12_000, 16_000, 20_000, 24_000, 28_000, 30_000]);
    const stored = await listReadings(s.id, T0, T0 + 29_999 * QUARTER_HOUR_MS);
    expect(stored.length).toBe(30_000);
    expect(stored[12_345].stage_m).toBe(series[12_345].stage_m);
    expect(new Set(stored.map((r) => r.id)).size).toBe(30_000);
  }, 60_000);

  it('reports readings already stored or repeated in the file, and does not double them', async () => {
    const s = await saveSite(site());
    const logged = loggerSeries(s.id, T0, 10);
    const first = await importReadings(logged.slice(0, 6));
    // A staff check at a logger time is not a duplicate: different source (see DOMAIN.md §1, logger checks).
    await saveReading(reading(s.id, T0 + 2 * QUARTER_HOUR_MS, 0.52));
    const again = await importReadings([...logged, logged[8]]);
    expect(again.imported).toBe(4);
    // exact: inputs 0–5 were imported before; input 10 repeats input 8 of the same file.
    expect(again.duplicates.map((d) => [d.index, d.existingId !== undefined, d.firstIndex])).toEqual([
      [0, true, undefined], [1, true, undefined], [2, true, undefined], [3, true, undefined], [4, true, undefined],
      [5, true, undefined], [10, false, 8],
    ]);
    expect(again.duplicates[0].existingId).toBeDefined();
    expect(first.imported).toBe(6);
    expect((await listReadings(s.id, -Infinity, Infinity)).length).toBe(11);
  });

  it('writes nothing when stopped in the middle', async () => {
    const s = await saveSite(site());
    const stop = new AbortController();
    const seen: number[] = [];
    const run = importReadings(loggerSeries(s.id, T0, 20_000), {
      batchSize: 2_000,
      signal: stop.signal,
      onProgress: (p) => {
        seen.push(p.written);
        if (p.written >= 6_000) stop.abort();
      },
    });
    await expect(run).rejects.toMatchObject({ name: 'StorageError', reason: 'aborted' });
    expect(seen.at(-1)).toBe(6_000);
    // W3C Indexed Database API 3.0, "abort a transaction": every change the transaction made is reverted.
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
  });

  it('writes nothing when the storage fills up part-way, and says so in words', async () => {
    const s = await saveSite(site());
    const put = IDBObjectStore.prototype.put;
    let calls = 0;
    const spy = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(function (this: IDBObjectStore, ...args) {
      if (++calls === 7_000) throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
      return put.apply(this, args as Parameters<typeof put>);
    });
    try {
      const err = await importReadings(loggerSeries(s.id, T0, 10_000), { batchSize: 1_000 }).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(StorageError);
      expect(err).toMatchObject({ reason: 'quota' });
      expect((err as StorageError).message).toMatch(/no room left/);
    } finally {
      spy.mockRestore();
    }
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
  });

  it('refuses the whole file when one reading is invalid, naming it', async () => {
    const s = await saveSite(site());
    const series = loggerSeries(s.id, T0, 100);
    series[42] = { ...series[42], stage_m: Number.NaN };
    await expect(importReadings(series)).rejects.toMatchObject({ name: 'RecordValidationError', field: 'readings[42].stage_m' });
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
  });
});

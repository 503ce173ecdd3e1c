// The compact series kept beside the readings: after every kind of write it must hold exactly the
// non-deleted readings that listReadings gives (the oracle: the readings store through its own index),
// and seriesWithDischarge must agree row for row with readingsWithDischarge.
import { describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import { nextRev, READING_SOURCES, type ReadingBody, type ReadingRecord, type ReadingSource } from '../../core/records/index';
import { deleteRating, deleteReading, importReadings, listReadings, readingsWithDischarge, restoreReading, saveRating, saveReading, saveSite, seriesWithDischarge, StorageError } from '../../web/db/index';
import { getDb } from '../../web/db/connection';
import { READING_SOURCE_CODES, readingSourceOfCode } from '../../core/records/index';
import { readingSeries } from '../../web/db/series-read';
import { putReadingsInTx, withReadingsWrite } from '../../web/db/readings-write';
import { resetDbForTests, setClockForTests } from '../../web/db/testing';
import { useFreshDb } from '../support/db';
import { loggerSeries, QUARTER_HOUR_MS, rating, reading, site, T0 } from '../support/records';

const { clock } = useFreshDb();
const HOUR = 3_600_000;
const DAY = 86_400_000;

/** What the series must hold: the readings store's own answer, as arrays. */
async function expectSeriesMatchesReadings(siteId: string, from_ms = -Infinity, to_ms = Infinity): Promise<ReadingRecord[]> {
  const records = await listReadings(siteId, from_ms, to_ms);
  const series = await readingSeries(siteId, from_ms, to_ms);
  expect(Array.from(series.time_ms)).toEqual(records.map((r) => r.time_ms));
  expect(Array.from(series.stage_m)).toEqual(records.map((r) => r.stage_m));
  expect(Array.from(series.source, readingSourceOfCode)).toEqual(records.map((r) => r.source));
  return records;
}

async function seriesChunks() {
  return (await getDb()).getAll('series');
}

describe('reading source codes', () => {
  it('gives every source its own one-byte code and reads it back', () => {
    // exact: four sources (core/records ReadingSource), codes fixed 0–3 because they are stored.
    expect(READING_SOURCES.map((s) => READING_SOURCE_CODES[s])).toEqual([0, 1, 2, 3]);
    expect(READING_SOURCES.map((s) => readingSourceOfCode(READING_SOURCE_CODES[s]))).toEqual(READING_SOURCES);
    expect(() => readingSourceOfCode(4)).toThrow(RangeError);
    expect(() => readingSourceOfCode(4)).toThrow('readingSourceOfCode needs a code from 0 to 3; got 4');
  });
});

describe('the series follows every write to readings', () => {
  it('holds new readings saved out of order, in time order, with ties at one time in id order', async () => {
    const s = await saveSite(site());
    for (const h of [5, 1, 3, 2]) await saveReading(reading(s.id, T0 + h * HOUR, 0.5 + h / 100));
    // A staff check and a logger reading at the same minute: both kept, ordered as the index orders them.
    await saveReading(reading(s.id, T0 + 3 * HOUR, 0.531, { source: 'logger' }));
    const records = await expectSeriesMatchesReadings(s.id);
    // exact: hours 1, 2, 3, 3, 5.
    expect(records.map((r) => (r.time_ms - T0) / HOUR)).toEqual([1, 2, 3, 3, 5]);
    // exact: one chunk, the UTC day of T0.
    expect((await seriesChunks()).map((c) => c.day)).toEqual([T0 / DAY]);
  });

  it('follows an edit of stage and source, and ignores an edit of the note only', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0 + HOUR, 0.61));
    await saveReading(reading(s.id, T0 + 2 * HOUR, 0.62));
    await saveReading({ ...r, stage_m: 0.66, source: 'wire-weight' });
    let series = await readingSeries(s.id, -Infinity, Infinity);
    expect(Array.from(series.stage_m)).toEqual([0.66, 0.62]);
    expect(Array.from(series.source)).toEqual([READING_SOURCE_CODES['wire-weight'], READING_SOURCE_CODES.staff]);
    await saveReading({ ...r, stage_m: 0.66, source: 'wire-weight', note: 'weed cleared from the control' });
    series = await readingSeries(s.id, -Infinity, Infinity);
    expect(Array.from(series.stage_m)).toEqual([0.66, 0.62]);
    await expectSeriesMatchesReadings(s.id);
  });

  it('moves an edited reading across a day boundary (and to another site), leaving no trace in the old chunk', async () => {
    const a = await saveSite(site());
    const b = await saveSite(site({ code: 'KC-02', name: 'Kettle Creek at Upper Road' }));
    const late = await saveReading(reading(a.id, T0 + DAY - 10 * 60_000, 0.7)); // 23:50 UTC on day 0
    await saveReading(reading(a.id, T0 + 12 * HOUR, 0.69));
    await saveReading(reading(a.id, T0 + DAY + HOUR, 0.72));
    const moved = await saveReading({ ...late, time_ms: T0 + DAY + 10 * 60_000 }); // 00:10 on day 1
    expect((await expectSeriesMatchesReadings(a.id)).map((r) => r.id)[1]).toBe(moved.id);
    const byDay = new Map((await seriesChunks()).map((c) => [c.day, c.id]));
    // exact: day 0 keeps only the noon reading; day 1 holds 00:10 then 01:00.
    expect(byDay.get(T0 / DAY)).toHaveLength(1);
    expect(byDay.get(T0 / DAY + 1)?.[0]).toBe(moved.id);
    // Back across the boundary; a form may not move it to another site, a merged record from another
    // device may: each chunk loses what left it.
    const back = await saveReading({ ...moved, time_ms: T0 + DAY - 1 });
    await expectSeriesMatchesReadings(a.id);
    await expect(saveReading({ ...back, siteId: b.id })).rejects.toMatchObject({ name: 'StorageError', reason: 'moved' });
    expect((await expectSeriesMatchesReadings(a.id)).length).toBe(3);
    const merged = { ...back, siteId: b.id, rev: nextRev(back.rev, T0 + 2 * DAY, 'other-device') };
    await withReadingsWrite([], (tx) => putReadingsInTx(tx, [merged]));
    expect((await expectSeriesMatchesReadings(a.id)).length).toBe(2);
    expect((await expectSeriesMatchesReadings(b.id)).map((r) => r.id)).toEqual([moved.id]);
  });

  it('drops a deleted reading, removes an emptied chunk, and takes a restored reading back', async () => {
    const s = await saveSite(site());
    const keep = await saveReading(reading(s.id, T0, 0.5));
    const r = await saveReading(reading(s.id, T0 + DAY + HOUR, 0.55));
    clock.now += 1000;
    await deleteReading(r.id);
    await expectSeriesMatchesReadings(s.id);
    expect((await seriesChunks()).map((c) => c.id)).toEqual([[keep.id]]);
    await restoreReading(r.id);
    expect((await expectSeriesMatchesReadings(s.id)).map((x) => x.id)).toEqual([keep.id, r.id]);
    // Saving a tombstone's fields again brings it back as well.
    await deleteReading(r.id);
    await saveReading({ ...r, stage_m: 0.56 });
    expect((await expectSeriesMatchesReadings(s.id)).map((x) => x.stage_m)).toEqual([0.5, 0.56]);
  });

  it('merges an import into the stored days, skipping duplicates and keeping manual readings', async () => {
    const s = await saveSite(site());
    const logged = loggerSeries(s.id, T0 + 20 * HOUR, 300); // 20:00 on day 0 to past day 3
    await importReadings(logged.slice(0, 100));
    await saveReading(reading(s.id, T0 + 22 * HOUR, 0.51)); // a staff check at a logger time
    await saveReading(reading(s.id, T0 + 20 * HOUR - 1, 0.49)); // just before the first logger reading
    const again = await importReadings([...logged.slice(50, 300).reverse(), logged[120]]);
    // exact: inputs 0–49 (the reversed file's last 50) were stored before; the last input repeats one.
    expect(again.imported).toBe(200);
    expect(again.duplicates.length).toBe(51);
    const records = await expectSeriesMatchesReadings(s.id);
    expect(records.length).toBe(302);
    // exact: 300 quarter hours from 20:00 on day 0 end at 22:45 on day 3, so days 0–3 have chunks.
    expect((await seriesChunks()).map((c) => c.day)).toEqual([0, 1, 2, 3].map((d) => T0 / DAY + d));
  });

  it('holds every reading of a long import in one chunk per day', async () => {
    const s = await saveSite(site());
    await importReadings(loggerSeries(s.id, T0, 96 * 40), { batchSize: 1000 });
    const records = await expectSeriesMatchesReadings(s.id);
    expect(records.length).toBe(3840);
    const chunks = await seriesChunks();
    // exact: 40 whole UTC days of 96 quarter hours.
    expect(chunks.length).toBe(40);
    expect(chunks.every((c) => c.time_ms.length === 96 && c.id.length === 96)).toBe(true);
  });
});

describe('a failed write leaves readings and series as they were', () => {
  it('writes nothing to either store when an import is stopped part-way', async () => {
    const s = await saveSite(site());
    await saveReading(reading(s.id, T0 + HOUR + 1, 0.4));
    const before = await seriesChunks();
    const stop = new AbortController();
    const run = importReadings(loggerSeries(s.id, T0, 5_000), {
      batchSize: 1_000, signal: stop.signal, onProgress: (p) => p.written >= 2_000 && stop.abort(),
    });
    await expect(run).rejects.toMatchObject({ name: 'StorageError', reason: 'aborted' });
    // W3C Indexed Database API 3.0, "abort a transaction": every change the transaction made is reverted.
    expect((await listReadings(s.id, -Infinity, Infinity)).length).toBe(1);
    expect(await seriesChunks()).toEqual(before);
    await expectSeriesMatchesReadings(s.id);
  });

  it('writes nothing to either store when the series put fails in an edit across days', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0 + DAY - 1, 0.7));
    const before = await seriesChunks();
    const put = IDBObjectStore.prototype.put;
    const spy = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(function (this: IDBObjectStore, ...args) {
      if (this.name === 'series') throw new DOMException('Quota exceeded', 'QuotaExceededError');
      return put.apply(this, args as Parameters<typeof put>);
    });
    const err = await saveReading({ ...r, time_ms: T0 + DAY }).catch((e: unknown) => e);
    spy.mockRestore();
    expect(err).toBeInstanceOf(StorageError);
    expect((await listReadings(s.id, -Infinity, Infinity)).map((x) => x.time_ms)).toEqual([T0 + DAY - 1]);
    expect(await seriesChunks()).toEqual(before);
  });

  it('writes nothing to either store when the readings put fails in an import', async () => {
    const s = await saveSite(site());
    const put = IDBObjectStore.prototype.put;
    let calls = 0;
    const spy = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(function (this: IDBObjectStore, ...args) {
      if (this.name === 'readings' && ++calls === 700) throw new DOMException('Quota exceeded', 'QuotaExceededError');
      return put.apply(this, args as Parameters<typeof put>);
    });
    const err = await importReadings(loggerSeries(s.id, T0, 1_000), { batchSize: 100 }).catch((e: unknown) => e);
    spy.mockRestore();
    expect(err).toMatchObject({ name: 'StorageError', reason: 'quota' });
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
    expect(await seriesChunks()).toEqual([]);
  });
});

describe('readingSeries windows', () => {
  it('includes readings exactly at both edges and nothing outside, across day boundaries', async () => {
    const s = await saveSite(site());
    await importReadings(loggerSeries(s.id, T0 - 8 * QUARTER_HOUR_MS, 200));
    const cases: [string, number, number, number][] = [
      // [what, from, to, expected count] — exact: quarter-hour grid starting 02:00 before T0.
      ['both edges on readings', T0, T0 + 4 * QUARTER_HOUR_MS, 5],
      ['edges 1 ms inside', T0 + 1, T0 + 4 * QUARTER_HOUR_MS - 1, 3],
      ['one instant', T0 + DAY, T0 + DAY, 1],
      ['between readings', T0 + 1, T0 + QUARTER_HOUR_MS - 1, 0],
      ['a whole day and its closing midnight', T0, T0 + DAY, 97],
      ['before any reading', T0 - 10 * DAY, T0 - DAY, 0],
      ['unbounded', -Infinity, Infinity, 200],
    ];
    for (const [what, from, to, count] of cases) {
      const records = await expectSeriesMatchesReadings(s.id, from, to);
      expect(records.length, what).toBe(count);
    }
  });

  it('refuses a window that ends before it starts', async () => {
    await expect(readingSeries('x', 10, 5)).rejects.toThrow('readingSeries needs a window with from_ms ≤ to_ms (UTC ms); got 10 to 5');
    await expect(seriesWithDischarge('x', Number.NaN, 5)).rejects.toThrow(RangeError);
  });
});

describe('seriesWithDischarge', () => {
  it('matches readingsWithDischarge row for row through two ratings, shifts, a gap and extrapolation', async () => {
    const s = await saveSite(site());
    const first = await saveRating(rating(s.id, T0 + 6 * HOUR));
    const second = await saveRating(rating(s.id, T0 + 2 * DAY, {
      segments: [{ fromStage_m: 0.15, coefficient: 7.5, offset_m: 0.15, exponent: 1.8 }],
      shifts: [
        { time_ms: T0 + 2 * DAY, toNext: 'prorate', curve: { points: [{ stage_m: 0.3, shift_m: 0.03 }, { stage_m: 0.9, shift_m: 0 }] } },
        { time_ms: T0 + 3 * DAY, toNext: 'hold', curve: { points: [{ stage_m: 0.3, shift_m: -0.02 }] } },
      ],
    }));
    const deleted = await saveRating(rating(s.id, T0 + 3 * DAY + HOUR, { segments: [{ fromStage_m: 0, coefficient: 99, offset_m: 0, exponent: 1 }] }));
    await deleteRating(deleted.id);
    const logged = loggerSeries(s.id, T0, 4 * 96).map((r, i) => (i % 37 === 0 ? { ...r, stage_m: 1.7 } : r));
    await importReadings(logged);
    await saveReading(reading(s.id, T0 + 2 * DAY, 0.44)); // a staff check at a logger time
    const from = T0 + HOUR;
    const to = T0 + 3 * DAY + 6 * HOUR;
    const rows = await readingsWithDischarge(s.id, from, to);
    const q = await seriesWithDischarge(s.id, from, to);
    expect(q.time_ms.length).toBe(rows.length);
    rows.forEach((row, i) => {
      expect(q.time_ms[i]).toBe(row.reading.time_ms);
      expect(q.stage_m[i]).toBe(row.reading.stage_m);
      expect(readingSourceOfCode(q.source[i])).toBe(row.reading.source);
      if (row.ratingId === undefined) expect(q.discharge_m3s[i]).toBeNaN();
      else expect(q.discharge_m3s[i]).toBe(row.discharge_m3s);
      expect(q.shift_m[i]).toBe(row.shift_m);
      expect(q.extrapolated[i] === 1).toBe(row.extrapolated);
      expect(q.ratingIndex[i] < 0 ? undefined : q.ratingIds[q.ratingIndex[i]]).toBe(row.ratingId);
    });
    expect(q.ratingIds).toEqual([first.id, second.id]);
    // exact: before 06:00 no rating is in force (20 quarter hours from 01:00 to 05:45); at 06:00 the first
    // rating gives Q = 10·(h − 0.2)² (power-law rating, ISO 18320 form).
    expect(Array.from(q.discharge_m3s.subarray(0, 20)).every(Number.isNaN)).toBe(true);
    expect(q.discharge_m3s[20]).toBeCloseTo(10 * (q.stage_m[20] - 0.2) ** 2, 12);
    expect(q.extrapolated.reduce((a, b) => a + b, 0)).toBeGreaterThan(0);
    expect(q.shift_m.some((x) => x !== 0)).toBe(true);
  });

  it('gives empty arrays for a window without readings', async () => {
    const s = await saveSite(site());
    const q = await seriesWithDischarge(s.id, T0, T0 + DAY);
    expect([q.time_ms.length, q.discharge_m3s.length, q.ratingIds.length]).toEqual([0, 0, 0]);
  });
});

describe('any sequence of writes', () => {
  type Op =
    | { kind: 'save'; minute: number; stage_m: number; source: ReadingSource }
    | { kind: 'edit'; pick: number; minute: number; stage_m: number }
    | { kind: 'delete'; pick: number }
    | { kind: 'restore'; pick: number }
    | { kind: 'import'; minute: number; count: number; step: number };
  // Minutes over three UTC days, so edits cross day boundaries often.
  const minute = fc.integer({ min: 0, max: 3 * 1440 - 1 });
  const stage = fc.integer({ min: 0, max: 2000 }).map((x) => x / 1000);
  const op: fc.Arbitrary<Op> = fc.oneof(
    fc.record({ kind: fc.constant('save' as const), minute, stage_m: stage, source: fc.constantFrom(...READING_SOURCES) }),
    fc.record({ kind: fc.constant('edit' as const), pick: fc.nat(), minute, stage_m: stage }),
    fc.record({ kind: fc.constant('delete' as const), pick: fc.nat() }),
    fc.record({ kind: fc.constant('restore' as const), pick: fc.nat() }),
    fc.record({ kind: fc.constant('import' as const), minute, count: fc.integer({ min: 1, max: 40 }), step: fc.constantFrom(15, 60, 400) }),
  );

  it('leaves the series equal to the readings store', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 12 }), async (ops) => {
        await resetDbForTests();
        let now = T0 + 400 * DAY;
        setClockForTests(() => (now += 1000));
        const s = await saveSite(site());
        const ids: string[] = [];
        const pick = (n: number) => ids[n % ids.length];
        for (const o of ops) {
          if (o.kind === 'save') ids.push((await saveReading(reading(s.id, T0 + o.minute * 60_000, o.stage_m, { source: o.source }))).id);
          else if (o.kind === 'import') {
            const body: ReadingBody[] = loggerSeries(s.id, T0 + o.minute * 60_000, o.count).map((r, i) => ({ ...r, time_ms: T0 + (o.minute + i * o.step) * 60_000 }));
            await importReadings(body);
            ids.push(...(await listReadings(s.id, -Infinity, Infinity)).map((r) => r.id).filter((id) => !ids.includes(id)));
          } else if (ids.length > 0) {
            const id = pick(o.pick);
            const old = (await (await getDb()).get('readings', id))!;
            if (o.kind === 'edit') await saveReading({ ...old, time_ms: T0 + o.minute * 60_000, stage_m: o.stage_m });
            else if (o.kind === 'delete') await deleteReading(id);
            else await restoreReading(id);
          }
        }
        await expectSeriesMatchesReadings(s.id);
        await expectSeriesMatchesReadings(s.id, T0 + DAY, T0 + 2 * DAY);
      }),
      { numRuns: 25 },
    );
  }, 120_000);
});

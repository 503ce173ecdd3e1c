// Failure modes: quota exceeded, aborted transaction, a newer version in another tab, a connection the
// browser closed, and the upgrade ladder (a database written by each earlier version opens intact).
import { describe, expect, it, vi } from 'vitest';
import { openDB } from 'idb';
import type { SiteRecord } from '../../core/records/index';
import { getSite, listReadings, saveReading, saveSite, StorageError } from '../../web/db/index';
import { DB_NAME, DB_VERSION, type FreshetDB, type SeriesChunk } from '../../web/db/schema';
import { getDb } from '../../web/db/connection';
import { getMeta } from '../../web/db/meta';
import { onDbEvent, type DbEvent } from '../../web/db/events';
import { READING_SOURCE_CODES } from '../../core/records/index';
import { upgradeFreshetDb } from '../../web/db/upgrade';
import { closeDbForTests } from '../../web/db/testing';
import { useFreshDb } from '../support/db';
import { gauging, rating, reading, site, T0 } from '../support/records';

useFreshDb();

function failPutOnce(store: string, failure: (s: IDBObjectStore, args: unknown[]) => IDBRequest) {
  const put = IDBObjectStore.prototype.put;
  return vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(function (this: IDBObjectStore, ...args) {
    if (this.name === store) return failure(this, args);
    return put.apply(this, args as Parameters<typeof put>);
  });
}

describe('a failed save leaves the store as it was', () => {
  it('maps a quota error to a plain message and writes nothing, not even the revision clock', async () => {
    const s = await saveSite(site());
    const clockBefore = await getMeta('lastRev');
    const spy = failPutOnce('readings', () => {
      throw new DOMException('Quota exceeded', 'QuotaExceededError');
    });
    const err = await saveReading(reading(s.id, T0, 0.7)).catch((e: unknown) => e);
    spy.mockRestore();
    expect(err).toBeInstanceOf(StorageError);
    expect((err as StorageError).reason).toBe('quota');
    expect((err as StorageError).message).toMatch(/no room left for Freshet’s data, so nothing was saved/);
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([]);
    expect(await getMeta('lastRev')).toBe(clockBefore);
  });

  it('maps an aborted transaction to "aborted" and keeps the earlier version of the record', async () => {
    const s = await saveSite(site());
    const put = IDBObjectStore.prototype.put;
    const spy = failPutOnce('sites', (store, args) => {
      const req = put.apply(store, args as Parameters<typeof put>);
      store.transaction.abort();
      return req;
    });
    const err = await saveSite({ ...s, name: 'Renamed' }).catch((e: unknown) => e);
    spy.mockRestore();
    expect(err).toMatchObject({ name: 'StorageError', reason: 'aborted' });
    expect(await getSite(s.id)).toEqual(s);
  });
});

describe('the connection', () => {
  it('closes and asks the page to reload when another tab opens a newer version', async () => {
    const events: DbEvent[] = [];
    onDbEvent((e) => events.push(e));
    await saveSite(site());
    // The other tab's open must not be blocked: it resolves because this page closed its connection.
    const newer = await openDB(DB_NAME, DB_VERSION + 1);
    expect(events).toEqual([{ type: 'reload-needed' }]);
    await expect(saveSite(site())).rejects.toMatchObject({ name: 'StorageError', reason: 'version' });
    newer.close();
  });

  it('reopens a connection the browser closed, and the save goes through', async () => {
    const events: DbEvent[] = [];
    onDbEvent((e) => events.push(e));
    const db = await getDb();
    db.close(); // as the browser may do (storage pressure, clearing site data)
    const s = await saveSite(site());
    expect(events).toEqual([{ type: 'reopened' }]);
    expect(await getSite(s.id)).toEqual(s);
    expect(await getDb()).not.toBe(db);
  });
});

// The upgrade ladder: for each released version, write every store as that version did, close, open
// with the current code, and find every record intact. A new version adds a row here.
describe('upgrade ladder', () => {
  const ladder: { version: number; write: (db: Awaited<ReturnType<typeof openDB<FreshetDB>>>) => Promise<{ records: unknown[]; series: SeriesChunk[] }> }[] = [
    {
      version: 1,
      write: async (db) => {
        const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
        const env = (n: number) => ({ id: id(n), rev: `1767225600000-00000${n}-dev`, updated_ms: 1_767_225_600_000 });
        const s: SiteRecord = { ...site(), ...env(1) };
        const records = [
          ['sites', s], ['readings', { ...reading(s.id, T0, 0.7), ...env(2) }],
          ['readings', { ...reading(s.id, T0 + 1, 0.8), ...env(3), deleted: true as const }],
          ['gaugings', { ...gauging(s.id, T0), ...env(4) }], ['ratings', { ...rating(s.id, T0), ...env(5) }],
          ['drafts', { form: 'reading', fields: { stage: '0.7' }, ...env(6) }],
        ] as const;
        const series = {
          siteId: s.id, day: Math.floor(T0 / 86_400_000), time_ms: Float64Array.of(T0), stage_m: Float64Array.of(0.7),
          source: Uint8Array.of(READING_SOURCE_CODES.staff), id: [id(2)],
        };
        const tx = db.transaction(['sites', 'readings', 'gaugings', 'ratings', 'drafts', 'meta', 'series'], 'readwrite');
        for (const [store, value] of records) await tx.objectStore(store).put(value as never);
        await tx.objectStore('meta').put('dev', 'deviceId');
        // The derived series of the one live reading, as version 1 keeps it beside the readings.
        await tx.objectStore('series').put(series);
        await tx.done;
        return { records: records.map(([, v]) => v), series: [series] };
      },
    },
  ];

  for (const step of ladder) {
    it(`opens a database written by version ${step.version} with every record intact`, async () => {
      await closeDbForTests();
      const old = await openDB<FreshetDB>(DB_NAME, step.version, {
        upgrade: (db, oldVersion, _n, tx) => upgradeFreshetDb(db, oldVersion, tx, step.version),
      });
      const { records: written, series } = await step.write(old);
      old.close();
      const db = await getDb();
      expect(db.version).toBe(DB_VERSION);
      const stores = ['sites', 'readings', 'gaugings', 'ratings', 'analyses', 'drafts', 'conflicts'] as const;
      const all = (await Promise.all(stores.map((s) => db.getAll(s)))).flat();
      expect(all).toHaveLength(written.length);
      for (const w of written) expect(all).toContainEqual(w);
      expect(await getMeta('deviceId')).toBe('dev');
      expect((await db.getAllFromIndex('readings', 'by-site-time')).length).toBe(2);
      expect(await db.getAll('series')).toEqual(series);
    });
  }
});

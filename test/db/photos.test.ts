// Photos in IndexedDB (fake-indexeddb; issue 25): upgrade step 4 keeps a version 3 database intact and
// adds the two stores; a photo's bytes are kept once by SHA-256 beside its record; a full store keeps
// nothing of the photo and leaves its reading saved; delete is a tombstone and undo a new revision; photo
// records wait in the outbox and merge from a pull like any other record.
import { describe, expect, it, vi } from 'vitest';
import { openDB } from 'idb';
import { toSyncRecord } from '../../core/records/index';
import { applyIncoming, listReadings, nextOutgoing, saveReading, saveSite, StorageError } from '../../web/db/index';
import { deletePhoto, listPhotosAtSite, listPhotosOf, restorePhoto, savePhoto, type NewPhoto } from '../../web/db/photos';
import { getPhotoBytes, markPhotoBytesConfirmed, notePhotoHashRefusal, photoBytesSummary } from '../../web/db/photo-bytes';
import { DB_NAME, DB_VERSION, type FreshetDB } from '../../web/db/schema';
import { getDb } from '../../web/db/connection';
import { upgradeFreshetDb } from '../../web/db/upgrade';
import { closeDbForTests } from '../../web/db/testing';
import { useFreshDb } from '../support/db';
import { photo, sha256Hex } from '../support/photos';
import { reading, site, T0 } from '../support/records';

useFreshDb();

function newPhoto(siteId: string, ownerId: string, seed = 1, caption = 'Weed on the control'): NewPhoto {
  const bytes = Uint8Array.from({ length: 500 + seed }, (_, i) => (i * seed) % 251);
  const image = { sha256: sha256Hex(bytes), bytes: bytes.length, type: 'image/jpeg' as const, blob: new Blob([bytes], { type: 'image/jpeg' }) };
  return { siteId, owner: { kind: 'reading', id: ownerId }, width_px: 2048, height_px: 1536, taken_ms: T0 + seed, caption, image };
}

describe('upgrade step 4', () => {
  it('adds the photo stores to a version 3 database, keeping its records', async () => {
    await closeDbForTests();
    const old = await openDB<FreshetDB>(DB_NAME, 3, { upgrade: (db, oldVersion, _n, tx) => upgradeFreshetDb(db, oldVersion, tx, 3) });
    const s = { ...site(), id: '00000000-0000-4000-8000-000000000001', rev: '1767225600000-000001-dev', updated_ms: 1_767_225_600_000 };
    const r = { ...reading(s.id, T0, 0.7), id: '00000000-0000-4000-8000-000000000002', rev: '1767225600000-000002-dev', updated_ms: 1_767_225_600_000 };
    await old.put('sites', s);
    await old.put('readings', r);
    expect(old.objectStoreNames.contains('photos')).toBe(false);
    old.close();
    const db = await getDb();
    expect(db.version).toBe(DB_VERSION);
    expect(DB_VERSION).toBe(4);
    expect(await db.getAll('sites')).toEqual([s]);
    expect(await db.getAll('readings')).toEqual([r]);
    expect(await db.getAll('photos')).toEqual([]);
    expect(await db.getAll('photoBytes')).toEqual([]);
    expect(Array.from(db.transaction('photos').store.indexNames).sort()).toEqual(['by-owner', 'by-rev', 'by-sha256', 'by-site-taken']);
    const saved = await savePhoto(newPhoto(s.id, r.id));
    expect(await listPhotosOf(r.id)).toEqual([saved]);
  });
});

describe('saving photos', () => {
  it('keeps the record and its bytes (Blob, type, size, not yet confirmed), several per reading, in taken order', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const second = await savePhoto(newPhoto(s.id, r.id, 2));
    const first = await savePhoto(newPhoto(s.id, r.id, 1, '  '));
    expect((await listPhotosOf(r.id)).map((p) => p.id)).toEqual([first.id, second.id]);
    expect(first.caption).toBeUndefined();
    expect(second.caption).toBe('Weed on the control');
    const held = await getPhotoBytes(second.sha256);
    expect(held).toMatchObject({ sha256: second.sha256, type: 'image/jpeg', bytes: 502, confirmed: false });
    expect(sha256Hex(new Uint8Array(await held!.blob.arrayBuffer()))).toBe(second.sha256);
    expect((await listPhotosAtSite(s.id)).length).toBe(2);
    expect(await photoBytesSummary()).toEqual({ count: 2, bytes: 501 + 502, unconfirmed: 2 });
  });

  it('keeps shared bytes once, and a confirmation stays with them', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const a = await savePhoto(newPhoto(s.id, r.id, 3));
    await markPhotoBytesConfirmed(a.sha256);
    await savePhoto({ ...newPhoto(s.id, s.id, 3), owner: { kind: 'site', id: s.id } });
    expect(await photoBytesSummary()).toEqual({ count: 1, bytes: 503, unconfirmed: 0 });
    expect(await notePhotoHashRefusal(a.sha256)).toBe(1);
    expect(await notePhotoHashRefusal(a.sha256)).toBe(2);
  });

  it('refuses a bad photo with the field named and keeps nothing of it', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    await expect(savePhoto({ ...newPhoto(s.id, r.id), caption: 'x'.repeat(501) })).rejects.toMatchObject({ field: 'caption' });
    await expect(savePhoto({ ...newPhoto(s.id, r.id), width_px: 0 })).rejects.toMatchObject({ field: 'width_px' });
    expect(await photoBytesSummary()).toEqual({ count: 0, bytes: 0, unconfirmed: 0 });
  });

  it('when the store is full, refuses the photo with reason quota, keeps nothing of it and leaves the reading saved', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const put = IDBObjectStore.prototype.put;
    const spy = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(function (this: IDBObjectStore, ...args) {
      if (this.name === 'photoBytes') throw new DOMException('Quota exceeded', 'QuotaExceededError');
      return put.apply(this, args as Parameters<typeof put>);
    });
    const err = await savePhoto(newPhoto(s.id, r.id)).catch((e: unknown) => e);
    spy.mockRestore();
    expect(err).toBeInstanceOf(StorageError);
    expect((err as StorageError).reason).toBe('quota');
    expect(await listReadings(s.id, -Infinity, Infinity)).toEqual([r]);
    expect(await listPhotosOf(r.id, { includeDeleted: true })).toEqual([]);
    expect(await photoBytesSummary()).toEqual({ count: 0, bytes: 0, unconfirmed: 0 });
  });

  it('drops the bytes again when the record cannot be written', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const put = IDBObjectStore.prototype.put;
    const spy = vi.spyOn(IDBObjectStore.prototype, 'put').mockImplementation(function (this: IDBObjectStore, ...args) {
      if (this.name === 'photos') throw new DOMException('Quota exceeded', 'QuotaExceededError');
      return put.apply(this, args as Parameters<typeof put>);
    });
    await expect(savePhoto(newPhoto(s.id, r.id))).rejects.toMatchObject({ reason: 'quota' });
    spy.mockRestore();
    expect(await photoBytesSummary()).toEqual({ count: 0, bytes: 0, unconfirmed: 0 });
  });

  it('deletes by tombstone (bytes stay) and undoes as a new revision', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const p = await savePhoto(newPhoto(s.id, r.id));
    const gone = await deletePhoto(p.id);
    expect(gone?.deleted).toBe(true);
    expect(gone!.rev > p.rev).toBe(true);
    expect(await listPhotosOf(r.id)).toEqual([]);
    expect(await getPhotoBytes(p.sha256)).toBeDefined();
    const back = await restorePhoto(p.id);
    expect(back?.deleted).toBeUndefined();
    expect(back!.rev > gone!.rev).toBe(true);
    expect((await listPhotosOf(r.id)).map((x) => x.id)).toEqual([p.id]);
  });
});

describe('photo records in sync', () => {
  it('wait in the outbox with the reading they belong to, tombstones too', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const p = await savePhoto(newPhoto(s.id, r.id));
    await deletePhoto(p.id);
    const entry = await nextOutgoing();
    const kinds = entry!.bundle.records.map((x) => `${x.kind}${x.deleted ? ' deleted' : ''}`);
    expect(kinds).toEqual(['site', 'reading', 'photo deleted']);
  });

  it('merge from a pull like any other record; the bytes are not on this phone yet', async () => {
    const siteId = '0b6f1f3e-6a53-4f7c-9a53-1d2f6e1b7c10';
    const readingId = '5d1c7a2e-3b4f-4c6d-8e9f-0a1b2c3d4e5f';
    const id = '7e6d5c4b-3a29-4817-9605-f4e3d2c1b0a9';
    const incoming = toSyncRecord('photo', { ...photo(siteId, readingId), id, rev: '1767225600000-000001-other', updated_ms: 1_767_225_600_000 });
    const { summary } = await applyIncoming([incoming]);
    expect(summary).toMatchObject({ new: 1, byKind: { photo: { new: 1, updated: 0 } } });
    const [got] = await listPhotosOf(readingId);
    expect(got.id).toBe(id);
    expect(await getPhotoBytes(got.sha256)).toBeUndefined();
  });
});

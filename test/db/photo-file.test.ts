// Bundle files with photos (the photos contract, "Bundle files"): a file saved on a phone carries the bytes
// of its photo records in `blobs`, read back by core/exchange's bundleFileParts (each checked by its hash,
// SHA-256 from Node's crypto as the oracle), and a phone opening the file keeps them.
import { describe, expect, it } from 'vitest';
import { bundleFileParts } from '../../core/index';
import { exportBundle, saveReading, saveSite } from '../../web/db/index';
import { deletePhoto, savePhoto } from '../../web/db/photos';
import { getPhotoBytes } from '../../web/db/photo-bytes';
import { keepFilePhotos, withPhotoBytes } from '../../web/sync/photo-file';
import { closeDbForTests, deleteFreshetDbForTests } from '../../web/db/testing';
import { useFreshDb } from '../support/db';
import { sha256Hex } from '../support/photos';
import { reading, site, T0 } from '../support/records';

useFreshDb();

describe('photos in bundle files', () => {
  it('carries the bytes of live photo records, and a phone opening the file keeps them', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.7));
    const bytes = Uint8Array.from({ length: 900 }, (_, i) => (i * 13) % 256);
    const image = { sha256: sha256Hex(bytes), bytes: bytes.length, type: 'image/jpeg' as const, blob: new Blob([bytes], { type: 'image/jpeg' }) };
    const other = Uint8Array.from({ length: 300 }, (_, i) => i % 7);
    const gone = { sha256: sha256Hex(other), bytes: other.length, type: 'image/png' as const, blob: new Blob([other], { type: 'image/png' }) };
    await savePhoto({ siteId: s.id, owner: { kind: 'reading', id: r.id }, width_px: 30, height_px: 30, taken_ms: T0, image });
    const deleted = await savePhoto({ siteId: s.id, owner: { kind: 'reading', id: r.id }, width_px: 10, height_px: 30, taken_ms: T0, image: gone });
    await deletePhoto(deleted.id);
    const file = JSON.parse(JSON.stringify(await withPhotoBytes((await exportBundle(false)).bundle))) as unknown;
    const { bundle, blobs } = bundleFileParts(file);
    expect(bundle.records.filter((x) => x.kind === 'photo')).toHaveLength(2);
    // A tombstone's bytes are not carried.
    expect([...blobs.keys()]).toEqual([image.sha256]);
    expect(sha256Hex(blobs.get(image.sha256)!.bytes)).toBe(image.sha256);
    await closeDbForTests();
    await deleteFreshetDbForTests();
    expect(await keepFilePhotos(blobs)).toBe(1);
    expect(await getPhotoBytes(image.sha256)).toMatchObject({ type: 'image/jpeg', bytes: 900, confirmed: false });
  });

  it('leaves a bundle without photos as it was', async () => {
    const s = await saveSite(site());
    await saveReading(reading(s.id, T0, 0.7));
    const { bundle } = await exportBundle(false);
    expect(await withPhotoBytes(bundle)).toBe(bundle);
  });
});

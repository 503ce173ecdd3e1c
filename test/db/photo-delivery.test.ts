// Photo delivery against a small office written from the photos contract (test/support/photo-office.ts,
// hashing with Node's crypto): bytes go before the bundle that names them and count as delivered only on
// an answer with the same SHA-256; bytes the office holds are not sent again (HEAD 200); damaged uploads
// are sent again, and after three resends the photo is set aside with a sentence while the reading goes;
// no network stops the run with nothing pushed; a tombstone goes without bytes; another phone fetches the
// bytes by GET, checked against the hash, and keeps them.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { listSetAside, saveReading, saveSite, setSyncValue, waitingCount } from '../../web/db/index';
import { deletePhoto, savePhoto, type NewPhoto } from '../../web/db/photos';
import { getPhotoBytes } from '../../web/db/photo-bytes';
import { pushWaiting } from '../../web/sync/push';
import { photoBlob } from '../../web/sync/photo-fetch';
import { MAX_HASH_RESENDS } from '../../web/sync/photo-delivery';
import { useFreshDb } from '../support/db';
import { sha256Hex } from '../support/photos';
import { startPhotoOffice, type PhotoOffice } from '../support/photo-office';
import { reading, site, T0 } from '../support/records';

useFreshDb();
let office: PhotoOffice;
beforeEach(async () => {
  office = await startPhotoOffice();
  await setSyncValue('settings', { base: office.base, token: office.token });
});
afterEach(async () => {
  await office.stop();
});

function newPhoto(siteId: string, ownerId: string, seed = 1, original = false): NewPhoto {
  const make = (n: number, type: 'image/jpeg' | 'image/png') => {
    const bytes = Uint8Array.from({ length: 700 + n }, (_, i) => (i * (n + 3)) % 253);
    return { sha256: sha256Hex(bytes), bytes: bytes.length, type, blob: new Blob([bytes], { type }) };
  };
  return {
    siteId, owner: { kind: 'reading', id: ownerId }, width_px: 2048, height_px: 1536, taken_ms: T0, image: make(seed, 'image/jpeg'),
    ...(original ? { original: make(seed + 100, 'image/png') } : {}),
  };
}

async function readingWithPhoto(original = false) {
  const s = await saveSite(site());
  const r = await saveReading(reading(s.id, T0, 0.7));
  const p = await savePhoto(newPhoto(s.id, r.id, 1, original));
  return { s, r, p };
}

const blobPath = (sha: string) => `/blobs/sha256-${sha}`;

describe('photo bytes before the bundle', () => {
  it('uploads the photo and its kept original, confirmed by hash, then pushes the bundle', async () => {
    const { p } = await readingWithPhoto(true);
    const run = await pushWaiting({ base: office.base, token: office.token });
    expect(run).toMatchObject({ kind: 'sent', sent: 3, setAside: 0 });
    expect(office.log).toEqual([
      `HEAD ${blobPath(p.sha256)}`, `PUT ${blobPath(p.sha256)}`,
      `HEAD ${blobPath(p.original!.sha256)}`, `PUT ${blobPath(p.original!.sha256)}`,
      'POST /bundles',
    ]);
    expect(office.blobs.get(p.sha256)?.type).toBe('image/jpeg');
    expect(office.blobs.get(p.original!.sha256)?.type).toBe('image/png');
    expect(sha256Hex(office.blobs.get(p.sha256)!.bytes)).toBe(p.sha256);
    expect((await getPhotoBytes(p.sha256))?.confirmed).toBe(true);
    expect((await getPhotoBytes(p.original!.sha256))?.confirmed).toBe(true);
    expect(office.records.map((r) => r.kind)).toEqual(['site', 'reading', 'photo']);
    expect(await waitingCount()).toBe(0);
  });

  it('sends no bytes the office already holds (HEAD 200), and none already confirmed', async () => {
    const { s, r, p } = await readingWithPhoto();
    office.blobs.set(p.sha256, { type: 'image/jpeg', bytes: Buffer.from(await (await getPhotoBytes(p.sha256))!.blob.arrayBuffer()) });
    await pushWaiting({ base: office.base, token: office.token });
    expect(office.log).toEqual([`HEAD ${blobPath(p.sha256)}`, 'POST /bundles']);
    expect((await getPhotoBytes(p.sha256))?.confirmed).toBe(true);
    // The same bytes on a second photo (a site photo): confirmed already, so straight to the bundle.
    office.log.length = 0;
    await savePhoto({ ...newPhoto(s.id, r.id), owner: { kind: 'site', id: s.id } });
    await pushWaiting({ base: office.base, token: office.token });
    expect(office.log).toEqual(['POST /bundles']);
  });

  it('sends damaged uploads again and delivers once the bytes arrive whole', async () => {
    const { p } = await readingWithPhoto();
    office.damageNext = 2;
    const run = await pushWaiting({ base: office.base, token: office.token });
    expect(run.kind).toBe('sent');
    expect(office.log.filter((l) => l.startsWith('PUT'))).toHaveLength(3);
    expect(office.blobs.has(p.sha256)).toBe(true);
    expect((await getPhotoBytes(p.sha256))?.confirmed).toBe(true);
    expect(office.records.map((r) => r.kind)).toContain('photo');
  });

  it(`after ${MAX_HASH_RESENDS} resends sets the photo aside with a sentence; the reading still goes`, async () => {
    const { r, p } = await readingWithPhoto();
    office.damageNext = 100;
    const run = await pushWaiting({ base: office.base, token: office.token });
    expect(run).toMatchObject({ kind: 'sent', setAside: 1 });
    expect(office.log.filter((l) => l.startsWith('PUT'))).toHaveLength(MAX_HASH_RESENDS + 1);
    expect(office.blobs.size).toBe(0);
    expect(office.records.map((x) => x.id)).toContain(r.id);
    expect(office.records.map((x) => x.id)).not.toContain(p.id);
    const [aside] = await listSetAside();
    expect(aside).toMatchObject({ kind: 'photo', id: p.id, state: 'open' });
    expect(aside.reason).toBe('This photo reached the office damaged 4 times in a row (the bytes that arrived were not the ones sent). It stays on this phone; it is sent again with its next change, or try another network.');
    expect((await getPhotoBytes(p.sha256))?.confirmed).toBe(false);
  });

  it('with no answer from the office pushes nothing and says so', async () => {
    await readingWithPhoto();
    await office.stop();
    const run = await pushWaiting({ base: office.base, token: office.token });
    expect(run).toMatchObject({ kind: 'stopped', outcome: { kind: 'retry', message: 'No connection to the office. The records stay on this phone and go when the network is back.' } });
    expect(await waitingCount()).toBe(3);
    office = await startPhotoOffice();
  });

  it("sends a deleted photo's tombstone without bytes", async () => {
    const { p } = await readingWithPhoto();
    await pushWaiting({ base: office.base, token: office.token });
    office.log.length = 0;
    await deletePhoto(p.id);
    await pushWaiting({ base: office.base, token: office.token });
    expect(office.log).toEqual(['POST /bundles']);
    expect(office.records.at(-1)).toMatchObject({ kind: 'photo', id: p.id, deleted: true });
  });
});

describe('photo bytes for showing', () => {
  it('fetches bytes this phone lacks, checks the hash and keeps them as confirmed', async () => {
    const bytes = Buffer.from('invented picture bytes');
    const sha = sha256Hex(bytes);
    office.blobs.set(sha, { type: 'image/webp', bytes });
    const got = await photoBlob(sha);
    expect(got.kind).toBe('here');
    expect(Buffer.from(await (got as { blob: Blob }).blob.arrayBuffer())).toEqual(bytes);
    expect(await getPhotoBytes(sha)).toMatchObject({ type: 'image/webp', bytes: bytes.length, confirmed: true });
    office.log.length = 0;
    await photoBlob(sha);
    expect(office.log).toEqual([]);
  });

  it('says the photo is not on this phone yet when the office lacks it, sends other bytes, or cannot be reached', async () => {
    const sha = sha256Hex('never sent');
    expect(await photoBlob(sha)).toEqual({ kind: 'missing', message: 'This photo is not on this phone yet. The office does not have it yet: the phone that took it has not sent it. Try again later.' });
    office.blobs.set(sha, { type: 'image/jpeg', bytes: Buffer.from('something else') });
    expect(await photoBlob(sha)).toEqual({ kind: 'missing', message: 'This photo is not on this phone yet. What came from the office was not this photo (damaged on the way). Try again.' });
    expect(await getPhotoBytes(sha)).toBeUndefined();
    await office.stop();
    expect(await photoBlob(sha)).toEqual({ kind: 'missing', message: 'This photo is not on this phone yet. It loads from the office when the network is back.' });
    office = await startPhotoOffice();
  });
});

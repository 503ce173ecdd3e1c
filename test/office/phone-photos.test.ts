// The phone's own photo delivery (web/sync's push loop over web/db under fake-indexeddb) against the office
// receiver itself (PGlite in a temp folder): the bytes and the kept original go first and the office holds
// each once with the same SHA-256 (oracle: node:crypto), then the bundle with the photo record; the
// photo's tombstone follows and the bytes stay. Both sides follow core/exchange/README.md ("Photo bytes").
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { saveReading, saveSite, setSyncValue, waitingCount } from '../../web/db/index';
import { deletePhoto, savePhoto, type PreparedBytes } from '../../web/db/photos';
import { pushWaiting } from '../../web/sync/push';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { createReceiver } from '../../office/receiver/http';
import { openOfficeDatabase } from '../../office/receiver/open';
import { useFreshDb } from '../support/db';
import { reading, site, T0 } from '../support/records';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const dir = mkdtempSync(join(tmpdir(), 'freshet-phone-photos-'));
let db: Database;
let server: Server;
let settings: { base: string; token: string };
const log: string[] = [];

useFreshDb();

beforeAll(async () => {
  db = await openOfficeDatabase({ data: dir });
  server = createReceiver({ db, origins: [], log: (l) => log.push(l) });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  settings = { base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, token: await createDevice(db, 'phone A') };
}, 120_000);

afterAll(async () => {
  await new Promise<void>((r) => {
    server.closeAllConnections();
    server.close(() => r());
  });
  await db.close();
  rmSync(dir, { recursive: true, force: true });
});

function prepared(n: number, seed: number, type: PreparedBytes['type']): { bytes: Uint8Array; image: PreparedBytes } {
  const bytes = Uint8Array.from({ length: n }, (_, i) => (i * seed + (i >> 8)) % 251);
  return { bytes, image: { sha256: sha(bytes), bytes: bytes.length, type, blob: new Blob([bytes], { type }) } };
}

describe('the phone delivers photos to the office receiver', () => {
  it('sends the bytes and the kept original before the bundle; the office holds each once; the tombstone follows', async () => {
    await setSyncValue('settings', settings);
    const s = await saveSite(site({ code: 'KC-09' }));
    const r = await saveReading(reading(s.id, T0, 0.71));
    const image = prepared(300_000, 7, 'image/jpeg');
    const original = prepared(900_000, 13, 'image/png');
    const p = await savePhoto({
      siteId: s.id, owner: { kind: 'reading', id: r.id }, width_px: 2048, height_px: 1536, taken_ms: T0,
      caption: 'Staff gauge at first light', image: image.image, original: original.image,
    });
    const run = await pushWaiting(settings);
    expect(run).toMatchObject({ kind: 'sent', setAside: 0 });
    // The order rule: both uploads answered before the bundle that names them was sent.
    const order = log.map((l) => /^\S+ (\w+) (\/\S+) .* outcome=(\d+)/.exec(l)).map((m) => (m ? `${m[1]} ${m[2].replace(/[0-9a-f]{64}/, 'H')} ${m[3]}` : '?'));
    expect(order).toEqual(['HEAD /blobs/sha256-H 404', 'PUT /blobs/sha256-H 201', 'HEAD /blobs/sha256-H 404', 'PUT /blobs/sha256-H 201', 'POST /bundles 201']);
    expect(await waitingCount()).toBe(0);
    const held = await db.query<{ sha256: string; type: string; data: Uint8Array }>('select sha256, type, data from office_blobs order by bytes');
    expect(held.map((h) => [h.sha256, h.type, sha(h.data)])).toEqual([
      [sha(image.bytes), 'image/jpeg', sha(image.bytes)],
      [sha(original.bytes), 'image/png', sha(original.bytes)],
    ]);
    const [photo] = await db.query<{ deleted: boolean; body: { sha256: string; original?: { sha256: string } } }>(
      "select deleted, body from current_records where kind = 'photo' and id = $1", [p.id]);
    expect(photo.deleted).toBe(false);
    expect(photo.body.sha256).toBe(sha(image.bytes));
    expect(photo.body.original?.sha256).toBe(sha(original.bytes));

    await deletePhoto(p.id);
    expect(await pushWaiting(settings)).toMatchObject({ kind: 'sent', setAside: 0 });
    const [gone] = await db.query<{ deleted: boolean }>("select deleted from current_records where kind = 'photo' and id = $1", [p.id]);
    expect(gone.deleted).toBe(true);
    const [n] = await db.query<{ n: string }>('select count(*)::text as n from office_blobs');
    expect(n.n).toBe('2');
  });
});

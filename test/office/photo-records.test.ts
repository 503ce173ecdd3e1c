// Photo records through the office receiver end to end, on PGlite and (when one is available) a PostgreSQL
// server: a phone sends a photo's bytes, then the bundle holding its record; another phone pulls the record
// and fetches the bytes; the photo's tombstone reaches the office and the other phone, the bytes stay. The
// rules checked are the photo contract's (core/exchange/README.md, "Photos"); SHA-256 oracle: node:crypto.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nextRev, parseBundle, type PhotoBody, type SyncRecord } from '../../core/index';
import type { Database } from '../../office/receiver/db';
import { heldBlobs } from '../../office/receiver/blob-store';
import { createDevice } from '../../office/receiver/devices';
import { createReceiver } from '../../office/receiver/http';
import { openOfficeDatabase } from '../../office/receiver/open';
import { sitePhotosFromDatabase } from '../../office/receiver/photo-source';
import { POSTGRES_URL, skipWithoutPostgres, throwawayDatabase } from '../support/office/postgres';
import { bundleOf, pullAll, push, readingRecords, SITE_ID, siteRecord, T0_MS } from '../support/office/phones';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

interface Engine {
  name: string;
  open: () => Promise<Database>;
  dispose: () => Promise<void>;
}

const engines: Engine[] = [];
const dir = mkdtempSync(join(tmpdir(), 'freshet-photo-records-'));
engines.push({ name: 'PGlite', open: () => openOfficeDatabase({ data: dir }), dispose: async () => rmSync(dir, { recursive: true, force: true }) });
if (!skipWithoutPostgres('photo-records.test.ts')) {
  let drop: (() => Promise<void>) | undefined;
  engines.push({
    name: `PostgreSQL (${new URL(POSTGRES_URL as string).host})`,
    open: async () => {
      const made = await throwawayDatabase('freshet_photos');
      drop = made.drop;
      return openOfficeDatabase({ database: made.url });
    },
    dispose: async () => drop?.(),
  });
}

/** A photo record of reading `readingId` naming `bytes`, made by `device` at `at_ms`. */
function photoRecord(device: string, readingId: string, bytes: Uint8Array, at_ms: number, id = randomUUID()): SyncRecord<'photo'> {
  const body: PhotoBody & { updated_ms: number } = {
    siteId: SITE_ID, owner: { kind: 'reading', id: readingId }, sha256: sha(bytes), bytes: bytes.length, type: 'image/jpeg',
    width_px: 2048, height_px: 1536, taken_ms: at_ms, caption: 'Staff gauge; weed on the control', updated_ms: at_ms,
  };
  return { kind: 'photo', id, rev: nextRev(undefined, at_ms, device), body };
}

for (const engine of engines) {
  describe(`photo records at the office receiver on ${engine.name}`, () => {
    let db: Database;
    let server: Server;
    let base = '';
    let tokenA = '';
    let tokenB = '';

    beforeAll(async () => {
      db = await engine.open();
      server = createReceiver({ db, origins: [], log: () => {} });
      await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
      base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
      tokenA = await createDevice(db, 'phone A');
      tokenB = await createDevice(db, 'phone B');
    }, 120_000);

    afterAll(async () => {
      await new Promise<void>((r) => {
        server.closeAllConnections();
        server.close(() => r());
      });
      await db.close();
      await engine.dispose();
    });

    it('stores photo records and their tombstone like any record; the other phone pulls both and fetches the bytes', async () => {
      const bytes = new Uint8Array(randomBytes(40_000));
      const [reading] = readingRecords('dev-a', 1);
      const taken = photoRecord('dev-a', reading.id, bytes, T0_MS + 60_000);
      // The order rule: the bytes first, then the bundle with the record.
      const put = await fetch(`${base}/blobs/sha256-${sha(bytes)}`, {
        method: 'PUT', headers: { Authorization: `Bearer ${tokenA}`, 'Content-Type': 'image/jpeg' }, body: bytes,
      });
      expect(put.status).toBe(201);
      expect((await push(base, tokenA, bundleOf('dev-a', [siteRecord('dev-a'), reading, taken]))).status).toBe(201);
      const [current] = await db.query<{ deleted: boolean; body: PhotoBody }>("select deleted, body from current_records where kind = 'photo' and id = $1", [taken.id]);
      expect(current.deleted).toBe(false);
      expect(current.body.sha256).toBe(sha(bytes));
      expect(current.body.owner).toEqual({ kind: 'reading', id: reading.id });

      const first = await pullAll(base, tokenB, '0', 'dev-b');
      const pulled = first.bundles.flatMap((b) => parseBundle(b).records).find((r) => r.kind === 'photo');
      expect(pulled).toEqual(taken);
      const got = await fetch(`${base}/blobs/sha256-${(pulled?.body as PhotoBody).sha256}`, { headers: { Authorization: `Bearer ${tokenB}` } });
      expect(got.status).toBe(200);
      expect(sha(new Uint8Array(await got.arrayBuffer()))).toBe(sha(bytes));

      // Deleted on phone A: the tombstone wins (a higher revision) and travels to phone B; the bytes stay.
      const tombstone: SyncRecord<'photo'> = { ...taken, rev: nextRev(taken.rev, T0_MS + 120_000, 'dev-a'), deleted: true, body: { ...taken.body, updated_ms: T0_MS + 120_000 } };
      expect((await push(base, tokenA, bundleOf('dev-a', [tombstone]))).status).toBe(201);
      const [after] = await db.query<{ deleted: boolean; rev: string }>("select deleted, rev from current_records where kind = 'photo' and id = $1", [taken.id]);
      expect(after).toEqual({ deleted: true, rev: tombstone.rev });
      const [versions] = await db.query<{ n: string }>("select count(*)::text as n from record_versions where kind = 'photo' and id = $1", [taken.id]);
      expect(versions.n).toBe('2');
      const second = await pullAll(base, tokenB, first.cursor, 'dev-b');
      expect(second.bundles.flatMap((b) => parseBundle(b).records)).toEqual([tombstone]);
      const stillThere = await fetch(`${base}/blobs/sha256-${sha(bytes)}`, { method: 'HEAD', headers: { Authorization: `Bearer ${tokenB}` } });
      expect(stillThere.status).toBe(200);
      // What `freshet photos` reads on this engine: the deleted photo is left out, the bytes are held.
      const source = await sitePhotosFromDatabase('photos', db, 'TB-02');
      expect(source.site.id).toBe(SITE_ID);
      expect(source.photos.map((p) => p.id)).not.toContain(taken.id);
      expect(await heldBlobs(db, [sha(bytes), sha(new Uint8Array(1))])).toEqual(new Set([sha(bytes)]));
    });

    it('stores a photo record whose bytes have not arrived; GET answers 404 until they do', async () => {
      const bytes = new Uint8Array(randomBytes(5_000));
      const [reading] = readingRecords('dev-a', 1, 50);
      expect((await push(base, tokenA, bundleOf('dev-a', [reading, photoRecord('dev-a', reading.id, bytes, T0_MS + 3_600_000)]))).status).toBe(201);
      const url = `${base}/blobs/sha256-${sha(bytes)}`;
      const auth = { Authorization: `Bearer ${tokenB}` };
      const missing = await fetch(url, { headers: auth });
      expect(missing.status).toBe(404);
      expect((await missing.json()).reason).toBe('blob');
      expect((await fetch(url, { method: 'PUT', headers: { ...auth, 'Content-Type': 'image/jpeg' }, body: bytes })).status).toBe(201);
      expect((await fetch(url, { headers: auth })).status).toBe(200);
    });

    it('refuses a photo record that breaks the record rules (400 record, naming it), storing nothing of the bundle', async () => {
      const bytes = new Uint8Array(randomBytes(100));
      const [reading] = readingRecords('dev-a', 1, 80);
      const bad = photoRecord('dev-a', reading.id, bytes, T0_MS);
      (bad.body as { type: string }).type = 'image/gif';
      const res = await push(base, tokenA, bundleOf('dev-a', [reading, bad]));
      expect(res.status).toBe(400);
      expect(res.body).toMatchObject({ reason: 'record', index: 1, kind: 'photo', id: bad.id });
      const [n] = await db.query<{ n: string }>('select count(*)::text as n from record_versions where id = $1', [reading.id]);
      expect(n.n).toBe('0');
    });
  });
}

// The photo-bytes endpoint's tests (PUT, HEAD, GET /blobs/sha256-<hex>), run once per engine: PGlite in a
// temp folder and, when one is available, a PostgreSQL server. The answers checked are the photo contract's
// (core/exchange/README.md, "Photo bytes"). SHA-256 oracles: node:crypto, and the FIPS 180-4 example
// "abc" (NIST CSRC, SHA256.pdf example: ba7816bf…f20015ad).
import { createHash, randomBytes } from 'node:crypto';
import { request, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { Database } from '../../../office/receiver/db';
import { createDevice, revokeDevice } from '../../../office/receiver/devices';
import { createReceiver } from '../../../office/receiver/http';
import { encodeBundleBlobs } from '../../../core/index';
import { bundleOf, push, readingRecords } from './phones';
import type { Engine } from './protocol-suite';

/** The origin the suite allows for CORS (a port of ours that nothing listens on). */
const APP_ORIGIN = 'http://127.0.0.1:4619';
/** FIPS 180-4 example (NIST, "SHA256.pdf", one-block message "abc"). */
const ABC_SHA256 = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

async function blobCount(db: Database): Promise<number> {
  const [r] = await db.query<{ n: string }>('select count(*)::text as n from office_blobs');
  return Number(r.n);
}

/** Registers the blob endpoint's tests for one engine (the engine's port is not used: the server takes a free one). */
export function describeBlobs(engine: Engine): void {
  describe(`photo bytes at the office receiver on ${engine.name}`, () => {
    let db: Database;
    let server: Server;
    let base = '';
    let token = '';
    let failing = false;

    beforeAll(async () => {
      db = await engine.open();
      // The database seen by the receiver fails every photo statement while `failing` is set (a lost server).
      const flaky: Database = {
        ...db,
        query: (sql, params) => (failing && sql.includes('office_blobs') ? Promise.reject(new Error('connection terminated')) : db.query(sql, params)),
      };
      server = createReceiver({ db: flaky, origins: [APP_ORIGIN], log: () => {} });
      await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
      base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    }, 120_000);

    afterAll(async () => {
      await new Promise<void>((r) => {
        server.closeAllConnections();
        server.close(() => r());
      });
      await db.close();
      await engine.dispose?.();
    });

    beforeEach(async () => {
      failing = false;
      await db.exec('truncate office_blobs, record_versions, office_bundles, office_devices restart identity cascade');
      token = await createDevice(db, 'phone A');
    });

    const put = (hex: string, body: Uint8Array, type = 'image/jpeg', headers: Record<string, string> = {}) =>
      fetch(`${base}/blobs/sha256-${hex}`, { method: 'PUT', headers: { Authorization: `Bearer ${token}`, 'Content-Type': type, ...headers }, body: new Uint8Array(body) });

    it('stores new bytes (201), answers a repeat with 200, and GET gives the same bytes back', async () => {
      const bytes = randomBytes(50_000);
      const hex = sha(bytes);
      const first = await put(hex, bytes);
      expect(first.status).toBe(201);
      expect(await first.json()).toEqual({ sha256: hex, bytes: 50_000, stored: 'new' });
      expect(first.headers.get('freshet-max-blob-bytes')).toBe('16777216');
      const again = await put(hex, bytes);
      expect(again.status).toBe(200);
      expect(await again.json()).toEqual({ sha256: hex, bytes: 50_000, stored: 'held' });
      expect(await blobCount(db)).toBe(1);
      const got = await fetch(`${base}/blobs/sha256-${hex}`, { headers: { Authorization: `Bearer ${token}` } });
      expect(got.status).toBe(200);
      expect(got.headers.get('content-type')).toBe('image/jpeg');
      expect(got.headers.get('cache-control')).toBe('private, max-age=31536000, immutable');
      expect(got.headers.get('freshet-max-blob-bytes')).toBe('16777216');
      const back = new Uint8Array(await got.arrayBuffer());
      expect(sha(back)).toBe(hex);
      expect(Buffer.from(back).equals(bytes)).toBe(true);
    });

    it('hashes the FIPS 180-4 example "abc" to its published digest', async () => {
      const res = await put(ABC_SHA256, new TextEncoder().encode('abc'), 'image/png');
      expect(res.status).toBe(201);
      expect(await res.json()).toEqual({ sha256: ABC_SHA256, bytes: 3, stored: 'new' });
      const wrongName = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ae';
      expect((await put(wrongName, new TextEncoder().encode('abc'), 'image/png')).status).toBe(400);
    });

    it('answers HEAD 200 when held and 404 when not, and GET 404 reason blob', async () => {
      const bytes = randomBytes(1000);
      const hex = sha(bytes);
      const auth = { Authorization: `Bearer ${token}` };
      const before = await fetch(`${base}/blobs/sha256-${hex}`, { method: 'HEAD', headers: auth });
      expect(before.status).toBe(404);
      expect(before.headers.get('freshet-max-blob-bytes')).toBe('16777216');
      const missing = await fetch(`${base}/blobs/sha256-${hex}`, { headers: auth });
      expect(missing.status).toBe(404);
      expect((await missing.json()).reason).toBe('blob');
      expect((await put(hex, bytes, 'image/webp')).status).toBe(201);
      const after = await fetch(`${base}/blobs/sha256-${hex}`, { method: 'HEAD', headers: auth });
      expect(after.status).toBe(200);
      expect(after.headers.get('content-type')).toBe('image/webp');
      expect(after.headers.get('content-length')).toBe('1000');
    });

    it('refuses a corrupted upload (400 hash, nothing stored), then takes the right bytes', async () => {
      const bytes = randomBytes(20_000);
      const hex = sha(bytes);
      const damaged = Buffer.from(bytes);
      damaged[12_345] ^= 0x04;
      const refused = await put(hex, damaged);
      expect(refused.status).toBe(400);
      const body = await refused.json();
      expect(body.reason).toBe('hash');
      expect(body.message).toMatch(/damaged on the way/);
      expect(await blobCount(db)).toBe(0);
      const resent = await put(hex, bytes);
      expect(resent.status).toBe(201);
      const [row] = await db.query<{ data: Uint8Array; bytes: number; type: string }>('select data, bytes, type from office_blobs where sha256 = $1', [hex]);
      expect(sha(row.data)).toBe(hex);
      expect(Number(row.bytes)).toBe(20_000);
      expect(row.type).toBe('image/jpeg');
    });

    it('stores bytes sent by several phones at once exactly once', async () => {
      const bytes = randomBytes(200_000);
      const hex = sha(bytes);
      const answers = await Promise.all(Array.from({ length: 6 }, () => put(hex, bytes)));
      const statuses = answers.map((a) => a.status).sort();
      expect(statuses[0]).toBe(200);
      expect(statuses.filter((s) => s === 201)).toHaveLength(1);
      expect(statuses.filter((s) => s === 200)).toHaveLength(5);
      for (const a of answers) expect((await a.json()).sha256).toBe(hex);
      expect(await blobCount(db)).toBe(1);
    });

    it('refuses a type that is not an image (415) and bytes over the limit (413), storing nothing', async () => {
      const bytes = randomBytes(100);
      const wrongType = await put(sha(bytes), bytes, 'text/html');
      expect(wrongType.status).toBe(415);
      expect((await wrongType.json()).reason).toBe('type');
      // Announced too large: refused from the header, the body never read.
      const announced = await rawPut(base, sha(bytes), { 'Content-Type': 'image/jpeg', 'Content-Length': '16777217', Authorization: `Bearer ${token}` });
      expect(announced.status).toBe(413);
      expect(JSON.parse(announced.body).reason).toBe('size');
      // Sent without a length (chunked): cut off once past the limit.
      const big = Buffer.alloc(16_777_217, 7);
      const streamed = await put(sha(big), big, 'image/jpeg');
      expect(streamed.status).toBe(413);
      expect(await blobCount(db)).toBe(0);
      const empty = await put(sha(new Uint8Array(0)), new Uint8Array(0));
      expect(empty.status).toBe(400);
      expect(await blobCount(db)).toBe(0);
    });

    it('answers 401 before reading the body, and 403 for a revoked token, with CORS and the limit on each', async () => {
      const hex = sha(randomBytes(10));
      // Headers promise 1 MB, only 10 bytes are sent and the request is never finished: the answer comes anyway.
      const stranger = await rawPut(base, hex, { 'Content-Type': 'image/jpeg', 'Content-Length': '1000000', Origin: APP_ORIGIN, Authorization: `Bearer ${'x'.repeat(43)}` }, Buffer.alloc(10));
      expect(stranger.status).toBe(401);
      expect(JSON.parse(stranger.body).reason).toBe('token-unknown');
      expect(stranger.headers['access-control-allow-origin']).toBe(APP_ORIGIN);
      expect(String(stranger.headers['access-control-expose-headers'])).toMatch(/Freshet-Max-Blob-Bytes/);
      expect(stranger.headers['freshet-max-blob-bytes']).toBe('16777216');
      await revokeDevice(db, 'phone A');
      const revoked = await put(hex, randomBytes(10));
      expect(revoked.status).toBe(403);
      expect(await blobCount(db)).toBe(0);
    });

    it('cuts off a photo whose body does not arrive within the read-time limit (408), storing nothing', async () => {
      const slow = createReceiver({ db, origins: [], log: () => {}, bodyReadLimit_ms: 300 });
      await new Promise<void>((r) => slow.listen(0, '127.0.0.1', r));
      try {
        const slowBase = `http://127.0.0.1:${(slow.address() as AddressInfo).port}`;
        const res = await rawPut(slowBase, sha(randomBytes(10)), { 'Content-Type': 'image/jpeg', 'Content-Length': '5000', Authorization: `Bearer ${token}` }, Buffer.alloc(100));
        expect(res.status).toBe(408);
        expect(JSON.parse(res.body).reason).toBe('slow');
        expect(await blobCount(db)).toBe(0);
      } finally {
        await new Promise<void>((r) => {
          slow.closeAllConnections();
          slow.close(() => r());
        });
      }
    });

    it('answers the preflight with PUT and Content-Type allowed, and refuses other methods and names', async () => {
      const pre = await fetch(`${base}/blobs/sha256-${ABC_SHA256}`, {
        method: 'OPTIONS', headers: { Origin: APP_ORIGIN, 'Access-Control-Request-Method': 'PUT', 'Access-Control-Request-Headers': 'authorization, content-type' },
      });
      expect(pre.status).toBe(204);
      expect(pre.headers.get('access-control-allow-origin')).toBe(APP_ORIGIN);
      expect(pre.headers.get('access-control-allow-methods')).toMatch(/\bPUT\b/);
      expect(pre.headers.get('access-control-allow-headers')).toMatch(/Content-Type/);
      const auth = { Authorization: `Bearer ${token}` };
      expect((await fetch(`${base}/blobs/sha256-${ABC_SHA256}`, { method: 'DELETE', headers: auth })).status).toBe(405);
      expect((await fetch(`${base}/blobs/sha256-${ABC_SHA256.toUpperCase()}`, { headers: auth })).status).toBe(404);
      expect((await fetch(`${base}/blobs/${ABC_SHA256}`, { headers: auth })).status).toBe(404);
    });

    it('refuses a pushed bundle that carries photo bytes (400 shape): photos go by PUT /blobs', async () => {
      const bytes = new Uint8Array(randomBytes(300));
      const b = bundleOf('dev-a', readingRecords('dev-a', 2));
      const withBytes = JSON.stringify({ ...b, blobs: encodeBundleBlobs(new Map([[sha(bytes), { type: 'image/jpeg', bytes }]])) });
      const res = await push(base, token, withBytes, { 'Idempotency-Key': b.id });
      expect(res.status).toBe(400);
      expect(res.body.reason).toBe('shape');
      expect(await blobCount(db)).toBe(0);
      const [n] = await db.query<{ n: string }>('select count(*)::text as n from office_bundles');
      expect(n.n).toBe('0');
      const ok = await push(base, token, b);
      expect(ok.body).toMatchObject({ status: 'received' });
      expect(ok.status).toBe(201);
    });

    it('answers 503 with Retry-After when its database fails, and stores nothing', async () => {
      const bytes = randomBytes(500);
      failing = true;
      const res = await put(sha(bytes), bytes);
      expect(res.status).toBe(503);
      expect(res.headers.get('retry-after')).toMatch(/^\d+$/);
      expect((await res.json()).reason).toBe('unavailable');
      failing = false;
      expect(await blobCount(db)).toBe(0);
      expect((await put(sha(bytes), bytes)).status).toBe(201);
    });
  });
}

/** A PUT by hand (node:http), for headers fetch will not send as given; `partial` is written and the request left open. */
function rawPut(base: string, hex: string, headers: Record<string, string>, partial?: Buffer): Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: string }> {
  return new Promise((resolve, reject) => {
    const req = request(`${base}/blobs/sha256-${hex}`, { method: 'PUT', headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks).toString('utf8') });
        req.destroy();
      });
    });
    req.on('error', reject);
    if (partial) req.write(partial);
    else req.flushHeaders();
  });
}

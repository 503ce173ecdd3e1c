// A receiver written from the protocol page (core/exchange/README.md) alone, in plain Node with no import
// from this project, takes a real phone's bundles: the phone's own outbox (web/db under fake-indexeddb)
// makes them from a site, staff readings, a check reading beside the logger and a simulated logger
// record cut into logger days, and the phone's own push code (web/sync/http.ts) sends them. The SHA-256
// is node:crypto's (FIPS 180-4), not the project's. A photo goes the same way: its bytes by PUT to the
// page's blob address, then its record.
import { createHash } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { driftCorrections } from '../../core';
import { acknowledge, importLoggerRecord, importReadings, nextOutgoing, saveReading, saveSite, waitingCount } from '../../web/db';
import { savePhoto } from '../../web/db/photos';
import { pushWaiting } from '../../web/sync/push';
import { pullBundles, pushBundle } from '../../web/sync/http';
import { useFreshDb } from '../support/db';
import { loggerRecord, singleStorm, stageOf } from '../support/logger-records';
import { QUARTER_HOUR_MS, reading, site, T0 } from '../support/records';

const PORT = 4646;
const TOKEN = 'stranger-receiver-token-0123456789';

// ---- the stranger's receiver: only the page's words ----
interface Stored { kind: string; id: string; rev: string; body: unknown; deleted?: boolean }
function strangerReceiver(): {
  server: Server; records: Map<string, Stored>; bundles: Map<string, { checksum: string; text: string; device: string }>; blobs: Map<string, { type: string; bytes: Buffer }>;
} {
  const records = new Map<string, Stored>();
  const blobs = new Map<string, { type: string; bytes: Buffer }>();
  const bundles = new Map<string, { checksum: string; text: string; device: string }>();
  const send = (res: import('node:http').ServerResponse, status: number, body: object) => {
    res.writeHead(status, { 'Content-Type': 'application/json', 'Freshet-Max-Bundle-Bytes': String(16 * 1024 * 1024) }).end(JSON.stringify(body));
  };
  const refuse = (res: import('node:http').ServerResponse, status: number, reason: string, message: string, extra = {}) =>
    send(res, status, { reason, error: reason, message, ...extra });
  const server = createServer((req, res) => {
    if (req.headers.authorization !== `Bearer ${TOKEN}`) return refuse(res, 401, 'token-unknown', 'The token was not accepted.');
    const url = new URL(req.url ?? '/', 'http://x');
    // Page, "Photo bytes": HEAD 200/404; PUT checks the type and the hash of the bytes against the name.
    const blob = /^\/blobs\/sha256-([0-9a-f]{64})$/.exec(url.pathname);
    if (blob && req.method === 'HEAD') return void res.writeHead(blobs.has(blob[1]) ? 200 : 404).end();
    if (blob && req.method === 'PUT') {
      const type = String(req.headers['content-type']);
      if (!['image/jpeg', 'image/png', 'image/webp'].includes(type)) return refuse(res, 415, 'type', 'Not a photo type.');
      const parts: Buffer[] = [];
      req.on('data', (c: Buffer) => parts.push(c));
      req.on('end', () => {
        const bytes = Buffer.concat(parts);
        if (createHash('sha256').update(bytes).digest('hex') !== blob[1]) return refuse(res, 400, 'hash', 'The bytes do not match their name.');
        const had = blobs.has(blob[1]);
        blobs.set(blob[1], { type, bytes });
        send(res, had ? 200 : 201, { sha256: blob[1], bytes: bytes.length, stored: had ? 'held' : 'new' });
      });
      return;
    }
    if (url.pathname !== '/bundles') return refuse(res, 404, 'path', 'The bundle endpoint is /bundles.');
    if (req.method === 'GET') {
      const device = url.searchParams.get('device');
      const docs = [...bundles.values()].filter((b) => b.device !== device).map((b) => b.text);
      res.writeHead(200, { 'Content-Type': 'application/json' }).end(`{"bundles":[${docs.join(',')}],"cursor":"${bundles.size}","more":false}`);
      return;
    }
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      let b: { format?: unknown; version?: unknown; id?: unknown; device?: unknown; records?: unknown; checksum?: unknown };
      try { b = JSON.parse(Buffer.concat(chunks).toString('utf8')); } catch { return refuse(res, 400, 'json', 'The body is not JSON.'); }
      if (b.format !== 'freshet-bundle') return refuse(res, 400, 'format', 'Not a Freshet bundle.');
      if (b.version !== 1) return refuse(res, 400, 'version', 'Only bundle version 1 is read here.');
      if (typeof b.id !== 'string' || typeof b.device !== 'string' || !Array.isArray(b.records)) return refuse(res, 400, 'shape', 'Missing id, device or records.');
      if (req.headers['idempotency-key'] !== b.id) return refuse(res, 400, 'key', 'Idempotency-Key must be the bundle id.');
      const sum = 'sha256:' + createHash('sha256').update(JSON.stringify(b.records), 'utf8').digest('hex');
      if (sum !== b.checksum) return refuse(res, 400, 'checksum', 'The records do not match the checksum.');
      const kinds = ['site', 'reading', 'gauging', 'rating', 'analysis', 'logger-day', 'photo'];
      const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
      const rev = /^\d{13}-\d{6}-[A-Za-z0-9_-]{1,64}$/;
      for (const [index, r] of (b.records as Stored[]).entries()) {
        if (!kinds.includes(r.kind) || !uuid.test(r.id) || !rev.test(r.rev) || typeof r.body !== 'object') {
          return refuse(res, 400, 'record', `Record ${index + 1} is not a record.`, { index, kind: r.kind, id: r.id });
        }
      }
      const had = bundles.get(b.id);
      if (had) return had.checksum === sum ? send(res, 200, { bundle: b.id, records: b.records.length, status: 'already-received' }) : refuse(res, 409, 'bundle-id-reused', 'Bundle id reused.');
      for (const r of b.records as Stored[]) records.set(`${r.kind} ${r.id} ${r.rev}`, r);
      bundles.set(b.id, { checksum: sum, text: JSON.stringify(b), device: b.device });
      send(res, 201, { bundle: b.id, records: b.records.length, status: 'received' });
    });
  });
  return { server, records, bundles, blobs };
}

describe('a receiver written from the protocol page alone', () => {
  useFreshDb();
  const stranger = strangerReceiver();
  beforeAll(() => new Promise<void>((r) => stranger.server.listen(PORT, '127.0.0.1', r)));
  afterAll(() => new Promise<void>((r) => stranger.server.close(() => r())));

  it('takes every bundle a phone makes, logger days included, and the phone takes its answers as delivered', async () => {
    const s = await saveSite(site());
    const staff = Array.from({ length: 12 }, (_, i) => reading(s.id, T0 + i * QUARTER_HOUR_MS, 0.48 + i / 500));
    const check = reading(s.id, T0 + 13 * QUARTER_HOUR_MS, 0.51, { loggerCheck: { logger_m: 0.507 } });
    await importReadings([...staff, check]);
    // A simulated logger record (test/support/logger-records.ts: a storm on receding baseflow, 15-minute steps).
    const sim = loggerRecord(singleStorm(11, 15), 11);
    const raw_m = Float64Array.from(sim.discharge_m3s, (q) => Number(stageOf(q).toFixed(3)));
    const checks = [{ time_ms: sim.time_ms[0], staff_m: raw_m[0] + 0.004, logger_m: raw_m[0] }];
    const correction_m = driftCorrections(checks, sim.time_ms);
    const imported = await importLoggerRecord({ siteId: s.id, fileName: 'wren-vale-logger.csv', time_ms: sim.time_ms, raw_m, correction_m, checks });
    expect(imported.days).toBeGreaterThanOrEqual(4);

    const settings = { base: `http://127.0.0.1:${PORT}`, token: TOKEN };
    let sent = 0;
    for (let entry = await nextOutgoing(); entry; entry = await nextOutgoing()) {
      const outcome = await pushBundle(settings, entry.bundle);
      expect(outcome).toEqual({ kind: 'delivered', duplicate: false });
      expect(await acknowledge(entry.id)).toBe(true);
      if (++sent > 20) throw new Error('the outbox did not empty');
    }
    expect(await waitingCount()).toBe(0);
    const kinds = [...stranger.records.values()].map((r) => r.kind);
    expect(kinds.filter((k) => k === 'site')).toHaveLength(1);
    expect(kinds.filter((k) => k === 'reading')).toHaveLength(13);
    expect(kinds.filter((k) => k === 'logger-day')).toHaveLength(imported.days);
    const checkRecord = [...stranger.records.values()].find((r) => (r.body as { loggerCheck?: unknown }).loggerCheck);
    expect((checkRecord?.body as { loggerCheck: { logger_m: number } }).loggerCheck.logger_m).toBe(0.507);
    const values = [...stranger.records.values()].filter((r) => r.kind === 'logger-day').reduce((n, r) => n + (r.body as { offset_ms: number[] }).offset_ms.length, 0);
    expect(values).toBe(sim.time_ms.length);
    // The phone names itself when it pulls, so what it made itself does not come back (page: "Pull").
    const pulled = await pullBundles(settings, undefined);
    expect(pulled).toMatchObject({ kind: 'bundles', bundles: [] });
    expect(stranger.bundles.size).toBe(sent);
  });

  it('takes a photo: its bytes by PUT, checked by their hash, then the bundle with its record', async () => {
    const s = await saveSite(site());
    const r = await saveReading(reading(s.id, T0, 0.52));
    const bytes = Uint8Array.from({ length: 50_000 }, (_, i) => (i * 31 + (i >> 7)) % 256);
    const hex = createHash('sha256').update(bytes).digest('hex');
    await savePhoto({
      siteId: s.id, owner: { kind: 'reading', id: r.id }, width_px: 1024, height_px: 768, taken_ms: T0,
      image: { sha256: hex, bytes: bytes.length, type: 'image/jpeg', blob: new Blob([bytes], { type: 'image/jpeg' }) },
    });
    const run = await pushWaiting({ base: `http://127.0.0.1:${PORT}`, token: TOKEN });
    expect(run).toMatchObject({ kind: 'sent', setAside: 0 });
    expect(await waitingCount()).toBe(0);
    expect(stranger.blobs.get(hex)?.bytes.equals(Buffer.from(bytes))).toBe(true);
    const photo = [...stranger.records.values()].find((x) => x.kind === 'photo');
    expect((photo?.body as { sha256: string }).sha256).toBe(hex);
  });
});

// The receiver's answers to what one phone or a stranger can send that it cannot store or should not
// read: text PostgreSQL refuses (NUL, a lone surrogate), JSON nested 10,000 levels, posts without a
// token (refused before the body is read), and the rule that a phone pulls every bundle it did not make
// itself. Run once per engine, like the protocol suite. The refusals follow core/exchange/README.md.
import { request } from 'node:http';
import { connect, type Socket } from 'node:net';
import { beforeEach, describe, expect, it } from 'vitest';
import { bundleChecksum, MAX_BUNDLE_DEPTH, type Bundle, type SyncRecord } from '../../../core/index';
import { createDevice } from '../../../office/receiver/devices';
import { createReceiver } from '../../../office/receiver/http';
import { bundleOf, pullAll, push, readingRecords, siteRecord } from './phones';
import { useReceiver, type Engine } from './receiver-under-test';

const APP_ORIGIN = 'http://127.0.0.1:4649';
const LIMIT_BYTES = 256 * 1024;

/** The bundle with record `i`'s body changed by `edit`, checksummed again (as a phone would make it). */
function withBody(b: Bundle, i: number, edit: (body: Record<string, unknown>) => Record<string, unknown>): Bundle {
  const records = b.records.map((r, k) => (k === i ? { ...r, body: edit({ ...(r.body as unknown as Record<string, unknown>) }) } : r)) as SyncRecord[];
  return { ...b, records, checksum: bundleChecksum(records) };
}

/** Sends headers and the first bytes of a large body, then waits for an answer without sending the rest. */
function answerBeforeBody(port: number, headers: Record<string, string>): Promise<{ status: number; headers: Record<string, unknown> }> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, method: 'POST', path: '/bundles', headers: { ...headers, 'Content-Length': String(200 * 1024) } });
    req.on('response', (res) => {
      res.resume();
      resolve({ status: res.statusCode ?? 0, headers: res.headers });
      req.destroy();
    });
    req.on('error', reject);
    req.write('{"format":"freshet-bundle"');
  });
}

/** Registers the robustness tests for one engine. */
export function describeRobustness(engine: Engine): void {
  describe(`office receiver on ${engine.name}: what it cannot store, strangers, pull by device`, () => {
    const receiver = useReceiver(engine, { origin: APP_ORIGIN, maxBundleBytes: LIMIT_BYTES });
    const { base } = receiver;
    let token = '';

    beforeEach(async () => {
      token = await createDevice(receiver.db, 'phone A');
    });

    // PostgreSQL's jsonb refuses \u0000 (SQLSTATE 22P05) and an unpaired surrogate escape (22P02)
    // (PostgreSQL 15 manual, §8.14 JSON Types: "\u0000 is disallowed"; RFC 8259 §8.2 on unpaired surrogates).
    const unstorable: [string, (body: Record<string, unknown>) => Record<string, unknown>][] = [
      ['a NUL in a note', (body) => ({ ...body, note: 'logger export \u0000\u0000 junk' })],
      ['a lone surrogate in a note', (body) => ({ ...body, note: 'stage \ud800 read' })],
      ['a NUL in the name of a field the receiver does not read', (body) => ({ ...body, ['extra\u0000']: 1 })],
      [`JSON nested 10,000 levels in a field (the limit is ${MAX_BUNDLE_DEPTH})`, (body) => {
        let deep: unknown = [];
        for (let i = 1; i < 10_000; i++) deep = [deep];
        return { ...body, extra: deep };
      }],
    ];
    for (const [what, edit] of unstorable) {
      it(`answers ${what} with 400 'record' and the record's position, storing nothing of the bundle`, async () => {
        const b = withBody(bundleOf('dev-a', [siteRecord('dev-a'), ...readingRecords('dev-a', 4)]), 3, edit);
        const r = await push(base, token, b);
        expect(r.status).toBe(400);
        expect(r.body).toMatchObject({ reason: 'record', error: 'record', index: 3, kind: 'reading', id: b.records[3].id });
        expect(String(r.body.message)).toMatch(/^Record 4 of the bundle/);
        expect(await receiver.count('record_versions')).toBe(0);
        expect(await receiver.count('office_bundles')).toBe(0);
        // The same phone's next, clean bundle is taken: the refusal blocked nothing.
        expect((await push(base, token, bundleOf('dev-a', readingRecords('dev-a', 2)))).status).toBe(201);
      });
    }

    it('answers a post without a token, or with a wrong one, with 401 before reading its body', async () => {
      const none = await answerBeforeBody(engine.port, { 'Content-Type': 'application/json' });
      expect(none.status).toBe(401);
      const wrong = await answerBeforeBody(engine.port, { Authorization: `Bearer ${'q'.repeat(43)}`, Origin: APP_ORIGIN });
      expect(wrong.status).toBe(401);
      expect(wrong.headers['access-control-allow-origin']).toBe(APP_ORIGIN);
      expect(wrong.headers['freshet-max-bundle-bytes']).toBe(String(LIMIT_BYTES));
    });

    it('states its byte limit and CORS headers on every answer, refusals included', async () => {
      const b = bundleOf('dev-a', readingRecords('dev-a', 2));
      const h = { Origin: APP_ORIGIN, Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', 'Idempotency-Key': b.id };
      const answers = await Promise.all([
        fetch(`${base}/bundles`, { method: 'OPTIONS', headers: { Origin: APP_ORIGIN, 'Access-Control-Request-Method': 'POST' } }), // 204
        fetch(`${base}/bundles`, { method: 'POST', headers: h, body: JSON.stringify(b) }), // 201
        fetch(`${base}/bundles`, { method: 'POST', headers: h, body: 'not json' }), // 400
        fetch(`${base}/bundles`, { method: 'POST', headers: { ...h, Authorization: 'Bearer nope-nope-nope-nope' }, body: '{}' }), // 401
        fetch(`${base}/bundles`, { method: 'POST', headers: { ...h, Origin: 'https://elsewhere.example' }, body: '{}' }), // 403
        fetch(`${base}/elsewhere`, { headers: h }), // 404
        fetch(`${base}/bundles`, { method: 'POST', headers: h, body: 'x'.repeat(LIMIT_BYTES + 1) }), // 413
        fetch(`${base}/bundles?after=0`, { headers: h }), // 200
      ]);
      expect(answers.map((a) => a.status)).toEqual([204, 201, 400, 401, 403, 404, 413, 200]);
      for (const a of answers) {
        expect(a.headers.get('freshet-max-bundle-bytes')).toBe(String(LIMIT_BYTES));
        expect(a.headers.get('access-control-expose-headers')).toBe('Retry-After, Freshet-Max-Bundle-Bytes, Freshet-Max-Blob-Bytes');
        if (a.status !== 403) expect(a.headers.get('access-control-allow-origin')).toBe(APP_ORIGIN);
        if (a.status >= 400) {
          const body = (await a.json()) as { reason: string; message: string };
          expect(body.reason).toMatch(/^[a-z-]+$/);
          expect(body.message.length).toBeGreaterThan(20);
        }
      }
      expect(answers[4].headers.get('access-control-allow-origin')).toBe('https://elsewhere.example');
    });

    it('closes connections beyond its cap at once and cuts off a body that does not arrive in time (408)', async () => {
      const small = createReceiver({ db: receiver.db, origins: [], maxBundleBytes: LIMIT_BYTES, log: () => {}, maxConnections: 3, bodyReadLimit_ms: 400 });
      const port = engine.port + 10;
      await new Promise<void>((r) => small.listen(port, '127.0.0.1', r));
      try {
        // A body that stops after its first bytes: the receiver answers 408 once the read limit passes.
        const slow = await answerBeforeBody(port, { Authorization: `Bearer ${token}` });
        expect(slow.status).toBe(408);
        // Three idle connections fill the cap; a fourth is closed without an answer (the phone retries later).
        const idle = await Promise.all([0, 1, 2].map(() => new Promise<Socket>((r) => {
          const s: Socket = connect(port, '127.0.0.1', () => r(s));
        })));
        await new Promise((r) => setTimeout(r, 100));
        await expect(fetch(`http://127.0.0.1:${port}/`)).rejects.toThrow();
        for (const s of idle) s.destroy();
        await new Promise((r) => setTimeout(r, 100));
        expect((await fetch(`http://127.0.0.1:${port}/`)).status).toBe(200);
      } finally {
        small.closeAllConnections();
        await new Promise((r) => small.close(r));
      }
    });

    it('answers 503 busy with Retry-After when the bodies being read would pass its memory budget', async () => {
      // Budget: 4 bundles of the largest size (office/receiver/intake.ts); each stalled post announces the largest.
      const small = createReceiver({ db: receiver.db, origins: [], maxBundleBytes: 200 * 1024, log: () => {}, bodyReadLimit_ms: 1500 });
      const port = engine.port + 11;
      await new Promise<void>((r) => small.listen(port, '127.0.0.1', r));
      try {
        const stalled = [0, 1, 2, 3].map(() => answerBeforeBody(port, { Authorization: `Bearer ${token}` }));
        await new Promise((r) => setTimeout(r, 300));
        const fifth = await answerBeforeBody(port, { Authorization: `Bearer ${token}` });
        expect(fifth.status).toBe(503);
        expect(fifth.headers['retry-after']).toMatch(/^\d+$/);
        expect((await Promise.all(stalled)).map((a) => a.status)).toEqual([408, 408, 408, 408]);
        // The budget is given back: a whole bundle goes through again.
        const b = bundleOf('dev-a', readingRecords('dev-a', 2));
        expect((await push(`http://127.0.0.1:${port}`, token, b)).status).toBe(201);
      } finally {
        small.closeAllConnections();
        await new Promise((r) => small.close(r));
      }
    });

    it('hands a reinstalled phone (new device id, same token) every bundle, its old self\'s included', async () => {
      const tokenB = await createDevice(receiver.db, 'phone B');
      const a1 = bundleOf('dev-a', [siteRecord('dev-a'), ...readingRecords('dev-a', 3)]);
      const b1 = bundleOf('dev-b', readingRecords('dev-b', 2, 50));
      expect((await push(base, token, a1)).status).toBe(201);
      expect((await push(base, tokenB, b1)).status).toBe(201);
      // The old install leaves out only what it made itself.
      expect((await pullAll(base, token, '0', 'dev-a')).bundles.map((b) => b.id)).toEqual([b1.id]);
      // The same token on a fresh install (a new device id) gets both back.
      const fresh = await pullAll(base, token, '0', 'dev-a-reinstalled');
      expect(fresh.bundles.map((b) => b.id)).toEqual([a1.id, b1.id]);
      expect(fresh.bundles[0]).toEqual(a1);
      // Leaving out is by the bundle's device, not the token: phone B asking as dev-a gets only B's.
      expect((await pullAll(base, tokenB, '0', 'dev-a')).bundles.map((b) => b.id)).toEqual([b1.id]);
      const bad = await fetch(`${base}/bundles?device=`, { headers: { Authorization: `Bearer ${token}` } });
      expect(bad.status).toBe(400);
      expect(((await bad.json()) as { reason: string }).reason).toBe('device');
    });
  });
}

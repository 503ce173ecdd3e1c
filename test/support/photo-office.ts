// A small office for Node tests of photo delivery, written from the photos contract (not the receiver's
// code): POST /bundles keeps records and answers { bundle }, PUT /blobs/sha256-<hex> hashes what arrived
// (Node's crypto) and answers 201/200 or 400 reason "hash", HEAD and GET answer 200/404. It can damage the
// next uploads on purpose (one byte flipped on arrival), as a broken network would. 127.0.0.1, port 0.
import { createHash } from 'node:crypto';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { parseBundle, type SyncRecord } from '../../core/index';

/** The fake office: its base address, what it holds, the requests in order, and switches. */
export interface PhotoOffice {
  base: string;
  token: string;
  blobs: Map<string, { type: string; bytes: Buffer }>;
  records: SyncRecord[];
  /** "METHOD path" of every request, in order. */
  log: string[];
  /** Uploads still to damage on arrival. */
  damageNext: number;
  stop(): Promise<void>;
}

async function body(req: IncomingMessage): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of req) parts.push(c as Buffer);
  return Buffer.concat(parts);
}

/** Starts the fake office on a free port of 127.0.0.1. */
export async function startPhotoOffice(token = 'token-for-tests'): Promise<PhotoOffice> {
  const office: Omit<PhotoOffice, 'base' | 'stop'> = { token, blobs: new Map(), records: [], log: [], damageNext: 0 };
  const server: Server = createServer((req, res) => {
    void (async () => {
      const path = (req.url ?? '').split('?')[0];
      office.log.push(`${req.method} ${path}`);
      const answer = (status: number, json?: unknown, headers: Record<string, string> = {}) => {
        res.writeHead(status, { 'Freshet-Max-Blob-Bytes': '16777216', ...(json !== undefined ? { 'Content-Type': 'application/json' } : {}), ...headers });
        res.end(json !== undefined ? JSON.stringify(json) : undefined);
      };
      if (req.headers.authorization !== `Bearer ${token}`) return answer(401, { reason: 'token', message: 'Unknown token.' });
      const blob = /^\/blobs\/sha256-([0-9a-f]{64})$/.exec(path);
      if (blob) {
        const sha = blob[1];
        const held = office.blobs.get(sha);
        if (req.method === 'HEAD') return answer(held ? 200 : 404);
        if (req.method === 'GET') {
          if (!held) return answer(404, { reason: 'blob', message: 'Not held.' });
          res.writeHead(200, { 'Content-Type': held.type, 'Cache-Control': 'private, max-age=31536000, immutable' });
          return res.end(held.bytes);
        }
        if (req.method === 'PUT') {
          const type = String(req.headers['content-type'] ?? '');
          const got = await body(req);
          if (!['image/jpeg', 'image/png', 'image/webp'].includes(type)) return answer(415, { reason: 'type', message: 'Not an image type.' });
          if (office.damageNext > 0 && got.length > 0) {
            office.damageNext--;
            got[0] ^= 0xff;
          }
          if (createHash('sha256').update(got).digest('hex') !== sha) return answer(400, { reason: 'hash', message: 'The bytes do not hash to their name.' });
          const isNew = !held;
          if (isNew) office.blobs.set(sha, { type, bytes: got });
          return answer(isNew ? 201 : 200, { sha256: sha, bytes: got.length, stored: isNew ? 'new' : 'held' });
        }
      }
      if (path === '/bundles' && req.method === 'POST') {
        const b = parseBundle(JSON.parse((await body(req)).toString('utf8')));
        office.records.push(...b.records);
        return answer(201, { bundle: b.id, records: b.records.length, status: 'received' });
      }
      return answer(404, { reason: 'path', message: 'No such address.' });
    })().catch(() => {
      res.writeHead(500);
      res.end();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  return Object.assign(office, {
    base: `http://127.0.0.1:${port}`,
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  });
}

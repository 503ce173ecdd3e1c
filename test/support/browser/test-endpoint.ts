// A bundle endpoint for browser tests, on 127.0.0.1 and another port than the app (so another origin):
// answers CORS preflights, checks the bearer token and Idempotency-Key, stores each bundle once by id,
// serves pulls by its own sequence number, and can be told to misbehave for the next pushes (503, a
// captive-portal HTML page with 200, or dropping the connection after storing the bundle).
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { Bundle, SyncRecord } from '../../../core/index';

/** How the endpoint answers the next push: normally, 503 with Retry-After: 1, a login page, or no answer after storing. */
export type PushMode = 'normal' | 'busy' | 'portal' | 'drop-after-store';

/** One POST as the endpoint saw it. */
export interface PushSeen {
  key: string | undefined;
  device: string | undefined;
  status: number | 'dropped';
}

export interface TestEndpoint {
  base: string;
  /** Bundles stored, in arrival order, with the device (from the token) that sent them. */
  stored: { seq: number; device: string; bundle: Bundle }[];
  pushes: PushSeen[];
  /** Every pull (GET of the bundles) with the device that asked, in arrival order. */
  pulls: { device: string | undefined; at_ms: number }[];
  preflights: number;
  /** Answers for the next pushes, first first; 'normal' once the list is used up. */
  queue: PushMode[];
  /** Every record stored, one entry per record in each stored bundle. */
  records(): SyncRecord[];
  /** When set, a bundle holding a record this names a reason for is refused with 400 "record" naming it, as the receiver's bundle check does. */
  refuse?: (r: SyncRecord) => string | undefined;
  /** Stores a bundle as if the office itself had sent it (pulls give it to every phone). */
  addFromOffice(bundle: Bundle): void;
  stop(): Promise<void>;
}

const CORS = {
  'Access-Control-Allow-Methods': 'GET, POST, OPTIONS',
  'Access-Control-Allow-Headers': 'Authorization, Content-Type, Idempotency-Key',
  'Access-Control-Expose-Headers': 'Retry-After',
  'Access-Control-Max-Age': '600',
};

/** Starts the endpoint on 127.0.0.1:port under /api, accepting `tokens` (token → device name) from `origin`. */
export async function startTestEndpoint(port: number, origin: string, tokens: Record<string, string>): Promise<TestEndpoint> {
  const ep: TestEndpoint = {
    base: `http://127.0.0.1:${port}/api`,
    stored: [],
    pushes: [],
    pulls: [],
    preflights: 0,
    queue: [],
    records: () => ep.stored.flatMap((s) => s.bundle.records),
    addFromOffice: (bundle) => void ep.stored.push({ seq: ep.stored.length + 1, device: 'office', bundle }),
    stop: () => new Promise((done) => server.close(() => done())),
  };
  const allowOrigin = origin.replace(/\/$/, '');
  const json = (res: ServerResponse, status: number, body: unknown, extra: Record<string, string> = {}) => {
    res.writeHead(status, { 'Content-Type': 'application/json', 'Access-Control-Allow-Origin': allowOrigin, ...CORS, ...extra });
    res.end(JSON.stringify(body));
  };
  const server: Server = createServer((req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? '/', ep.base);
    if (req.method === 'OPTIONS') {
      ep.preflights++;
      res.writeHead(204, { 'Access-Control-Allow-Origin': allowOrigin, ...CORS });
      return res.end();
    }
    if (url.pathname !== '/api/bundles') return json(res, 404, { error: 'not-found', message: 'No such path.' });
    const auth = /^Bearer (\S+)$/.exec(req.headers.authorization ?? '');
    const device = auth ? tokens[auth[1]] : undefined;
    if (req.method === 'GET') {
      ep.pulls.push({ device, at_ms: Date.now() });
      if (!device) return json(res, 401, { error: 'token', message: 'Unknown token.' });
      const after = Number(url.searchParams.get('after') ?? '0');
      const bundles = ep.stored.filter((s) => s.seq > after && s.device !== device);
      return json(res, 200, { bundles: bundles.map((s) => s.bundle), cursor: String(ep.stored.length), more: false });
    }
    let body = '';
    req.on('data', (c: Buffer) => (body += c.toString('utf8')));
    req.on('end', () => {
      const key = req.headers['idempotency-key'] as string | undefined;
      const seen: PushSeen = { key, device, status: 0 };
      ep.pushes.push(seen);
      if (!device) {
        seen.status = 401;
        return json(res, 401, { error: 'token', message: 'Unknown token.' });
      }
      const mode = ep.queue.shift() ?? 'normal';
      if (mode === 'busy') {
        seen.status = 503;
        return json(res, 503, { error: 'busy', message: 'Try again shortly.' }, { 'Retry-After': '1' });
      }
      if (mode === 'portal') {
        seen.status = 200;
        res.writeHead(200, { 'Content-Type': 'text/html', 'Access-Control-Allow-Origin': allowOrigin });
        return res.end('<!doctype html><title>Sign in to the hotel Wi-Fi</title><form>Room number <input></form>');
      }
      const bundle = JSON.parse(body) as Bundle;
      if (key !== bundle.id) {
        seen.status = 400;
        return json(res, 400, { error: 'key', message: 'The Idempotency-Key is not the bundle id.' });
      }
      const refused = ep.refuse ? bundle.records.findIndex((r) => ep.refuse?.(r) !== undefined) : -1;
      if (refused >= 0) {
        seen.status = 400;
        return json(res, 400, { error: 'record', index: refused, message: `Record ${refused + 1} of the bundle ${ep.refuse?.(bundle.records[refused])}` });
      }
      const had = ep.stored.some((s) => s.bundle.id === bundle.id);
      if (!had) ep.stored.push({ seq: ep.stored.length + 1, device, bundle });
      if (mode === 'drop-after-store') {
        seen.status = 'dropped';
        req.socket.destroy();
        return;
      }
      seen.status = had ? 200 : 201;
      json(res, had ? 200 : 201, { bundle: bundle.id, records: bundle.records.length });
    });
  });
  await new Promise<void>((ready) => server.listen(port, '127.0.0.1', ready));
  return ep;
}

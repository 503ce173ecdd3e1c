// The receiver's HTTP side: POST /bundles (push) and GET /bundles?after=<cursor> (pull), bearer tokens,
// CORS for the configured app origins with preflights, a size limit per bundle, one log line per request.
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { performance } from 'node:perf_hooks';
import { BundleError, parseBundle, type Bundle } from '../../core/index';
import type { Database } from './db';
import { createPushGate, type PushGate } from './admission';
import { authenticate, type AuthenticatedDevice } from './devices';
import { IntegrityError, pullBundles, storeBundle, type StoreOptions } from './store';

/** Largest bundle the receiver accepts by default, bytes of request body (16 MiB, ~40,000 readings). */
export const DEFAULT_MAX_BUNDLE_BYTES = 16 * 1024 * 1024;

/** What the receiver needs: the database, the app origins allowed by CORS, the size limit and a log sink. */
export interface ReceiverOptions {
  db: Database;
  /** Exact origins (scheme://host[:port]) whose pages may call the receiver, e.g. "https://app.example.org". */
  origins: readonly string[];
  /** Largest request body accepted for a push, bytes. */
  maxBundleBytes?: number;
  /** Where the one line per request goes (default: stdout). */
  log?: (line: string) => void;
  store?: StoreOptions;
  /** Most pushes held at once (reading, waiting for the database, storing); more are answered 503 (admission.ts). */
  maxPushes?: number;
}

// A refusal answered as JSON: status, a short machine reason and a sentence for people.
class Refusal extends Error {
  constructor(readonly status: number, readonly reason: string, message: string) {
    super(message);
  }
}

interface LogFields {
  device?: string;
  bundle?: string;
  records?: number;
  outcome?: string;
}

/** Creates the HTTP server (not yet listening) for the bundle protocol. */
export function createReceiver(options: ReceiverOptions): Server {
  const origins = new Set(options.origins);
  const maxBytes = options.maxBundleBytes ?? DEFAULT_MAX_BUNDLE_BYTES;
  const log = options.log ?? ((line: string) => process.stdout.write(line + '\n'));
  const gate = createPushGate(options.maxPushes);
  return createServer((req, res) => {
    const t0 = performance.now();
    const fields: LogFields = {};
    const url = new URL(req.url ?? '/', 'http://receiver.invalid');
    const finish = (status: number) => {
      const ms = Math.round(performance.now() - t0);
      log(
        `${new Date().toISOString()} ${req.method} ${url.pathname} device=${fields.device ?? '-'} bundle=${fields.bundle ?? '-'} ` +
          `records=${fields.records ?? '-'} outcome=${status}${fields.outcome ? ` ${fields.outcome}` : ''} ${ms}ms`,
      );
    };
    handle(req, res, url, fields, { ...options, origins, maxBytes, gate })
      .then((status) => finish(status))
      .catch((err: unknown) => {
        const refusal = err instanceof Refusal ? err : null;
        // A database failure is the office's trouble, not the phone's: 503 with Retry-After, so it tries later.
        const status = refusal ? refusal.status : 503;
        if (!refusal && !res.headersSent) res.setHeader('Retry-After', '60');
        fields.outcome = refusal ? refusal.reason : `error: ${err instanceof Error ? err.message : String(err)}`;
        if (!res.headersSent) {
          const message = refusal ? refusal.message : 'The office receiver failed to store or read bundles; nothing was stored. Try again later.';
          sendJson(res, status, { error: refusal ? refusal.reason : 'server', message });
        } else {
          res.destroy();
        }
        finish(status);
      });
  });
}

type Ctx = Omit<ReceiverOptions, 'origins'> & { origins: Set<string>; maxBytes: number; gate: PushGate };

async function handle(req: IncomingMessage, res: ServerResponse, url: URL, fields: LogFields, ctx: Ctx): Promise<number> {
  const origin = req.headers.origin;
  if (origin !== undefined) {
    if (!ctx.origins.has(origin)) {
      throw new Refusal(403, 'origin', `Pages from ${origin} may not use this receiver; start it with --origin ${origin} to allow them.`);
    }
    res.setHeader('Access-Control-Allow-Origin', origin);
    res.setHeader('Access-Control-Expose-Headers', 'Retry-After');
  }
  res.setHeader('Vary', 'Origin');
  const path = url.pathname.replace(/\/+$/, '') || '/';
  if (path === '/') {
    if (req.method !== 'GET') throw new Refusal(405, 'method', 'Only GET is answered at the root.');
    return sendJson(res, 200, { service: 'freshet office receiver', bundles: '/bundles' });
  }
  if (path !== '/bundles') throw new Refusal(404, 'path', `Nothing at ${url.pathname}; the bundle endpoint is /bundles.`);
  if (req.method === 'OPTIONS') {
    res.setHeader('Access-Control-Allow-Methods', 'GET, POST, OPTIONS');
    res.setHeader('Access-Control-Allow-Headers', 'Authorization, Content-Type, Idempotency-Key');
    res.setHeader('Access-Control-Max-Age', '600');
    res.writeHead(204).end();
    return 204;
  }
  if (req.method !== 'GET' && req.method !== 'POST') {
    throw new Refusal(405, 'method', `${req.method} is not answered at /bundles; push with POST, pull with GET.`);
  }
  if (req.method === 'POST') {
    // Refuse an announced oversized body before reading it or touching the database.
    const announced = Number(req.headers['content-length'] ?? NaN);
    if (Number.isFinite(announced) && announced > ctx.maxBytes) {
      res.setHeader('Connection', 'close');
      throw tooLarge(ctx.maxBytes);
    }
    admit(res, ctx.gate);
  }
  // The body is read before the token is looked up: the lookup may wait behind other pushes, and a
  // request whose body sits unread that long would be cut off by the server's request timeout.
  const text = req.method === 'POST' ? await readBody(req, ctx.maxBytes) : '';
  const device = await authorise(ctx.db, req.headers.authorization);
  fields.device = device.name;
  if (req.method === 'GET') return pull(res, url, fields, ctx, device);
  return push(req, text, res, fields, ctx, device);
}

async function authorise(db: Database, header: string | undefined): Promise<AuthenticatedDevice> {
  const a = await authenticate(db, header);
  if (a.ok) return a.device;
  const message = {
    missing: 'This request carries no token: send "Authorization: Bearer <token>" with the token the office gave this device.',
    unknown: 'The office does not know this token: check the token in the sync settings, or ask the office for a new one.',
    revoked: 'The office has revoked this device\'s token: ask the office for a new one.',
  }[a.reason];
  // The protocol (core/exchange/README.md): 401 for no token or an unknown one, 403 for a revoked one.
  throw new Refusal(a.reason === 'revoked' ? 403 : 401, `token-${a.reason}`, message);
}

// Back-pressure (admission.ts): a push beyond the cap is refused before its body is read; an admitted
// push keeps its place until its answer is sent or its connection closes.
function admit(res: ServerResponse, gate: PushGate): void {
  const leave = gate.tryEnter();
  if (leave === null) {
    res.setHeader('Retry-After', String(gate.retryAfterSeconds()));
    throw new Refusal(503, 'busy', 'The office is busy storing bundles from other devices; nothing of this bundle was stored. Send it again after the wait given.');
  }
  res.once('close', leave);
}

function tooLarge(maxBytes: number): Refusal {
  const mib = (maxBytes / 1024 / 1024).toFixed(maxBytes % (1024 * 1024) === 0 ? 0 : 1);
  return new Refusal(413, 'size', `The bundle is larger than this receiver accepts (${mib} MiB); send the records in smaller bundles.`);
}

async function push(
  req: IncomingMessage,
  text: string,
  res: ServerResponse,
  fields: LogFields,
  ctx: Ctx,
  device: AuthenticatedDevice,
): Promise<number> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new Refusal(400, 'json', 'The request body is not JSON: a push carries one bundle as a JSON document.');
  }
  let bundle: Bundle;
  try {
    bundle = parseBundle(json);
  } catch (err) {
    if (err instanceof BundleError) throw new Refusal(400, err.reason, err.message);
    throw err;
  }
  fields.bundle = bundle.id;
  fields.records = bundle.records.length;
  const key = req.headers['idempotency-key'];
  if (key !== undefined && key !== bundle.id) {
    throw new Refusal(400, 'key', `The Idempotency-Key header must be the bundle's id (${bundle.id}); got ${JSON.stringify(key)}.`);
  }
  try {
    const out = await storeBundle(ctx.db, bundle, device.deviceNo, ctx.store);
    if (out.status === 'had') {
      fields.outcome = 'already had';
      return sendJson(res, 200, { bundle: bundle.id, records: bundle.records.length, status: 'already-received' });
    }
    fields.outcome = `stored ${out.newVersions} new versions`;
    return sendJson(res, 201, { bundle: bundle.id, records: bundle.records.length, status: 'received', newVersions: out.newVersions });
  } catch (err) {
    if (err instanceof IntegrityError) throw new Refusal(409, err.reason, err.message);
    throw err;
  }
}

async function pull(res: ServerResponse, url: URL, fields: LogFields, ctx: Ctx, device: AuthenticatedDevice): Promise<number> {
  const after = url.searchParams.get('after') ?? '0';
  if (!/^(0|[1-9]\d{0,15})$/.test(after)) {
    throw new Refusal(400, 'cursor', `The cursor must be one this receiver handed out (digits only) or absent; got ${JSON.stringify(after)}.`);
  }
  const page = await pullBundles(ctx.db, Number(after), device.deviceNo);
  fields.records = page.documents.length;
  fields.outcome = `sent ${page.documents.length} bundles`;
  // The stored documents are already JSON: join them as they are rather than parse and re-serialise.
  const body = `{"bundles":[${page.documents.join(',')}],"cursor":"${page.cursor}","more":${page.more}}`;
  res.writeHead(200, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(body);
  return 200;
}

function readBody(req: IncomingMessage, maxBytes: number): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    let refused = false;
    req.on('data', (chunk: Buffer) => {
      if (refused) return;
      size += chunk.length;
      if (size > maxBytes) {
        refused = true;
        reject(tooLarge(maxBytes));
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => {
      if (!refused) resolve(Buffer.concat(chunks).toString('utf8'));
    });
    req.on('error', reject);
  });
}

function sendJson(res: ServerResponse, status: number, value: unknown): number {
  // After an oversized body the rest of it is not read: the connection cannot carry another request.
  if (status === 413) res.setHeader('Connection', 'close');
  if (status === 401) res.setHeader('WWW-Authenticate', 'Bearer');
  res.writeHead(status, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(JSON.stringify(value));
  return status;
}

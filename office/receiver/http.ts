// The receiver's HTTP side: POST /bundles (push) and GET /bundles?after=<cursor> (pull), photo bytes at
// /blobs/sha256-<hex> (blobs.ts), bearer tokens, CORS for the configured app origins with preflights (and
// on every refusal, so the app can read why), a size limit per bundle stated in every answer, the token
// checked before the body is read, one log line per request. A record the database cannot store is the
// record's fault (400), never the office's (503).
import { createHash } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { performance } from 'node:perf_hooks';
import { BundleError, parseBundle, refuseBundleBlobs, type Bundle } from '../../core/index';
import type { Database } from './db';
import { createPushGate, type PushGate } from './admission';
import { authenticate, type AuthenticatedDevice } from './devices';
import { IntegrityError, pullBundles, storeBundle, type StoreOptions } from './store';
import { BODY_BUDGET_BUNDLES, BODY_READ_LIMIT_MS, BodyBudget, DEFAULT_MAX_CONNECTIONS, readBody, tooLarge } from './intake';
import { findUnstorableRecord, isDataError, positionOf, Refusal } from './refusal';
import { DatabaseDown } from './keep-open';
import { handleBlob, isBlobPath, MAX_BLOB_BYTES, MAX_BLOB_BYTES_HEADER } from './blobs';

/** Largest bundle the receiver accepts by default, bytes of request body (16 MiB, ~40,000 readings). */
export const DEFAULT_MAX_BUNDLE_BYTES = 16 * 1024 * 1024;
/** The answer header that states the receiver's bundle limit in bytes (on every answer). */
export const MAX_BYTES_HEADER = 'Freshet-Max-Bundle-Bytes';
/** Seconds a phone is asked to wait after the database failed or could not be reached. */
export const DATABASE_RETRY_S = 30;

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
  /** Most connections held open at once (default DEFAULT_MAX_CONNECTIONS); more are closed at once. */
  maxConnections?: number;
  /** Longest a push may take to send its body, ms (default BODY_READ_LIMIT_MS); then 408. */
  bodyReadLimit_ms?: number;
  /** Most pushes held at once (reading, waiting for the database, storing); more are answered 503 (admission.ts). */
  maxPushes?: number;
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
  const budget = new BodyBudget(BODY_BUDGET_BUNDLES * maxBytes);
  const gate = createPushGate(options.maxPushes);
  const server = createServer((req, res) => {
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
    handle(req, res, url, fields, { ...options, origins, maxBytes, budget, gate })
      .then((status) => finish(status))
      .catch((err: unknown) => finish(answerFailure(res, err, fields)));
  });
  limitConnections(server, options.maxConnections ?? DEFAULT_MAX_CONNECTIONS);
  return server;
}

// A refusal as its JSON answer; anything else (the database lost, failing or locked) is the office's
// trouble, not the phone's: 503 with Retry-After, so the phone tries again later. Returns the status.
function answerFailure(res: ServerResponse, err: unknown, fields: LogFields): number {
  const refusal = err instanceof Refusal
    ? err
    : new Refusal(503, 'unavailable', 'The office receiver could not reach its database just now; nothing was stored. The phone tries again later.', undefined,
      err instanceof DatabaseDown ? err.retryAfter_s : DATABASE_RETRY_S);
  fields.outcome = err instanceof Refusal ? err.reason : `error: ${err instanceof Error ? err.message : String(err)}`;
  if (res.headersSent) {
    res.destroy();
    return refusal.status;
  }
  if (refusal.retryAfter_s !== undefined) res.setHeader('Retry-After', String(refusal.retryAfter_s));
  return sendJson(res, refusal.status, refusal.answer());
}

// Connections beyond the cap are closed as they arrive; a request whose headers or body dawdle is cut off.
function limitConnections(server: Server, max: number): void {
  server.maxConnections = max;
  server.headersTimeout = 20_000;
  server.requestTimeout = 180_000;
}

type Ctx = Omit<ReceiverOptions, 'origins'> & { origins: Set<string>; maxBytes: number; budget: BodyBudget; gate: PushGate };

// CORS headers on every answer to a page, refusals included, so the app can read what is wrong. A page
// from an origin not in the list is let through the preflight and then refused (403 'origin') with a
// sentence, rather than failing as if there were no connection; nothing is stored or read for it.
function applyCors(req: IncomingMessage, res: ServerResponse, ctx: Ctx): void {
  res.setHeader('Vary', 'Origin');
  const origin = req.headers.origin;
  if (origin === undefined) return;
  res.setHeader('Access-Control-Allow-Origin', origin);
  res.setHeader('Access-Control-Expose-Headers', `Retry-After, ${MAX_BYTES_HEADER}, ${MAX_BLOB_BYTES_HEADER}`);
  if (req.method !== 'OPTIONS' && !ctx.origins.has(origin)) {
    throw new Refusal(403, 'origin', `Pages from ${origin} may not use this office receiver; the office starts it with --origin ${origin} to allow them.`);
  }
}

async function handle(req: IncomingMessage, res: ServerResponse, url: URL, fields: LogFields, ctx: Ctx): Promise<number> {
  res.setHeader(MAX_BYTES_HEADER, String(ctx.maxBytes));
  res.setHeader(MAX_BLOB_BYTES_HEADER, String(MAX_BLOB_BYTES));
  applyCors(req, res, ctx);
  const path = url.pathname.replace(/\/+$/, '') || '/';
  if (isBlobPath(path)) {
    const authoriseBlob = async () => (await authorise(ctx.db, req.headers.authorization)).name;
    return handleBlob(req, res, path, fields, { db: ctx.db, budget: ctx.budget, bodyReadLimit_ms: ctx.bodyReadLimit_ms, authorise: authoriseBlob });
  }
  if (path === '/') {
    if (req.method !== 'GET') throw new Refusal(405, 'method', 'Only GET is answered at the root.');
    return sendJson(res, 200, { service: 'freshet office receiver', bundles: '/bundles', blobs: '/blobs' });
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
  // The token is checked before a byte of the body is read: a stranger's post is never held in memory.
  const device = await authorise(ctx.db, req.headers.authorization);
  fields.device = device.name;
  if (req.method === 'GET') return pull(res, url, fields, ctx, device);
  const text = await readBody(req, ctx.maxBytes, ctx.budget, ctx.bodyReadLimit_ms ?? BODY_READ_LIMIT_MS);
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
    throw new Refusal(503, 'busy', 'The office is busy storing bundles from other devices; nothing of this bundle was stored. Send it again after the wait given.', undefined, gate.retryAfterSeconds());
  }
  res.once('close', leave);
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
    refuseBundleBlobs(json);
    bundle = parseBundle(json, nodeSha256);
  } catch (err) {
    if (!(err instanceof BundleError)) throw err;
    const records = (json as { records?: unknown }).records;
    const at = err.recordIndex !== undefined && Array.isArray(records) ? positionOf(records, err.recordIndex) : undefined;
    throw new Refusal(400, err.reason, err.message, at);
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
    if (isDataError(err)) throw await unstorable(ctx.db, bundle, err as Error);
    throw err;
  }
}

// The database refused a value of the bundle (text it cannot hold, a jsonb limit): find the record and
// refuse it by position, so the phone can set it aside; nothing of the bundle was stored.
async function unstorable(db: Database, bundle: Bundle, err: Error): Promise<Refusal> {
  const found = await findUnstorableRecord(db, bundle.records);
  if (found === undefined) {
    return new Refusal(400, 'shape', `The office database cannot store this bundle's own fields (${err.message}); nothing of it was stored.`);
  }
  const at = positionOf(bundle.records, found.index);
  return new Refusal(400, 'record',
    `Record ${found.index + 1} of the bundle (${at.kind} ${at.id}) holds a value the office database cannot store (${found.why}); nothing of the bundle was stored.`, at);
}

async function pull(res: ServerResponse, url: URL, fields: LogFields, ctx: Ctx, device: AuthenticatedDevice): Promise<number> {
  const after = url.searchParams.get('after') ?? '0';
  if (!/^(0|[1-9]\d{0,15})$/.test(after)) {
    throw new Refusal(400, 'cursor', `The cursor must be one this receiver handed out (digits only) or absent; got ${JSON.stringify(after)}.`);
  }
  const page = await pullBundles(ctx.db, Number(after), askingDevice(url));
  fields.records = page.documents.length;
  fields.outcome = `sent ${page.documents.length} bundles`;
  // The stored documents are already JSON: join them as they are rather than parse and re-serialise.
  const body = `{"bundles":[${page.documents.join(',')}],"cursor":"${page.cursor}","more":${page.more}}`;
  res.writeHead(200, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(body);
  return 200;
}

// The phone's own device id (`device=` in the pull's query): its own bundles are left out of the answer.
function askingDevice(url: URL): string | undefined {
  const id = url.searchParams.get('device');
  if (id === null) return undefined;
  if (id.trim() === '' || id.length > 200 || /[\u0000-\u001f]/.test(id)) {
    throw new Refusal(400, 'device', `The device parameter must be the phone's device id as its bundles give it (1 to 200 characters); got ${id.length} characters.`);
  }
  return id;
}

/** The checksum's SHA-256 from Node's crypto (native; several times faster than core's portable one). */
export function nodeSha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

function sendJson(res: ServerResponse, status: number, value: unknown): number {
  // After an oversized or too slow body the rest of it is not read: the connection cannot carry another
  // request. After other refusals Node reads and discards the rest of the body (holding none of it), so
  // the sender gets the answer rather than a connection reset in the middle of its upload.
  if (status === 413 || status === 408) res.setHeader('Connection', 'close');
  if (status === 401) res.setHeader('WWW-Authenticate', 'Bearer');
  res.writeHead(status, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(JSON.stringify(value));
  return status;
}

// Photo bytes at the office: PUT, HEAD and GET {base}/blobs/sha256-<hex> (core/exchange/README.md,
// "Photo bytes"). The bytes are content-addressed: the name is the SHA-256 of the bytes, checked while the
// body streams in; they are kept in the receiver's database (table office_blobs), so one backup of the
// database holds the records and their photos together. The token is checked before a byte of the body is
// read; the body is read within the blob limit, the read-time limit and the memory budget shared with pushes.
import { createHash } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { MAX_PHOTO_BYTES, PHOTO_TYPES } from '../../core/index';
import type { Queryable } from './db';
import { blobInfo, insertBlob, readBlob } from './blob-store';
import { BODY_READ_LIMIT_MS, readBodyBytes, type BodyBudget } from './intake';
import { Refusal } from './refusal';

/** The largest photo the receiver takes, bytes (16 MiB, the photo record's limit); stated in every answer's MAX_BLOB_BYTES_HEADER. */
export const MAX_BLOB_BYTES = MAX_PHOTO_BYTES;
/** The answer header that states the receiver's photo limit in bytes (on every answer). */
export const MAX_BLOB_BYTES_HEADER = 'Freshet-Max-Blob-Bytes';
/** The media types a photo may have (the photo record's). */
export const BLOB_TYPES: readonly string[] = PHOTO_TYPES;
/** The path of the blob endpoint, below the base. */
export const BLOBS_PATH = '/blobs';

const NAME = /^\/blobs\/sha256-([0-9a-f]{64})$/;

/** What the blob endpoint needs from the receiver: its database, the body budget and read-time limit, and the token check. */
export interface BlobContext {
  db: Queryable;
  budget: BodyBudget;
  bodyReadLimit_ms?: number;
  /** Checks the request's token (throws the 401/403 refusal); resolves to the device's name for the log. */
  authorise: () => Promise<string>;
}

/** The log fields a blob request fills in. */
export interface BlobLogFields {
  device?: string;
  outcome?: string;
}

/** True when `path` (trailing slashes removed) is for the blob endpoint. */
export function isBlobPath(path: string): boolean {
  return path === BLOBS_PATH || path.startsWith(`${BLOBS_PATH}/`);
}

/** Answers one request to the blob endpoint; resolves to the status sent (refusals are thrown as Refusal). */
export async function handleBlob(req: IncomingMessage, res: ServerResponse, path: string, fields: BlobLogFields, ctx: BlobContext): Promise<number> {
  const m = NAME.exec(path);
  if (m === null) {
    throw new Refusal(404, 'path', `Nothing at ${path}; a photo's address is /blobs/sha256- followed by the 64 lower-case hex digits of its SHA-256.`);
  }
  const sha256 = m[1];
  if (req.method === 'OPTIONS') {
    res.setHeader('Access-Control-Allow-Methods', 'GET, HEAD, PUT, OPTIONS');
    res.setHeader('Access-Control-Allow-Headers', 'Authorization, Content-Type');
    res.setHeader('Access-Control-Max-Age', '600');
    res.writeHead(204).end();
    return 204;
  }
  if (req.method !== 'GET' && req.method !== 'HEAD' && req.method !== 'PUT') {
    throw new Refusal(405, 'method', `${req.method} is not answered at /blobs; send a photo with PUT, ask for it with GET or HEAD.`);
  }
  // The token first: a stranger learns nothing, and its body is never read.
  fields.device = await ctx.authorise();
  if (req.method === 'PUT') return put(req, res, sha256, fields, ctx);
  if (req.method === 'HEAD') {
    const row = await blobInfo(ctx.db, sha256);
    if (row === undefined) throw notHeld(sha256);
    fields.outcome = 'held';
    res.writeHead(200, { 'Content-Type': row.type, 'Content-Length': String(row.bytes), 'Cache-Control': 'no-store' });
    res.end();
    return 200;
  }
  const row = await readBlob(ctx.db, sha256);
  if (row === undefined) throw notHeld(sha256);
  const data = row.data;
  fields.outcome = `sent ${data.length} bytes`;
  res.writeHead(200, {
    'Content-Type': row.type,
    'Content-Length': String(data.length),
    'Cache-Control': 'private, max-age=31536000, immutable',
    'X-Content-Type-Options': 'nosniff',
  });
  res.end(data);
  return 200;
}

function notHeld(sha256: string): Refusal {
  return new Refusal(404, 'blob', `The office does not hold the photo ${sha256.slice(0, 12)}… yet; it arrives when the phone that took it next sends.`);
}

async function put(req: IncomingMessage, res: ServerResponse, sha256: string, fields: BlobLogFields, ctx: BlobContext): Promise<number> {
  const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
  if (!BLOB_TYPES.includes(type)) {
    throw new Refusal(415, 'type', `A photo must be sent as ${BLOB_TYPES.join(', ')}; this one was sent as ${JSON.stringify(type || 'no type')}.`);
  }
  const announced = Number(req.headers['content-length'] ?? NaN);
  if (Number.isFinite(announced) && announced > MAX_BLOB_BYTES) {
    res.setHeader('Connection', 'close');
    throw blobTooLarge();
  }
  const held = await blobInfo(ctx.db, sha256);
  if (held !== undefined) {
    // Already held (the name is the hash of the bytes the office checked): the body is not needed.
    fields.outcome = 'already held';
    return sendJson(res, 200, { sha256, bytes: held.bytes, stored: 'held' });
  }
  const { data, hex } = await readHashedBody(req, ctx.budget, ctx.bodyReadLimit_ms ?? BODY_READ_LIMIT_MS);
  if (data.length === 0) throw new Refusal(400, 'size', 'The photo arrived empty; nothing was stored. Send it again.');
  if (hex !== sha256) {
    throw new Refusal(400, 'hash', `The photo's bytes do not match its name (they hash to ${hex.slice(0, 12)}…, the name says ${sha256.slice(0, 12)}…): it was damaged on the way. Nothing was stored; send it again.`);
  }
  const isNew = await insertBlob(ctx.db, sha256, type, data);
  fields.outcome = isNew ? `stored ${data.length} bytes` : 'already held';
  return sendJson(res, isNew ? 201 : 200, { sha256, bytes: data.length, stored: isNew ? 'new' : 'held' });
}

/** The refusal of a photo over MAX_BLOB_BYTES, with the limit in MiB. */
export function blobTooLarge(): Refusal {
  return new Refusal(413, 'size', `The photo is larger than this office takes (16 MiB, ${MAX_BLOB_BYTES} bytes); nothing was stored.`);
}

/**
 * Reads a request body as bytes, hashing them (SHA-256) as they arrive: at most MAX_BLOB_BYTES, within
 * `limit_ms`, holding its share of `budget`. Refusals: 413 over the size, 408 too slow, 503 busy.
 */
export async function readHashedBody(req: IncomingMessage, budget: BodyBudget, limit_ms: number): Promise<{ data: Buffer; hex: string }> {
  const hash = createHash('sha256');
  const data = await readBodyBytes(req, budget, limit_ms, { maxBytes: MAX_BLOB_BYTES, what: 'uploads', tooLarge: blobTooLarge, onChunk: (c) => hash.update(c) });
  return { data, hex: hash.digest('hex') };
}

function sendJson(res: ServerResponse, status: number, value: unknown): number {
  res.writeHead(status, { 'Content-Type': 'application/json; charset=utf-8', 'Cache-Control': 'no-store' });
  res.end(JSON.stringify(value));
  return status;
}

// How the receiver takes request bodies in: only after the token is accepted, within a byte limit and a
// time limit, and within a budget of bytes held in memory by all requests at once, so that neither many
// large posts nor slow senders can grow the process without bound.
import type { IncomingMessage } from 'node:http';
import { Refusal } from './refusal';

/** Longest a push may take to send its body, ms (a phone on a slow link sends 16 MiB in well under this). */
export const BODY_READ_LIMIT_MS = 120_000;
/** Most connections the receiver holds open at once; further ones are closed at once (the phone retries). */
export const DEFAULT_MAX_CONNECTIONS = 256;
/** How many bundles of the largest size may be held in memory at once (the byte budget is this × the limit). */
export const BODY_BUDGET_BUNDLES = 4;
/** Seconds a phone is asked to wait when the body budget is full. */
export const BUSY_RETRY_S = 15;

/** Bytes of request bodies held at once by all requests: a push reserves its size before reading. */
export class BodyBudget {
  private used = 0;
  constructor(readonly totalBytes: number) {}
  /** Reserves n bytes; false when that would pass the budget (one request is always let through alone). */
  reserve(n: number): boolean {
    if (this.used > 0 && this.used + n > this.totalBytes) return false;
    this.used += n;
    return true;
  }
  /** Gives back n bytes reserved before. */
  release(n: number): void {
    this.used = Math.max(0, this.used - n);
  }
}

/** The refusal of a body over `maxBytes`, with the limit in MiB. */
export function tooLarge(maxBytes: number): Refusal {
  const mib = (maxBytes / 1024 / 1024).toFixed(maxBytes % (1024 * 1024) === 0 ? 0 : 1);
  return new Refusal(413, 'size', `The bundle is larger than this receiver accepts (${mib} MiB, ${maxBytes} bytes); send the records in smaller bundles.`);
}

/**
 * Reads a request body as UTF-8 text: at most `maxBytes`, within `limit_ms`, holding at most its share of
 * `budget`. Refusals: 413 over the size, 408 too slow, 503 (with Retry-After) when the budget is full.
 */
export async function readBody(req: IncomingMessage, maxBytes: number, budget: BodyBudget, limit_ms = BODY_READ_LIMIT_MS): Promise<string> {
  const bytes = await readBodyBytes(req, budget, limit_ms, { maxBytes, what: 'bundles', tooLarge: () => tooLarge(maxBytes) });
  return bytes.toString('utf8');
}

/** What readBodyBytes reads: its size limit and refusal, the plural used in sentences, and a look at each chunk. */
export interface BodyRead {
  maxBytes: number;
  /** Plural noun for the user's sentences: "bundles", "uploads". */
  what: string;
  tooLarge: () => Refusal;
  onChunk?: (chunk: Buffer) => void;
}

/**
 * Reads a request body as bytes: at most `read.maxBytes`, within `limit_ms`, holding its share of `budget`
 * (the announced length, else the limit). The one body reader of the receiver (bundles and photo bytes).
 * Refusals: 413 over the size, 408 too slow, 503 (with Retry-After) when the budget is full.
 */
export async function readBodyBytes(req: IncomingMessage, budget: BodyBudget, limit_ms: number, read: BodyRead): Promise<Buffer> {
  const announced = Number(req.headers['content-length'] ?? NaN);
  const reserved = Number.isFinite(announced) && announced >= 0 ? announced : read.maxBytes;
  if (!budget.reserve(reserved)) {
    throw new Refusal(503, 'busy', `The office receiver is taking in many ${read.what} just now; the phone tries again shortly.`, undefined, BUSY_RETRY_S);
  }
  try {
    return await new Promise<Buffer>((resolve, reject) => {
      const chunks: Buffer[] = [];
      let size = 0;
      const stop = (refusal: Refusal) => {
        clearTimeout(timer);
        req.removeAllListeners('data');
        req.pause();
        reject(refusal);
      };
      const noun = read.what === 'bundles' ? 'The bundle' : 'The photo';
      const timer = setTimeout(() => {
        stop(new Refusal(408, 'slow', `${noun} did not arrive within ${limit_ms / 1000} s; the phone tries again.`));
      }, limit_ms);
      req.on('data', (chunk: Buffer) => {
        size += chunk.length;
        if (size > read.maxBytes) {
          stop(read.tooLarge());
          return;
        }
        read.onChunk?.(chunk);
        chunks.push(chunk);
      });
      req.on('end', () => {
        clearTimeout(timer);
        resolve(Buffer.concat(chunks));
      });
      req.on('error', (err) => {
        clearTimeout(timer);
        reject(err);
      });
    });
  } finally {
    budget.release(reserved);
  }
}

// The two requests of the protocol (core/exchange/README.md): push one bundle, pull bundles after a
// cursor. Both cross origins with a bearer token (a preflighted CORS request, no cookies).
import { MAX_BUNDLE_BYTES_HEADER, parseBundle, readPushAnswer, retryAfter_ms, type Bundle, type PushAnswer, type PushOutcome } from '../../core/index';
import type { SyncSettings } from '../db/schema';
import { deviceId } from '../db/clock';
import { plainError } from '../plain-words';

/** How long a request may take before it is given up and treated as a network failure, ms. */
export const REQUEST_TIMEOUT_MS = 60_000;

/** One request to the office (CORS, no cookies, a time limit); undefined when no answer came. */
export async function send(url: string, init: RequestInit): Promise<Response | undefined> {
  try {
    return await fetch(url, { ...init, mode: 'cors', credentials: 'omit', cache: 'no-store', redirect: 'follow', signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS) });
  } catch {
    // Offline, refused, dropped, blocked by CORS or timed out: all mean "no answer".
    return undefined;
  }
}

/** The body of an answer as text ('' when it cannot be read). */
export async function text(res: Response): Promise<string> {
  try {
    return await res.text();
  } catch {
    return '';
  }
}

/** An answer to a push: what it means, the answer as read, and the receiver's stated bundle limit header. */
export interface PushReply {
  outcome: PushOutcome;
  raw: PushAnswer;
  /** The Freshet-Max-Bundle-Bytes header (readable across origins only when the receiver exposes it), or null. */
  limitHeader: string | null;
}

/** Sends one bundle to {base}/bundles with its id as Idempotency-Key; resolves with the answer and its meaning. */
export async function pushAnswer(settings: SyncSettings, bundle: Bundle): Promise<PushReply> {
  const res = await send(`${settings.base}/bundles`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${settings.token}`, 'Content-Type': 'application/json', 'Idempotency-Key': bundle.id },
    body: JSON.stringify(bundle),
  });
  const raw: PushAnswer = res
    ? { status: res.status, contentType: res.headers.get('Content-Type'), body: await text(res), retryAfter: res.headers.get('Retry-After') }
    : { status: 0, contentType: null, body: '', retryAfter: null };
  return { outcome: readPushAnswer(raw, bundle.id), raw, limitHeader: res ? res.headers.get(MAX_BUNDLE_BYTES_HEADER) : null };
}

/** Sends one bundle to {base}/bundles with its id as Idempotency-Key; resolves with what the answer means. */
export async function pushBundle(settings: SyncSettings, bundle: Bundle): Promise<PushOutcome> {
  return (await pushAnswer(settings, bundle)).outcome;
}

/** One page of a pull: the bundles (checked), the new cursor, and whether the receiver has more. */
export type PullOutcome =
  | { kind: 'bundles'; bundles: Bundle[]; cursor: string; more: boolean }
  | { kind: 'retry'; message: string; after_ms?: number }
  | { kind: 'fix'; message: string };

/**
 * Asks {base}/bundles?after=<cursor>&device=<this phone's id> for every bundle this phone did not make
 * (the receiver leaves out only bundles carrying this device id); every bundle is checked before it is returned.
 */
export async function pullBundles(settings: SyncSettings, cursor: string | undefined): Promise<PullOutcome> {
  const device = `device=${encodeURIComponent(await deviceId())}`;
  const query = cursor === undefined ? `?${device}` : `?after=${encodeURIComponent(cursor)}&${device}`;
  const res = await send(`${settings.base}/bundles${query}`, { method: 'GET', headers: { Authorization: `Bearer ${settings.token}`, Accept: 'application/json' } });
  if (!res) return { kind: 'retry', message: 'No connection to the office. The app asks for new records again when the network is back.' };
  if (res.status >= 200 && res.status < 300 && res.status !== 200) {
    return { kind: 'retry', message: `The office answered in an unexpected way (${res.status}). The app asks again later.` };
  }
  if (res.status !== 200) {
    // Errors read as for a push (a token problem, a wrong address, a busy server).
    const o = readPushAnswer({ status: res.status, contentType: res.headers.get('Content-Type'), body: await text(res), retryAfter: res.headers.get('Retry-After') }, '');
    return o.kind === 'delivered' ? { kind: 'retry', message: 'The office answered in an unexpected way.' } : o;
  }
  const body = await text(res);
  let parsed: { bundles?: unknown; cursor?: unknown; more?: unknown };
  try {
    parsed = JSON.parse(body) as typeof parsed;
  } catch {
    const after_ms = retryAfter_ms(res.headers.get('Retry-After'));
    return { kind: 'retry', message: 'Something other than the office answered (perhaps a Wi-Fi login page). The app asks again later.', ...(after_ms ? { after_ms } : {}) };
  }
  if (typeof parsed !== 'object' || parsed === null || !Array.isArray(parsed.bundles) || typeof parsed.cursor !== 'string') {
    return { kind: 'retry', message: 'The office’s answer did not list bundles and a cursor. The app asks again later.' };
  }
  const bundles: Bundle[] = [];
  for (let i = 0; i < parsed.bundles.length; i++) {
    try {
      bundles.push(parseBundle(parsed.bundles[i]));
    } catch (e) {
      return { kind: 'fix', message: `The office sent a bundle this phone cannot take (bundle ${i + 1}): ${plainError(e, { fallback: 'its contents are not in the form this phone expects.' })} Nothing from it was stored.` };
    }
  }
  return { kind: 'bundles', bundles, cursor: parsed.cursor, more: parsed.more === true };
}

// What an office endpoint's answer to a push means for the phone: delivered, try again later, or stop
// until the user fixes something. Pure, so the page and the service worker read answers the same way.

/** The parts of an HTTP answer the rule reads; status 0 stands for "no answer" (network failure). */
export interface PushAnswer {
  status: number;
  /** The Content-Type header, or null. */
  contentType: string | null;
  /** The body as text ('' when there was none or it could not be read). */
  body: string;
  /** The Retry-After header, or null. */
  retryAfter: string | null;
}

/** The phone's reading of an answer: delivered, retry (after_ms when the receiver said), or fix (a message). */
export type PushOutcome =
  | { kind: 'delivered'; duplicate: boolean }
  | { kind: 'retry'; message: string; after_ms?: number }
  | { kind: 'fix'; message: string };

/** Shortest and longest wait between automatic attempts, ms: 30 s doubling up to 30 minutes. */
export const RETRY_FIRST_MS = 30_000;
/** Longest wait between automatic attempts, ms. */
export const RETRY_MAX_MS = 30 * 60_000;

/** The wait before attempt number `attempts + 1` after `attempts` failures, ms (before any jitter). */
export function retryDelay_ms(attempts: number): number {
  const n = Math.max(1, Math.floor(attempts));
  return Math.min(RETRY_MAX_MS, RETRY_FIRST_MS * 2 ** Math.min(n - 1, 20));
}

/** Retry-After as a wait in ms: whole seconds (RFC 9110 §10.2.3 delay-seconds); undefined otherwise. */
export function retryAfter_ms(header: string | null): number | undefined {
  if (header === null || !/^\s*\d{1,7}\s*$/.test(header)) return undefined;
  return Math.min(RETRY_MAX_MS, Number(header) * 1000);
}

function officeMessage(body: string): string | undefined {
  try {
    const o = JSON.parse(body) as { message?: unknown };
    return typeof o.message === 'string' && o.message.trim() ? o.message.trim().slice(0, 300) : undefined;
  } catch {
    return undefined;
  }
}

function isJson(contentType: string | null): boolean {
  return contentType !== null && /^application\/([\w.+-]+\+)?json\b/i.test(contentType.trim());
}

/** True when a 2xx answer is the receiver's JSON acknowledgement of bundle `bundleId`. */
function acknowledges(answer: PushAnswer, bundleId: string): boolean {
  if (!isJson(answer.contentType)) return false;
  try {
    const o = JSON.parse(answer.body) as { bundle?: unknown };
    return typeof o === 'object' && o !== null && o.bundle === bundleId;
  } catch {
    return false;
  }
}

/** Reads the answer to the push of bundle `bundleId` (core/exchange/README.md, "Push"). */
export function readPushAnswer(answer: PushAnswer, bundleId: string): PushOutcome {
  const { status } = answer;
  const after_ms = retryAfter_ms(answer.retryAfter);
  const later = (message: string): PushOutcome => (after_ms === undefined ? { kind: 'retry', message } : { kind: 'retry', message, after_ms });
  if (status === 0) return later('No connection to the office. The records stay on this phone and go when the network is back.');
  if (status === 201 || status === 200) {
    if (acknowledges(answer, bundleId)) return { kind: 'delivered', duplicate: status === 200 };
    return later('Something other than the office answered (perhaps a Wi-Fi login page). Nothing was taken as delivered; the app tries again later.');
  }
  if (status >= 200 && status < 300) return later(`The office answered in an unexpected way (${status}). Nothing was taken as delivered; the app tries again later.`);
  if (status === 408 || status === 429 || status >= 500) {
    return later(`The office could not take the records just now (${status === 429 ? 'too busy' : status === 408 ? 'it timed out' : 'its server failed'}). The app tries again later.`);
  }
  const said = officeMessage(answer.body);
  if (status === 401) return { kind: 'fix', message: 'The office did not accept the token. Check the token in the settings below (ask the office for a new one if needed).' };
  if (status === 403) return { kind: 'fix', message: 'The office has turned this phone’s token off. Ask the office for a new token.' };
  if (status === 404) return { kind: 'fix', message: 'No office endpoint at that address. Check the address in the settings below.' };
  if (status === 413) return { kind: 'fix', message: 'The office refused the records as too large. Ask the office to raise its limit.' };
  return { kind: 'fix', message: `The office refused the records (${status})${said ? `: ${said}` : '.'} Nothing was lost; they stay on this phone.` };
}

// What the office's answer to a photo upload means (PUT {base}/blobs/sha256-<hex>, the photos contract):
// held (the office has these bytes under this hash), damaged on the way (400 reason "hash": send again),
// refused for this photo (too large, not an image type: set the photo aside), or a failure of the whole
// exchange (retry later, or fix the settings), read as for a bundle. Pure and DOM-free.
import { readPushAnswer, type PushAnswer } from '../../core/index';

/** The meaning of an answer to a photo upload. */
export type BlobOutcome =
  | { kind: 'held' }
  | { kind: 'damaged' }
  | { kind: 'refused'; message: string }
  | { kind: 'retry'; message: string; after_ms?: number }
  | { kind: 'fix'; message: string };

function json(body: string): Record<string, unknown> | undefined {
  try {
    const o = JSON.parse(body) as unknown;
    return typeof o === 'object' && o !== null && !Array.isArray(o) ? (o as Record<string, unknown>) : undefined;
  } catch {
    return undefined;
  }
}

/** Reads the answer to the upload of the bytes named `sha256`. */
export function readBlobAnswer(answer: PushAnswer, sha256: string): BlobOutcome {
  const { status } = answer;
  const body = json(answer.body);
  if (status === 200 || status === 201) {
    if (body?.sha256 === sha256) return { kind: 'held' };
    return { kind: 'retry', message: 'Something other than the office answered a photo upload (perhaps a Wi-Fi login page). The app tries again later.' };
  }
  if (status === 400 && body?.reason === 'hash') return { kind: 'damaged' };
  if (status === 413) return { kind: 'refused', message: 'The office refused this photo as larger than it takes. It stays on this phone.' };
  if (status === 415) return { kind: 'refused', message: 'The office refused this photo’s picture type. It stays on this phone.' };
  if (status === 400) {
    const said = typeof body?.message === 'string' && body.message.trim() ? ` It said: ${body.message.trim().slice(0, 300)}` : '';
    return { kind: 'refused', message: `The office refused this photo.${said}` };
  }
  const o = readPushAnswer(answer, '');
  return o.kind === 'delivered' ? { kind: 'retry', message: 'The office answered a photo upload in an unexpected way. The app tries again later.' } : o;
}

/** Whether a HEAD answer says the office already holds the bytes (200), or not. */
export function holdsBlob(status: number): boolean {
  return status === 200;
}

// Photo bytes to the office before the bundle that names them (the photos contract): for each photo record
// of a bundle (not its tombstones), its bytes and kept original go by PUT {base}/blobs/sha256-<hex> unless
// the office already holds them (HEAD 200) or confirmed them before; a photo counts as delivered only when
// the office answered with the same SHA-256. Bytes damaged on the way are sent again, at most
// MAX_HASH_RESENDS times, then the photo record is set aside with a sentence. DOM-free: the service worker
// runs this inside the one push loop (push.ts).
import type { Bundle, PhotoBody, PushOutcome } from '../../core/index';
// Module by module, not web/db's index (the service worker's build has no DOM).
import { clearPhotoHashRefusals, getPhotoBytes, markPhotoBytesConfirmed, notePhotoHashRefusal, type PhotoBytesEntry } from '../db/photo-bytes';
import type { SyncSettings } from '../db/schema';
import { send, text } from './http';
import { holdsBlob, readBlobAnswer, type BlobOutcome } from './photo-answer';

/** Uploads sent again after the office found the bytes damaged, before the photo is set aside. */
export const MAX_HASH_RESENDS = 3;

/** Whether the bundle may go: every photo delivered; a photo to set aside (index in the bundle); or stop. */
export type PhotoDelivery =
  | { kind: 'ready'; uploaded: number }
  | { kind: 'set-aside'; index: number; message: string }
  | { kind: 'stopped'; outcome: Exclude<PushOutcome, { kind: 'delivered' }> };

/** The address of bytes named `sha256` at the office. */
export function blobUrl(settings: SyncSettings, sha256: string): string {
  return `${settings.base}/blobs/sha256-${sha256}`;
}

async function upload(settings: SyncSettings, held: PhotoBytesEntry): Promise<BlobOutcome> {
  const url = blobUrl(settings, held.sha256);
  const auth = { Authorization: `Bearer ${settings.token}` };
  const head = await send(url, { method: 'HEAD', headers: auth });
  if (head && holdsBlob(head.status)) return { kind: 'held' };
  for (;;) {
    const res = await send(url, { method: 'PUT', headers: { ...auth, 'Content-Type': held.type }, body: held.blob });
    const outcome = readBlobAnswer(
      res
        ? { status: res.status, contentType: res.headers.get('Content-Type'), body: await text(res), retryAfter: res.headers.get('Retry-After') }
        : { status: 0, contentType: null, body: '', retryAfter: null },
      held.sha256,
    );
    if (outcome.kind !== 'damaged') return outcome;
    if ((await notePhotoHashRefusal(held.sha256)) > MAX_HASH_RESENDS) {
      await clearPhotoHashRefusals(held.sha256);
      return {
        kind: 'refused',
        message: `This photo reached the office damaged ${MAX_HASH_RESENDS + 1} times in a row (the bytes that arrived were not the ones sent). It stays on this phone; it is sent again with its next change, or try another network.`,
      };
    }
  }
}

/** Delivers the photo bytes the records of `bundle` name; see PhotoDelivery for what comes back. */
export async function deliverPhotosOf(settings: SyncSettings, bundle: Bundle): Promise<PhotoDelivery> {
  let uploaded = 0;
  for (let i = 0; i < bundle.records.length; i++) {
    const r = bundle.records[i];
    if (r.kind !== 'photo' || r.deleted) continue;
    const body = r.body as PhotoBody;
    for (const ref of [body, ...(body.original ? [body.original] : [])]) {
      const held = await getPhotoBytes(ref.sha256);
      // Bytes this phone never had (a caption changed on another phone's photo) are that phone's to send;
      // the office keeps the record either way.
      if (!held || held.confirmed) continue;
      const outcome = await upload(settings, held);
      if (outcome.kind === 'held') {
        await markPhotoBytesConfirmed(held.sha256);
        uploaded++;
      } else if (outcome.kind === 'refused') return { kind: 'set-aside', index: i, message: outcome.message };
      else if (outcome.kind === 'retry' || outcome.kind === 'fix') return { kind: 'stopped', outcome };
    }
  }
  return { kind: 'ready', uploaded };
}

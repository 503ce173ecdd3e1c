// Keeping a prepared photo on this phone for a record, and the sentences a technician reads: a photo that
// did not fit is refused on its own (whatever it belongs to stays saved).
import { StorageError, savePhoto } from '../../db';
import type { PhotoOwnerKind, PhotoRecord } from '../../../core';
import { plainError } from '../../plain-words';
import type { PreparedPhoto } from '../../photos/resize-protocol';

/** A photo prepared in the worker and not yet kept, with the time it was taken and its caption. */
export interface PendingPhoto {
  /** A key for the screen's list. */
  key: string;
  prepared: PreparedPhoto;
  taken_ms: number;
  caption: string;
}

/** The sentence for a photo refused because the phone is full: the owner is saved, the photo is not. */
export const NO_ROOM = 'This photo was not kept: the phone has no room left for it. What it belongs to is saved. Send your records and photos to the office or free some space, then add the photo again.';

/** 1990-01-01T00:00:00Z in UTC epoch ms (7,305 days after 1970-01-01): earlier file times are not believed. */
const FIRST_PLAUSIBLE_MS = 631_152_000_000;

/** When a chosen file was taken: its own time when plausible (not in the future, not before 1990), else now. */
export function takenTime(file: { lastModified?: number }, now = Date.now()): number {
  const t = file.lastModified;
  return typeof t === 'number' && Number.isInteger(t) && t >= FIRST_PLAUSIBLE_MS && t <= now + 60_000 ? Math.min(t, now) : now;
}

/** Keeps `p` for the record `owner` at `siteId`; resolves with the record, or a sentence saying why it was refused. */
export async function keepPhoto(p: PendingPhoto, siteId: string, owner: { kind: PhotoOwnerKind; id: string }): Promise<PhotoRecord | { refused: string }> {
  try {
    return await savePhoto({
      siteId, owner, width_px: p.prepared.width_px, height_px: p.prepared.height_px, taken_ms: p.taken_ms,
      ...(p.caption.trim() ? { caption: p.caption.trim() } : {}), image: p.prepared.image, ...(p.prepared.original ? { original: p.prepared.original } : {}),
    });
  } catch (err) {
    if (err instanceof StorageError && err.reason === 'quota') return { refused: NO_ROOM };
    return { refused: `This photo was not kept: ${plainError(err, { doing: 'save' })}` };
  }
}

/** Keeps the photos chosen on a new record once it is saved; the words to add to "Saved: …" ('' for none). */
export async function keepPending(pending: readonly PendingPhoto[], siteId: string, owner: { kind: PhotoOwnerKind; id: string }): Promise<string> {
  let kept = 0;
  const refused: string[] = [];
  for (const p of pending) {
    const r = await keepPhoto(p, siteId, owner);
    if ('refused' in r) refused.push(r.refused);
    else kept++;
  }
  const keptWords = kept === 0 ? '' : ` ${kept === 1 ? 'Its photo is' : `Its ${kept} photos are`} kept.`;
  // One refusal sentence is enough when several photos were refused for the same reason.
  return `${keptWords}${[...new Set(refused)].map((s) => ` ${s}`).join('')}`;
}

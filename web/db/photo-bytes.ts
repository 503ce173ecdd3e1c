// Photo bytes on this phone (store photoBytes, local only): the Blob with its type and size, keyed by its
// SHA-256, and whether the office confirmed that hash. Content-addressed, so bytes shared by two photo
// records are kept once, and a photo record's tombstone leaves them where they are (the contract, issue 25).
import { isSha256Hex, PHOTO_TYPES, RecordValidationError, type PhotoType } from '../../core/records/index';
import { withDb } from './connection';
import { now_ms } from './clock';
import { DURABLE, inTx } from './records';
import { quietly } from './quietly';
import type { PhotoBytesEntry } from './photo-bytes-entry';
import { SCOPES } from './stores';

export type { PhotoBytesEntry } from './photo-bytes-entry';

/** What photos take on this phone: how many images (stored and kept originals) and their bytes. */
export interface PhotoBytesSummary {
  count: number;
  bytes: number;
  /** Images the office has not confirmed yet. */
  unconfirmed: number;
}

function check(sha256: string, type: string, blob: Blob): void {
  if (!isSha256Hex(sha256)) throw new RecordValidationError('photo', 'sha256', 'a SHA-256 digest as 64 lower-case hexadecimal digits', sha256);
  if (!(PHOTO_TYPES as readonly string[]).includes(type)) throw new RecordValidationError('photo', 'type', `one of ${PHOTO_TYPES.join(', ')}`, type);
  if (blob.size < 1) throw new RecordValidationError('photo', 'bytes', 'at least one byte', blob.size);
}

/**
 * Keeps `blob` under its SHA-256 (the caller hashed it); bytes already held stay as they are (and keep
 * their confirmation). Resolves once durable; a full store rejects with StorageError reason 'quota'.
 */
export async function putPhotoBytes(sha256: string, type: PhotoType, blob: Blob, options: { confirmed?: boolean } = {}): Promise<void> {
  check(sha256, type, blob);
  await withDb(async (db) => {
    const tx = db.transaction('photoBytes', 'readwrite', DURABLE);
    await inTx(tx, async () => {
      const held = await tx.store.get(sha256);
      if (!held) quietly(tx.store.put({ sha256, type, bytes: blob.size, blob, confirmed: options.confirmed === true, stored_ms: now_ms() }));
      else if (options.confirmed === true && !held.confirmed) quietly(tx.store.put({ ...held, confirmed: true }));
      await tx.done;
    });
  });
}

/** The bytes held under this SHA-256, or undefined when they are not on this phone. */
export function getPhotoBytes(sha256: string): Promise<PhotoBytesEntry | undefined> {
  return withDb((db) => db.get('photoBytes', sha256));
}

/** Changes the entry under `sha256` with `change` (nothing when it is not held); returns the new entry. */
async function update(sha256: string, change: (e: PhotoBytesEntry) => PhotoBytesEntry): Promise<PhotoBytesEntry | undefined> {
  return withDb(async (db) => {
    const tx = db.transaction('photoBytes', 'readwrite', DURABLE);
    return inTx(tx, async () => {
      const held = await tx.store.get(sha256);
      const next = held ? change(held) : undefined;
      if (next) quietly(tx.store.put(next));
      await tx.done;
      return next;
    });
  });
}

/** Notes that the office answered with this same SHA-256: the bytes are delivered. */
export function markPhotoBytesConfirmed(sha256: string): Promise<PhotoBytesEntry | undefined> {
  return update(sha256, (e) => ({ ...e, confirmed: true, hashRefusals: undefined }));
}

/** Counts one upload the office refused as damaged (its hash did not match); returns the count so far. */
export async function notePhotoHashRefusal(sha256: string): Promise<number> {
  const e = await update(sha256, (held) => ({ ...held, hashRefusals: (held.hashRefusals ?? 0) + 1 }));
  return e?.hashRefusals ?? 0;
}

/** Clears the refusal count so a set-aside photo is tried again (the user asked to). */
export function clearPhotoHashRefusals(sha256: string): Promise<PhotoBytesEntry | undefined> {
  return update(sha256, (e) => ({ ...e, hashRefusals: undefined }));
}

/** Removes bytes no photo record names (a save whose record could not be written). */
export async function dropPhotoBytesIfUnnamed(sha256: string): Promise<void> {
  await withDb(async (db) => {
    const tx = db.transaction(SCOPES.photoBytesNamed, 'readwrite', DURABLE);
    await inTx(tx, async () => {
      const named = await tx.objectStore('photos').index('by-sha256').count(sha256);
      if (named === 0) quietly(tx.objectStore('photoBytes').delete(sha256));
      await tx.done;
    });
  });
}

/** What photo bytes take on this phone (sizes as stored beside each Blob; no image is read). */
export async function photoBytesSummary(): Promise<PhotoBytesSummary> {
  return withDb(async (db) => {
    const out: PhotoBytesSummary = { count: 0, bytes: 0, unconfirmed: 0 };
    let cursor = await db.transaction('photoBytes').store.openCursor();
    while (cursor) {
      out.count++;
      out.bytes += cursor.value.bytes;
      if (!cursor.value.confirmed) out.unconfirmed++;
      cursor = await cursor.continue();
    }
    return out;
  });
}

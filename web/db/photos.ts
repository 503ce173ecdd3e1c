// Photo records (store photos, kind 'photo'; issue 25): saved with their bytes, listed by owner or site,
// deleted by tombstone and restored as a new revision. The bytes go in first (photo-bytes.ts): a record is
// never kept that names bytes this phone could not store.
import type { PhotoBody, PhotoRecord, PhotoType } from '../../core/records/index';
import { validatePhotoBody } from '../../core/records/index';
import { withDb } from './connection';
import { dropPhotoBytesIfUnnamed, putPhotoBytes } from './photo-bytes';
import { getIn, listRange, restoreIn, saveIn, tombstoneIn, type ReadOptions } from './records';

/** Bytes the screen made ready: the Blob and what was worked out of it (hash, size, type). */
export interface PreparedBytes {
  sha256: string;
  bytes: number;
  type: PhotoType;
  blob: Blob;
}

/** A new photo: its record's fields (without the bytes' own fields) and the bytes, with the original when kept. */
export interface NewPhoto {
  siteId: string;
  owner: PhotoBody['owner'];
  width_px: number;
  height_px: number;
  taken_ms: number;
  caption?: string;
  image: PreparedBytes;
  original?: PreparedBytes;
}

function bodyOf(p: NewPhoto): PhotoBody {
  const { image, original, caption, ...rest } = p;
  const body: PhotoBody = { ...rest, sha256: image.sha256, bytes: image.bytes, type: image.type };
  if (caption !== undefined && caption.trim() !== '') body.caption = caption;
  if (original) body.original = { sha256: original.sha256, bytes: original.bytes, type: original.type };
  return body;
}

/**
 * Stores the bytes, then the photo record; resolves with the record once both are durable. A full store
 * rejects with StorageError reason 'quota' and keeps nothing of this photo (the owner is untouched).
 */
export async function savePhoto(p: NewPhoto): Promise<PhotoRecord> {
  const body = bodyOf(p);
  validatePhotoBody(body);
  const parts = [p.image, ...(p.original ? [p.original] : [])];
  try {
    for (const b of parts) await putPhotoBytes(b.sha256, b.type, b.blob);
    return await saveIn('photos', body);
  } catch (e) {
    for (const b of parts) await dropPhotoBytesIfUnnamed(b.sha256).catch(() => undefined);
    throw e;
  }
}

/** Changes a photo's caption (a new revision). */
export async function setPhotoCaption(photo: PhotoRecord, caption: string): Promise<PhotoRecord> {
  const { id, rev: _rev, updated_ms: _u, deleted: _d, seen: _s, caption: _old, ...rest } = photo;
  return saveIn('photos', caption.trim() === '' ? { ...rest, id } : { ...rest, id, caption });
}

/** The photo record with this id, or undefined (tombstones only with includeDeleted). */
export const getPhoto = (id: string, options?: ReadOptions): Promise<PhotoRecord | undefined> => getIn('photos', id, options);
/** Deletes a photo by tombstone (its bytes stay); returns the tombstone. */
export const deletePhoto = (id: string): Promise<PhotoRecord | undefined> => tombstoneIn('photos', id);
/** Undoes a deletion as a new revision. */
export const restorePhoto = (id: string): Promise<PhotoRecord | undefined> => restoreIn('photos', id);

/** The photos of one record (a reading, a gauging or a site), oldest taken first. */
export async function listPhotosOf(ownerId: string, options: ReadOptions = {}): Promise<PhotoRecord[]> {
  const all = await withDb((db) => db.getAllFromIndex('photos', 'by-owner', ownerId));
  return all.filter((p) => options.includeDeleted || !p.deleted).sort((a, b) => a.taken_ms - b.taken_ms || a.id.localeCompare(b.id));
}

/** Every photo at a site (its readings', gaugings' and its own) taken from from_ms to to_ms (UTC ms), oldest first. */
export function listPhotosAtSite(siteId: string, from_ms = -Infinity, to_ms = Infinity, options?: ReadOptions): Promise<PhotoRecord[]> {
  return listRange('photos', 'by-site-taken', [siteId, from_ms], [siteId, to_ms], options);
}

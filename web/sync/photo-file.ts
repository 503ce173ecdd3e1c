// Photo bytes in bundle files (the photos contract, "Bundle files"): a file saved on this phone carries the
// bytes of its photo records (and kept originals) held here in its `blobs` field, each checked by its hash
// (core/exchange's encodeBundleBlobs); photos in a file opened here are kept with its records.
import { encodeBundleBlobs, PHOTO_TYPES, type BlobBytes, type Bundle, type BundleBlobsField, type PhotoBody, type PhotoType } from '../../core/index';
import { getPhotoBytes, putPhotoBytes } from '../db/photo-bytes';

/** The bundle with the photo bytes this phone holds for its photo records (no `blobs` when there are none). */
export async function withPhotoBytes(bundle: Bundle): Promise<Bundle & { blobs?: BundleBlobsField }> {
  const blobs = new Map<string, BlobBytes>();
  for (const r of bundle.records) {
    if (r.kind !== 'photo' || r.deleted) continue;
    const body = r.body as PhotoBody;
    for (const ref of [body, ...(body.original ? [body.original] : [])]) {
      if (blobs.has(ref.sha256)) continue;
      const held = await getPhotoBytes(ref.sha256);
      if (held) blobs.set(ref.sha256, { type: held.type, bytes: new Uint8Array(await held.blob.arrayBuffer()) });
    }
  }
  return blobs.size === 0 ? bundle : { ...bundle, blobs: encodeBundleBlobs(blobs) };
}

/** Keeps on this phone the photo bytes a bundle file carried (already checked against their hashes). */
export async function keepFilePhotos(blobs: ReadonlyMap<string, BlobBytes>): Promise<number> {
  let kept = 0;
  for (const [sha256, b] of blobs) {
    if (!(PHOTO_TYPES as readonly string[]).includes(b.type)) continue;
    await putPhotoBytes(sha256, b.type as PhotoType, new Blob([b.bytes as Uint8Array<ArrayBuffer>], { type: b.type }));
    kept++;
  }
  return kept;
}

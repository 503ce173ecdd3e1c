// Making a chosen picture ready to store (run in the photo worker): decode with the camera's orientation
// applied, scale to a long edge of PHOTO_LONG_EDGE_PX (never up), encode as JPEG, hash with SHA-256.
import { MAX_PHOTO_BYTES, PHOTO_TYPES, type PhotoType } from '../../core/records/index';
import { sha256Of } from './hash';
import { PHOTO_JPEG_QUALITY, PHOTO_LONG_EDGE_PX, type PreparedPhoto, type ReadyBytes } from './resize-protocol';

/** The size of a w × h picture scaled so its longer side is at most `longEdge` (aspect kept, whole px, never up). */
export function scaledSize(w: number, h: number, longEdge = PHOTO_LONG_EDGE_PX): { width: number; height: number } {
  if (!(w >= 1 && h >= 1)) throw new RangeError(`A picture needs a width and height of at least 1 px; this one is ${w} × ${h}.`);
  const scale = Math.min(1, longEdge / Math.max(w, h));
  return { width: Math.max(1, Math.round(w * scale)), height: Math.max(1, Math.round(h * scale)) };
}

async function ready(blob: Blob, type: PhotoType): Promise<ReadyBytes> {
  return { blob, sha256: await sha256Of(await blob.arrayBuffer()), bytes: blob.size, type };
}

/** Why an original cannot be kept as it is, or undefined when it can. */
function originalProblem(file: Blob): string | undefined {
  if (!(PHOTO_TYPES as readonly string[]).includes(file.type)) return 'The original was not kept: only JPEG, PNG and WebP pictures can be kept as they are. The resized copy is saved.';
  if (file.size > MAX_PHOTO_BYTES) return 'The original was not kept: it is larger than 16 MB. The resized copy is saved.';
  return undefined;
}

/** Decodes, scales, encodes and hashes `file` (in a worker: OffscreenCanvas and createImageBitmap). */
export async function preparePhoto(file: Blob, keepOriginal: boolean): Promise<PreparedPhoto> {
  let bitmap: ImageBitmap;
  try {
    // 'from-image' turns the picture as the camera's orientation tag says, so portrait stays portrait.
    bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' });
  } catch {
    throw new RangeError('This file could not be read as a picture. Choose a photo (JPEG, PNG, WebP or the camera’s own format).');
  }
  const { width, height } = scaledSize(bitmap.width, bitmap.height);
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new RangeError('This phone could not resize the picture (no drawing surface in the worker).');
  // JPEG has no transparency: a see-through PNG gets a white ground, not black.
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, width, height);
  ctx.imageSmoothingEnabled = true;
  ctx.imageSmoothingQuality = 'high';
  ctx.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  const image = await ready(await canvas.convertToBlob({ type: 'image/jpeg', quality: PHOTO_JPEG_QUALITY }), 'image/jpeg');
  const out: PreparedPhoto = { image, width_px: width, height_px: height };
  if (keepOriginal) {
    const problem = originalProblem(file);
    if (problem) out.originalNotKept = problem;
    else out.original = await ready(file.slice(0, file.size, file.type), file.type as PhotoType);
  }
  return out;
}

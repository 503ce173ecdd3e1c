// Test-only page: the photo worker (web/photos) on generated pictures. A picture is drawn on a canvas with
// its top half red and bottom half blue, encoded, and optionally given an Exif orientation tag, so the
// test can tell the size, the aspect and which way up the stored photo is.
import { prepareInWorker } from '../../../../web/photos/resize-in-worker';

/**
 * An APP1 Exif segment holding one tag, Orientation (0x0112, SHORT) = `value` (CIPA DC-008 Exif 2.32 §4.6.4,
 * TIFF 6.0 p. 36: 6 means the stored rows are the picture's right-hand side, i.e. turn 90° clockwise to view).
 */
function exifOrientation(value: number): Uint8Array<ArrayBuffer> {
  const tiff = [0x4d, 0x4d, 0x00, 0x2a, 0, 0, 0, 8, 0, 1, 0x01, 0x12, 0, 3, 0, 0, 0, 1, 0, value, 0, 0, 0, 0, 0, 0];
  const payload = [0x45, 0x78, 0x69, 0x66, 0, 0, ...tiff];
  const length = payload.length + 2;
  return Uint8Array.from([0xff, 0xe1, length >> 8, length & 0xff, ...payload]);
}

async function picture(width: number, height: number, type: 'image/jpeg' | 'image/png', orientation?: number): Promise<Blob> {
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext('2d')!;
  ctx.fillStyle = '#ff0000';
  ctx.fillRect(0, 0, width, height / 2);
  ctx.fillStyle = '#0000ff';
  ctx.fillRect(0, height / 2, width, height / 2);
  const blob = await canvas.convertToBlob({ type, quality: 0.9 });
  if (orientation === undefined) return blob;
  const bytes = new Uint8Array(await blob.arrayBuffer());
  // Right after the start-of-image marker (FF D8).
  return new Blob([bytes.slice(0, 2), exifOrientation(orientation), bytes.slice(2)], { type });
}

/** The colour at (x, y) of a decoded picture as [r, g, b]. */
async function colourAt(blob: Blob, x: number, y: number): Promise<number[]> {
  const bitmap = await createImageBitmap(blob);
  const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
  const ctx = canvas.getContext('2d')!;
  ctx.drawImage(bitmap, 0, 0);
  return Array.from(ctx.getImageData(x, y, 1, 1).data.slice(0, 3));
}

function base64(bytes: Uint8Array): string {
  let s = '';
  for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(s);
}

const api = {
  /** Prepares a generated width × height picture in the worker; what came back, with its bytes as base64. */
  async prepare(width: number, height: number, options: { type?: 'image/jpeg' | 'image/png'; orientation?: number; keepOriginal?: boolean } = {}) {
    const file = await picture(width, height, options.type ?? 'image/jpeg', options.orientation);
    const p = await prepareInWorker(file, options.keepOriginal === true);
    if ('refused' in p) throw new Error(p.refused);
    const w = p.width_px;
    const h = p.height_px;
    const corners = { topLeft: await colourAt(p.image.blob, 2, 2), bottomRight: await colourAt(p.image.blob, w - 3, h - 3), topRight: await colourAt(p.image.blob, w - 3, 2) };
    return {
      width_px: w, height_px: h, type: p.image.type, bytes: p.image.bytes, sha256: p.image.sha256, blobType: p.image.blob.type,
      base64: base64(new Uint8Array(await p.image.blob.arrayBuffer())), corners,
      original: p.original ? { bytes: p.original.bytes, sha256: p.original.sha256, type: p.original.type, sameAsFile: p.original.bytes === file.size } : undefined,
      originalNotKept: p.originalNotKept,
    };
  },
  /** What the worker says of a file that is not a picture. */
  async refuse(): Promise<string> {
    const p = await prepareInWorker(new Blob(['not a picture'], { type: 'image/jpeg' }), false);
    return 'refused' in p ? p.refused : 'accepted';
  },
};

declare global {
  interface Window {
    freshetPhotoTest: typeof api;
  }
}
window.freshetPhotoTest = api;
document.body.dataset.ready = 'true';

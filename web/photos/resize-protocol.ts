// Messages between the page and the photo worker (resize-worker.ts), and what it gives back.
import type { PhotoType } from '../../core/records/index';

/** Longest side of a stored photo, px: enough to read a staff gauge's marks, small enough to send. */
export const PHOTO_LONG_EDGE_PX = 2048;
/** JPEG quality of a stored photo (0–1). */
export const PHOTO_JPEG_QUALITY = 0.85;

/** Bytes made ready for storage: the Blob, its SHA-256 (64 lower-case hex digits), size and type. */
export interface ReadyBytes {
  blob: Blob;
  sha256: string;
  bytes: number;
  type: PhotoType;
}

/** A photo made ready: the resized image with its pixel size, and the untouched original when asked and possible. */
export interface PreparedPhoto {
  image: ReadyBytes;
  width_px: number;
  height_px: number;
  original?: ReadyBytes;
  /** Why the original was not kept although asked, as a sentence for the screen. */
  originalNotKept?: string;
}

/** Page → worker: the chosen file, and whether to keep the original too. */
export interface ResizeRequest {
  file: Blob;
  keepOriginal: boolean;
}

/** Worker → page: the prepared photo, or why the file could not be used (a sentence for the screen). */
export type ResizeReply = { type: 'done'; photo: PreparedPhoto } | { type: 'failed'; message: string };

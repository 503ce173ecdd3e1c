// What the phone keeps of a photo's bytes (store photoBytes, local only, keyed by SHA-256): pure types, so
// the schema and the service worker can name them without loading the store's code.
import type { PhotoType } from '../../core/records/index';

/** Photo bytes held on this phone, named by their SHA-256 (64 lower-case hex digits). */
export interface PhotoBytesEntry {
  sha256: string;
  type: PhotoType;
  /** Size of the bytes. */
  bytes: number;
  blob: Blob;
  /** True once the office answered an upload (or a check) with this same SHA-256: delivered. */
  confirmed: boolean;
  /** When the bytes were stored on this phone, UTC ms. */
  stored_ms: number;
  /** Uploads the office refused because the bytes it got did not hash to the name (damaged on the way). */
  hashRefusals?: number;
}

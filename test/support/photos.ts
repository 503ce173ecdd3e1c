// Invented photo record bodies for tests: pure, no storage. The hashes are real SHA-256 digests of the
// bytes they name (computed with Node's crypto, an outside implementation of FIPS 180-4).
import { createHash } from 'node:crypto';
import type { PhotoBody } from '../../core/records/index';

/** SHA-256 of `bytes` as 64 lower-case hex digits (Node's crypto). */
export function sha256Hex(bytes: Uint8Array | string): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** An invented photo body of a reading `readingId` at `siteId`, naming `bytes` (default: 1,000 invented bytes). */
export function photo(siteId: string, readingId: string, overrides: Partial<PhotoBody> = {}, bytes: Uint8Array = Uint8Array.from({ length: 1000 }, (_, i) => (i * 7) % 256)): PhotoBody {
  return {
    siteId, owner: { kind: 'reading', id: readingId }, sha256: sha256Hex(bytes), bytes: bytes.length, type: 'image/jpeg',
    width_px: 2048, height_px: 1536, taken_ms: Date.UTC(2026, 2, 1, 9, 30), caption: 'Staff gauge, weed on the control', ...overrides,
  };
}

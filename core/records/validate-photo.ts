// Validation of a photo record's fields (issue 25; the contract's table): owner, hash, size, type, pixel
// size, time, caption under the one text rule, and the kept original.
import type { PhotoBody } from './photo-types';
import { MAX_CAPTION_LENGTH, MAX_PHOTO_BYTES, MAX_PHOTO_PX, PHOTO_OWNER_KINDS, PHOTO_TYPES } from './photo-types';
import { requireObject, requireOneOf, requireText, requireTime, requireUuid } from './checks';
import { RecordValidationError } from './validation-error';

const SHA256_HEX = /^[0-9a-f]{64}$/;

/** True when x is a SHA-256 digest written as 64 lower-case hexadecimal digits. */
export function isSha256Hex(x: unknown): x is string {
  return typeof x === 'string' && SHA256_HEX.test(x);
}

function requireWhole(kind: string, field: string, x: unknown, max: number, unit: string): number {
  if (typeof x !== 'number' || !Number.isInteger(x) || x < 1 || x > max) {
    throw new RecordValidationError(kind, field, `a whole number from 1 to ${max} (${unit})`, x);
  }
  return x;
}

/** Checks sha256, bytes and type of photo bytes named at `prefix` (empty for the stored image). */
function requireBytesRef(kind: string, prefix: string, o: Record<string, unknown>): void {
  if (!isSha256Hex(o.sha256)) throw new RecordValidationError(kind, `${prefix}sha256`, 'a SHA-256 digest as 64 lower-case hexadecimal digits', o.sha256);
  requireWhole(kind, `${prefix}bytes`, o.bytes, MAX_PHOTO_BYTES, 'bytes');
  requireOneOf(kind, `${prefix}type`, o.type, PHOTO_TYPES);
}

/** Checks a photo's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validatePhotoBody(x: unknown): asserts x is PhotoBody {
  const k = 'photo';
  const o = requireObject(k, 'photo', x);
  requireUuid(k, 'siteId', o.siteId);
  const owner = requireObject(k, 'owner', o.owner);
  const ownerKind = requireOneOf(k, 'owner.kind', owner.kind, PHOTO_OWNER_KINDS);
  requireUuid(k, 'owner.id', owner.id);
  // A site's photo belongs to the site itself: the two ids must agree, or the record says two things.
  if (ownerKind === 'site' && owner.id !== o.siteId) throw new RecordValidationError(k, 'owner.id', `the site's own id (${String(o.siteId)}) for a site photo`, owner.id);
  requireBytesRef(k, '', o);
  requireWhole(k, 'width_px', o.width_px, MAX_PHOTO_PX, 'px');
  requireWhole(k, 'height_px', o.height_px, MAX_PHOTO_PX, 'px');
  requireTime(k, 'taken_ms', o.taken_ms);
  if (o.caption !== undefined) requireText(k, 'caption', o.caption, false, MAX_CAPTION_LENGTH);
  if (o.original !== undefined) requireBytesRef(k, 'original.', requireObject(k, 'original', o.original));
}

// The photo record kind (issue 25, the photos contract): good records pass, each broken field is refused
// naming it, the caption keeps the one text rule, the hash is 64 lower-case hex digits, sizes are bounded.
import { describe, expect, it } from 'vitest';
import {
  fromSyncRecord, isSha256Hex, MAX_PHOTO_BYTES, RecordValidationError, SYNC_KINDS, toSyncRecord, validateBody, validatePhotoBody,
  validateSyncRecord, type PhotoRecord,
} from '../../../core/records/index';
import { photo, sha256Hex } from '../../support/photos';

const SITE = '0b6f1f3e-6a53-4f7c-9a53-1d2f6e1b7c10';
const READING = '5d1c7a2e-3b4f-4c6d-8e9f-0a1b2c3d4e5f';

function fieldOf(fn: () => void): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(RecordValidationError);
    return (e as RecordValidationError).field;
  }
  throw new Error('expected a RecordValidationError');
}

describe('the photo record', () => {
  it('is a kind that syncs', () => {
    expect(SYNC_KINDS).toContain('photo');
  });

  it('accepts a good photo of a reading, a gauging and a site, with and without caption and original', () => {
    expect(() => validatePhotoBody(photo(SITE, READING))).not.toThrow();
    expect(() => validatePhotoBody(photo(SITE, READING, { owner: { kind: 'gauging', id: READING } }))).not.toThrow();
    expect(() => validatePhotoBody(photo(SITE, READING, { owner: { kind: 'site', id: SITE } }))).not.toThrow();
    const { caption: _c, ...noCaption } = photo(SITE, READING);
    expect(() => validatePhotoBody(noCaption)).not.toThrow();
    expect(() => validatePhotoBody(photo(SITE, READING, { original: { sha256: sha256Hex('original'), bytes: MAX_PHOTO_BYTES, type: 'image/png' } }))).not.toThrow();
    // Bounds are inclusive: 1 byte, 1 px and 20,000 px (the contract's table).
    expect(() => validatePhotoBody(photo(SITE, READING, { bytes: 1, width_px: 1, height_px: 20_000 }))).not.toThrow();
    expect(() => validateBody('photo', photo(SITE, READING, { caption: 'x'.repeat(500) }))).not.toThrow();
  });

  it('knows a SHA-256 digest when it sees one', () => {
    // FIPS 180-2, Appendix B.1: SHA-256("abc").
    const abc = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';
    expect(sha256Hex('abc')).toBe(abc);
    expect(isSha256Hex(abc)).toBe(true);
    expect(isSha256Hex(abc.toUpperCase())).toBe(false);
    expect(isSha256Hex(abc.slice(1))).toBe(false);
    expect(isSha256Hex(`${abc}0`)).toBe(false);
    expect(isSha256Hex(`${abc.slice(1)}g`)).toBe(false);
  });

  // Each row: a broken photo and the field its refusal must name.
  const cases: [string, Record<string, unknown>, string][] = [
    ['site id not a UUID', { siteId: 'KC-01' }, 'siteId'],
    ['owner of an unknown kind', { owner: { kind: 'rating', id: READING } }, 'owner.kind'],
    ['owner id missing', { owner: { kind: 'reading' } }, 'owner.id'],
    ['site photo naming another site', { owner: { kind: 'site', id: READING } }, 'owner.id'],
    ['hash in capitals', { sha256: sha256Hex('x').toUpperCase() }, 'sha256'],
    ['hash too short', { sha256: sha256Hex('x').slice(0, 63) }, 'sha256'],
    ['hash with a prefix', { sha256: `sha256-${sha256Hex('x')}` }, 'sha256'],
    ['no bytes', { bytes: 0 }, 'bytes'],
    ['bytes over 16 MiB', { bytes: MAX_PHOTO_BYTES + 1 }, 'bytes'],
    ['fractional bytes', { bytes: 10.5 }, 'bytes'],
    ['type not an image', { type: 'application/pdf' }, 'type'],
    ['type of an image not kept', { type: 'image/gif' }, 'type'],
    ['width 0', { width_px: 0 }, 'width_px'],
    ['height over 20,000 px', { height_px: 20_001 }, 'height_px'],
    ['time with a fraction', { taken_ms: 1.5 }, 'taken_ms'],
    ['caption of 501 characters', { caption: 'x'.repeat(501) }, 'caption'],
    ['caption with a NUL', { caption: 'weed\u0000' }, 'caption'],
    ['caption with a lone surrogate', { caption: 'ice \ud800' }, 'caption'],
    ['caption not text', { caption: 5 }, 'caption'],
    ['original without hash', { original: { bytes: 10, type: 'image/jpeg' } }, 'original.sha256'],
    ['original over 16 MiB', { original: { sha256: sha256Hex('o'), bytes: MAX_PHOTO_BYTES + 1, type: 'image/jpeg' } }, 'original.bytes'],
    ['original of another type', { original: { sha256: sha256Hex('o'), bytes: 10, type: 'image/heic' } }, 'original.type'],
  ];
  it.each(cases)('refuses %s, naming the field', (_name, change, field) => {
    expect(fieldOf(() => validatePhotoBody({ ...photo(SITE, READING), ...change }))).toBe(field);
  });

  it('says what was wrong and what is needed', () => {
    expect(() => validatePhotoBody(photo(SITE, READING, { bytes: 0 }))).toThrow('photo bytes must be a whole number from 1 to 16777216 (bytes); got 0');
    expect(() => validatePhotoBody(photo(SITE, READING, { caption: 'a\u0007b' }))).toThrow(/control character \(U\+0007\) at character 2/);
  });

  it('travels as a sync record and back unchanged, tombstone included', () => {
    const stored: PhotoRecord = { ...photo(SITE, READING), id: READING, rev: '1767225600000-000001-dev', updated_ms: 1_767_225_600_000 };
    const sync = toSyncRecord('photo', stored);
    expect(() => validateSyncRecord(sync)).not.toThrow();
    expect(fromSyncRecord(sync)).toEqual(stored);
    const gone = toSyncRecord('photo', { ...stored, deleted: true });
    expect(gone.deleted).toBe(true);
    expect(fieldOf(() => validateSyncRecord({ ...sync, body: { ...sync.body, sha256: 'nope' } }))).toBe('sha256');
  });
});

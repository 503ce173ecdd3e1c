// Photo bytes inside a bundle file: encoded and decoded with their hash checked (oracles: node:crypto for
// SHA-256, node:buffer for base64), each kind of damage refused, and the bundle read without the field.
import { createHash, randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
  BundleBlobError, BundleError, bundleFileParts, decodeBundleBlobs, encodeBundleBlobs, makeBundle, refuseBundleBlobs, type BlobBytes,
} from '../../../core/index';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const BUNDLE_ID = '0b7d2f4e-3c1a-4e5b-9a6d-8f2e1c0b3a49';

function photo(n: number, type = 'image/jpeg'): [string, BlobBytes] {
  const bytes = new Uint8Array(randomBytes(n));
  return [sha(bytes), { type, bytes }];
}

function reason(fn: () => unknown): string {
  try {
    fn();
  } catch (err) {
    if (err instanceof BundleBlobError) return err.reason;
    throw err;
  }
  return 'accepted';
}

describe('bundle file photo bytes', () => {
  it('encodes each photo under sha256-<hex> as standard base64 and decodes it back (oracles: node:crypto, node:buffer)', () => {
    const blobs = new Map([photo(3000), photo(1, 'image/png'), photo(65_537, 'image/webp')]);
    const field = encodeBundleBlobs(blobs);
    expect(Object.keys(field)).toEqual([...blobs.keys()].map((h) => `sha256-${h}`));
    for (const [hex, b] of blobs) {
      expect(field[`sha256-${hex}`]).toEqual({ type: b.type, base64: Buffer.from(b.bytes).toString('base64') });
    }
    // Through JSON, as a file travels.
    const back = decodeBundleBlobs(JSON.parse(JSON.stringify(field)));
    expect([...back.keys()]).toEqual([...blobs.keys()]);
    for (const [hex, b] of back) {
      expect(sha(b.bytes)).toBe(hex);
      expect(b.type).toBe(blobs.get(hex)?.type);
    }
  });

  it('names "abc" by its FIPS 180-4 digest (NIST example ba7816bf…f20015ad)', () => {
    const abc = new TextEncoder().encode('abc');
    const field = encodeBundleBlobs(new Map([['ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad', { type: 'image/png', bytes: abc }]]));
    expect(field).toEqual({ 'sha256-ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad': { type: 'image/png', base64: 'YWJj' } });
  });

  it('refuses to encode bytes under a name that is not their hash, a type that is not a photo, or no bytes', () => {
    const [hex, b] = photo(100);
    expect(reason(() => encodeBundleBlobs(new Map([[hex.replace(/^./, hex[0] === '0' ? '1' : '0'), b]])))).toBe('hash');
    expect(reason(() => encodeBundleBlobs(new Map([[hex, { ...b, type: 'image/gif' }]])))).toBe('type');
    expect(reason(() => encodeBundleBlobs(new Map([[hex.toUpperCase(), b]])))).toBe('name');
    const empty = new Uint8Array(0);
    expect(reason(() => encodeBundleBlobs(new Map([[sha(empty), { type: 'image/jpeg', bytes: empty }]])))).toBe('size');
  });

  it('refuses a damaged photo, a bad name, bad base64, a wrong type and a size over 16 MiB, naming the photo', () => {
    const [hex, b] = photo(3000);
    const good = encodeBundleBlobs(new Map([[hex, b]]))[`sha256-${hex}`];
    const flipped = Buffer.from(b.bytes);
    flipped[17] ^= 1;
    const damaged = { [`sha256-${hex}`]: { type: 'image/jpeg', base64: flipped.toString('base64') } };
    expect(reason(() => decodeBundleBlobs(damaged))).toBe('hash');
    expect(() => decodeBundleBlobs(damaged)).toThrow(/do not match its name: the file is damaged/);
    expect(reason(() => decodeBundleBlobs({ [hex]: good }))).toBe('name');
    expect(reason(() => decodeBundleBlobs({ [`sha256-${hex}`]: { ...good, base64: good.base64.replace(/(.{76})/g, '$1\n') } }))).toBe('base64');
    expect(reason(() => decodeBundleBlobs({ [`sha256-${hex}`]: { ...good, type: 'text/html' } }))).toBe('type');
    expect(reason(() => decodeBundleBlobs({ [`sha256-${hex}`]: { type: 'image/jpeg' } }))).toBe('shape');
    expect(reason(() => decodeBundleBlobs([good]))).toBe('shape');
    // 16 MiB + 1 byte, told by the length of the text alone (the bytes are never decoded).
    // 16,777,217 = 3 · 5,592,405 + 2: 5,592,406 groups of 4 characters, the last padded once.
    const over = 'A'.repeat(5_592_406 * 4 - 1) + '=';
    expect(reason(() => decodeBundleBlobs({ [`sha256-${hex}`]: { type: 'image/jpeg', base64: over } }))).toBe('size');
    expect(decodeBundleBlobs(undefined).size).toBe(0);
  });

  it('reads a bundle file with photos: the bundle without the field (its checksum holds), the photos checked', () => {
    const bundle = makeBundle({ id: BUNDLE_ID, device: 'field-phone', created_ms: Date.UTC(2026, 5, 2), records: [] });
    const [hex, b] = photo(500);
    const file = JSON.parse(JSON.stringify({ ...bundle, blobs: encodeBundleBlobs(new Map([[hex, b]])) }));
    const parts = bundleFileParts(file);
    expect(parts.bundle).toEqual(bundle);
    expect('blobs' in parts.bundle).toBe(false);
    expect(Buffer.from(parts.blobs.get(hex)?.bytes ?? []).equals(Buffer.from(b.bytes))).toBe(true);
    expect(bundleFileParts(JSON.parse(JSON.stringify(bundle))).blobs.size).toBe(0);
    file.blobs[`sha256-${hex}`].base64 = Buffer.from(randomBytes(500)).toString('base64');
    expect(() => bundleFileParts(file)).toThrow(BundleBlobError);
    // A push carries no photo bytes.
    expect(() => refuseBundleBlobs(file)).toThrow(BundleError);
    expect(() => refuseBundleBlobs(bundle)).not.toThrow();
  });
});

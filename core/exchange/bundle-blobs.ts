// Photo bytes inside a bundle file (an office with no network): one extra top-level field, outside the
// checksum, each entry checked by its own SHA-256 (README.md here, "Photo bytes in a bundle file"):
//   "blobs": { "sha256-<hex>": { "type": "image/jpeg", "base64": "<standard base64, no line breaks>" } }
// A bundle pushed by HTTP never carries it (photo bytes go by PUT /blobs).
import { MAX_PHOTO_BYTES, PHOTO_TYPES } from '../records/index';
import { base64Decode, base64DecodedLength, base64Encode } from './base64';
import { BundleError, parseBundle, type Bundle } from './bundle';
import { sha256Hex } from './sha256';

/** The top-level field of a bundle file that carries photo bytes. */
export const BUNDLE_BLOBS_FIELD = 'blobs';
// Media types and the largest size photo bytes may have: the photo record's own (core/records/photo-types.ts).
const BLOB_TYPES: readonly string[] = PHOTO_TYPES;
const MAX_BLOB_BYTES = MAX_PHOTO_BYTES;

/** Photo bytes and their media type. */
export interface BlobBytes {
  type: string;
  bytes: Uint8Array;
}

/** The `blobs` field as it is written: "sha256-<hex>" → { type, base64 }. */
export type BundleBlobsField = Record<string, { type: string; base64: string }>;

/** Why the photo bytes of a bundle file were refused; `sha256` names the photo when known. */
export class BundleBlobError extends RangeError {
  readonly reason: 'shape' | 'name' | 'base64' | 'type' | 'size' | 'hash';
  readonly sha256?: string;
  constructor(reason: BundleBlobError['reason'], message: string, sha256?: string) {
    super(message);
    this.name = 'BundleBlobError';
    this.reason = reason;
    if (sha256 !== undefined) this.sha256 = sha256;
  }
}

const KEY = /^sha256-([0-9a-f]{64})$/;

function short(hex: string): string {
  return `${hex.slice(0, 12)}…`;
}

// The checks both ways share: a media type photos may have, and a size from 1 byte to the limit.
function checkBlob(hex: string, type: unknown, size: number): void {
  if (typeof type !== 'string' || !BLOB_TYPES.includes(type)) {
    throw new BundleBlobError('type', `Photo ${short(hex)} has the type ${JSON.stringify(type)}; a photo must be ${BLOB_TYPES.join(', ')}.`, hex);
  }
  if (size < 1 || size > MAX_BLOB_BYTES) {
    throw new BundleBlobError('size', `Photo ${short(hex)} is ${size} bytes; a photo must be 1 to ${MAX_BLOB_BYTES} bytes (16 MiB).`, hex);
  }
}

/**
 * The `blobs` field for photo bytes named by their SHA-256 (64 lower-case hex digits, without "sha256-").
 * Refuses (BundleBlobError) a name that is not the SHA-256 of its bytes, a type that is not a photo's, or
 * bytes over the limit.
 */
export function encodeBundleBlobs(blobs: ReadonlyMap<string, BlobBytes>): BundleBlobsField {
  const out: BundleBlobsField = {};
  for (const [hex, blob] of blobs) {
    if (!/^[0-9a-f]{64}$/.test(hex)) throw new BundleBlobError('name', `A photo is named by its SHA-256, 64 lower-case hex digits; got ${JSON.stringify(hex)}.`);
    checkBlob(hex, blob.type, blob.bytes.length);
    if (sha256Hex(blob.bytes) !== hex) throw new BundleBlobError('hash', `The bytes given for photo ${short(hex)} do not hash to its name.`, hex);
    out[`sha256-${hex}`] = { type: blob.type, base64: base64Encode(blob.bytes) };
  }
  return out;
}

/**
 * The photo bytes of a `blobs` field (absent: none), each checked: its name, strict base64, its type, its
 * size (1 byte to the limit, before decoding) and that the bytes hash to the name. Any fault refuses the
 * whole field with a BundleBlobError naming the photo. Keys of the map: the hex SHA-256 without "sha256-".
 */
export function decodeBundleBlobs(field: unknown): Map<string, BlobBytes> {
  const out = new Map<string, BlobBytes>();
  if (field === undefined) return out;
  if (typeof field !== 'object' || field === null || Array.isArray(field)) {
    throw new BundleBlobError('shape', 'The photos of the bundle file must be an object naming each photo by "sha256-" and its hash.');
  }
  for (const [key, value] of Object.entries(field)) {
    const m = KEY.exec(key);
    if (m === null) throw new BundleBlobError('name', `A photo in the bundle file is named ${JSON.stringify(key.slice(0, 80))}; expected "sha256-" and 64 lower-case hex digits.`);
    const hex = m[1];
    const v = value as { type?: unknown; base64?: unknown } | null;
    if (typeof v !== 'object' || v === null || Array.isArray(v) || typeof v.base64 !== 'string') {
      throw new BundleBlobError('shape', `Photo ${short(hex)} in the bundle file must be an object with its type and its bytes in base64.`, hex);
    }
    checkBlob(hex, v.type, base64DecodedLength(v.base64));
    let bytes: Uint8Array;
    try {
      bytes = base64Decode(v.base64);
    } catch (err) {
      throw new BundleBlobError('base64', `The bytes of photo ${short(hex)} are not standard base64: ${(err as Error).message}`, hex);
    }
    if (sha256Hex(bytes) !== hex) {
      throw new BundleBlobError('hash', `The bytes of photo ${short(hex)} do not match its name: the file is damaged. Ask for it again.`, hex);
    }
    out.set(hex, { type: v.type as string, bytes });
  }
  return out;
}

/**
 * A bundle file's parts: the bundle (core's checks, without the `blobs` field) and its checked photo bytes.
 * Throws BundleError for the bundle, BundleBlobError for the photos.
 */
export function bundleFileParts(json: unknown): { bundle: Bundle; blobs: Map<string, BlobBytes> } {
  if (typeof json !== 'object' || json === null || Array.isArray(json) || !(BUNDLE_BLOBS_FIELD in json)) {
    return { bundle: parseBundle(json), blobs: new Map() };
  }
  const { [BUNDLE_BLOBS_FIELD]: field, ...rest } = json as Record<string, unknown>;
  const bundle = parseBundle(rest);
  return { bundle, blobs: decodeBundleBlobs(field) };
}

/** Refuses (BundleError 'shape') a bundle document that carries photo bytes: a push carries records only. */
export function refuseBundleBlobs(json: unknown): void {
  if (typeof json === 'object' && json !== null && !Array.isArray(json) && BUNDLE_BLOBS_FIELD in json) {
    throw new BundleError('shape', 'A bundle sent to the office must not carry photo bytes: the app sends each photo on its own (PUT /blobs), then the bundle.');
  }
}

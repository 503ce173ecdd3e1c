// The bundle: the one unit of exchange between phones and the office, by file and by HTTP. A JSON
// document with its own id, the device, the creation time, the records ({ kind, id, rev, deleted?, body })
// and a SHA-256 checksum of the records. The format is described for other implementers in README.md here.
import { isUuid, jsonTextProblem, textProblem, textProblemWords, validateSyncRecord, RecordValidationError, type SyncRecord } from '../records/index';
import { MAX_BUNDLE_DEPTH, nestedDeeperThan } from './nesting';
import { sha256Hex, utf8Bytes } from './sha256';

/** The `format` field every bundle carries. */
export const BUNDLE_FORMAT = 'freshet-bundle';
/** The bundle version this code writes and the highest it reads. */
export const BUNDLE_VERSION = 1;

/** A bundle of sync records as it travels (JSON-able). */
export interface Bundle {
  format: typeof BUNDLE_FORMAT;
  version: typeof BUNDLE_VERSION;
  /** UUID of this bundle; also the Idempotency-Key of its HTTP push. */
  id: string;
  /** Id of the device (or office) that made it. */
  device: string;
  /** When it was made: RFC 3339 time with offset (written in UTC, "…Z"). */
  created: string;
  records: SyncRecord[];
  /** "sha256:" and the hex SHA-256 of the UTF-8 of JSON.stringify(records). */
  checksum: string;
}

/** Why a bundle was refused: its overall shape, format name, version, checksum, or one record. */
export type BundleErrorReason = 'shape' | 'format' | 'version' | 'checksum' | 'record';

/** A bundle refused by `parseBundle`: `reason` says which check failed, `recordIndex` which record. */
export class BundleError extends RangeError {
  readonly reason: BundleErrorReason;
  readonly recordIndex?: number;
  constructor(reason: BundleErrorReason, message: string, recordIndex?: number) {
    super(message);
    this.name = 'BundleError';
    this.reason = reason;
    if (recordIndex !== undefined) this.recordIndex = recordIndex;
  }
}

/** The hex SHA-256 of a text's UTF-8 bytes (lone surrogates as U+FFFD): core's own, or the same digest from a faster source (Node's crypto). */
export type Sha256OfText = (text: string) => string;

const coreSha256OfText: Sha256OfText = (text) => sha256Hex(utf8Bytes(text));

/** The checksum of a list of records: "sha256:" + hex SHA-256 of the UTF-8 of JSON.stringify(records). */
export function bundleChecksum(records: readonly SyncRecord[], sha256OfText: Sha256OfText = coreSha256OfText): string {
  return `sha256:${sha256OfText(JSON.stringify(records))}`;
}

/** What a new bundle needs: its id (UUID), the device id, the creation time (UTC ms) and the records. */
export interface BundleInput {
  id: string;
  device: string;
  created_ms: number;
  records: SyncRecord[];
}

/** Makes a bundle of `records`, checksummed; refuses a bad id, device or time with a RangeError. */
export function makeBundle(input: BundleInput): Bundle {
  if (!isUuid(input.id)) throw new RangeError(`A bundle id must be a lower-case UUID; got ${JSON.stringify(input.id)}`);
  if (typeof input.device !== 'string' || input.device.trim() === '' || input.device.length > 200) {
    throw new RangeError('A bundle needs the id of the device that made it (1 to 200 characters)');
  }
  if (!Number.isInteger(input.created_ms) || input.created_ms < 0 || input.created_ms > 8.64e15) {
    throw new RangeError('A bundle needs its creation time as a whole number of UTC epoch milliseconds');
  }
  return {
    format: BUNDLE_FORMAT,
    version: BUNDLE_VERSION,
    id: input.id,
    device: input.device,
    created: new Date(input.created_ms).toISOString(),
    records: input.records,
    checksum: bundleChecksum(input.records),
  };
}

const RFC3339 = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/;

/**
 * Checks a parsed JSON value as a bundle: shape, format, version (newer versions are refused), checksum and
 * every record (core's validators). Returns it typed, or throws a BundleError that says which check failed.
 * `sha256OfText` may give the checksum's digest from a faster source (the office receiver passes Node's).
 */
export function parseBundle(x: unknown, sha256OfText?: Sha256OfText): Bundle {
  if (typeof x !== 'object' || x === null || Array.isArray(x)) {
    throw new BundleError('shape', 'This is not a bundle: expected a JSON object with format, version, id, device, created, records and checksum.');
  }
  const o = x as Record<string, unknown>;
  if (o.format !== BUNDLE_FORMAT) {
    throw new BundleError('format', `This is not a Freshet bundle: its format is ${describe(o.format)}, expected "${BUNDLE_FORMAT}".`);
  }
  if (typeof o.version !== 'number' || !Number.isInteger(o.version) || o.version < 1) {
    throw new BundleError('version', `The bundle's version must be a whole number from 1; got ${describe(o.version)}.`);
  }
  if (o.version > BUNDLE_VERSION) {
    throw new BundleError('version', `The bundle was made by a newer version of Freshet (bundle version ${o.version}; this one reads up to ${BUNDLE_VERSION}). Update the app, then try again.`);
  }
  if (!isUuid(o.id)) throw new BundleError('shape', `The bundle's id must be a lower-case UUID; got ${describe(o.id)}.`);
  if (typeof o.device !== 'string' || o.device.trim() === '' || o.device.length > 200 || textProblem(o.device)) {
    throw new BundleError('shape', `The bundle must name the device that made it; got ${describe(o.device)}.`);
  }
  if (typeof o.created !== 'string' || !RFC3339.test(o.created) || Number.isNaN(Date.parse(o.created))) {
    throw new BundleError('shape', `The bundle's creation time must be an RFC 3339 time with offset; got ${describe(o.created)}.`);
  }
  if (!Array.isArray(o.records)) throw new BundleError('shape', `The bundle's records must be a list; got ${describe(o.records)}.`);
  if (typeof o.checksum !== 'string' || !/^sha256:[0-9a-f]{64}$/.test(o.checksum)) {
    throw new BundleError('checksum', `The bundle's checksum must be "sha256:" and 64 hex digits; got ${describe(o.checksum)}.`);
  }
  checkNesting(o, o.records);
  if (bundleChecksum(o.records as SyncRecord[], sha256OfText) !== o.checksum) {
    throw new BundleError('checksum', 'The bundle is damaged: its records do not match its checksum. Ask for the file again.');
  }
  // Each version's index by kind, id and revision; only a repeated one is serialised to compare contents.
  const seen = new Map<string, number>();
  o.records.forEach((r, i, all) => {
    const problem = bundleRecordProblem(r);
    if (problem) throw new BundleError('record', `Record ${i + 1} of the bundle ${problem}.`, i);
    const key = `${r.kind}\u0000${r.id}\u0000${r.rev}`;
    const before = seen.get(key);
    if (before !== undefined && JSON.stringify(all[before]) !== JSON.stringify(r)) {
      throw new BundleError('record', `Record ${i + 1} of the bundle repeats a ${r.kind} revision already in it with different content.`, i);
    }
    if (before === undefined) seen.set(key, i);
  });
  return o as unknown as Bundle;
}

// Before the checksum (which serialises the records recursively): nesting beyond MAX_BUNDLE_DEPTH is
// refused, naming the record it is in when it is in one.
function checkNesting(bundle: object, records: unknown[]): void {
  if (!nestedDeeperThan(bundle, MAX_BUNDLE_DEPTH)) return;
  const i = records.findIndex((r) => nestedDeeperThan(r, MAX_BUNDLE_DEPTH - 2));
  const why = `objects and lists may nest at most ${MAX_BUNDLE_DEPTH} levels deep, counting the bundle itself`;
  if (i < 0) throw new BundleError('shape', `The bundle is nested too deeply: ${why}.`);
  throw new BundleError('record', `Record ${i + 1} of the bundle is nested too deeply: ${why}.`, i);
}

/**
 * Why one record cannot travel in a bundle, as the end of a sentence ("is not valid: …", "holds text that
 * cannot be stored: …"), or undefined when it can: the text rule (core/records/text.ts) over every string,
 * field names included, then core's validators. parseBundle and the phone's outbox both use it.
 */
export function bundleRecordProblem(r: unknown): string | undefined {
  const bad = jsonTextProblem(r);
  if (bad) return `holds text that cannot be stored: ${textProblemWords(bad.problem)} in ${fieldWords(bad.path)}`;
  try {
    validateSyncRecord(r);
  } catch (e) {
    const why = e instanceof RecordValidationError || e instanceof RangeError ? e.message : String(e);
    return `is not valid: ${why}`;
  }
  return undefined;
}

/** A record path such as "body.checks[0].readingId" in words: "the reading id". */
function fieldWords(path: string): string {
  const last = path.replace(/ \(a field name\)$/, '').replace(/\[\d+\]/g, '').split('.').pop() ?? '';
  if (last === '' || last === 'body') return 'the record';
  const words = last.replace(/_[a-z0-9]+$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
  return `${path.endsWith('(a field name)') ? 'a field name under ' : ''}the ${words}`;
}

function describe(x: unknown): string {
  if (x === undefined) return 'missing';
  if (typeof x === 'string') return x.length > 40 ? `a ${x.length}-character text` : JSON.stringify(x);
  if (typeof x === 'number' || typeof x === 'boolean' || x === null) return String(x);
  return Array.isArray(x) ? 'a list' : typeof x;
}

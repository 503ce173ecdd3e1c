// Validation of the envelope fields every stored record carries.
import type { RecordEnvelope } from './types';
import { requireObject, requireTime, requireUuid } from './checks';
import { isRev, parseRev } from './hlc';
import { RecordValidationError } from './validation-error';

/** Checks id (UUID), rev (revision string), updated_ms and the tombstone flag of a stored record of `kind`. */
export function validateEnvelope(kind: string, x: unknown): asserts x is RecordEnvelope {
  const o = requireObject(kind, kind, x);
  requireUuid(kind, 'id', o.id);
  if (!isRev(o.rev)) throw new RecordValidationError(kind, 'rev', 'a revision "<13-digit ms>-<6-digit counter>-<device>"', o.rev);
  requireTime(kind, 'updated_ms', o.updated_ms);
  if (o.deleted !== undefined && o.deleted !== true) throw new RecordValidationError(kind, 'deleted', 'true or absent', o.deleted);
  validateSeen(kind, 'seen', o.seen);
}

/** Most devices a version's `seen` list may name. */
export const MAX_SEEN = 256;

/** Checks an optional `seen` list: at most MAX_SEEN revisions, one per device. */
export function validateSeen(kind: string, field: string, x: unknown): void {
  if (x === undefined) return;
  if (!Array.isArray(x) || x.length > MAX_SEEN) throw new RecordValidationError(kind, field, `a list of at most ${MAX_SEEN} revisions`, x);
  const devices = new Set<string>();
  x.forEach((r, i) => {
    if (!isRev(r)) throw new RecordValidationError(kind, `${field}[${i}]`, 'a revision "<13-digit ms>-<6-digit counter>-<device>"', r);
    const device = parseRev(r).deviceId;
    if (devices.has(device)) throw new RecordValidationError(kind, `${field}[${i}]`, 'one revision per device', r);
    devices.add(device);
  });
}

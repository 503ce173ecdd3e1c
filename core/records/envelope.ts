// Validation of the envelope fields every stored record carries.
import type { RecordEnvelope } from './types';
import { requireObject, requireTime, requireUuid } from './checks';
import { isRev } from './hlc';
import { RecordValidationError } from './validation-error';

/** Checks id (UUID), rev (revision string), updated_ms and the tombstone flag of a stored record of `kind`. */
export function validateEnvelope(kind: string, x: unknown): asserts x is RecordEnvelope {
  const o = requireObject(kind, kind, x);
  requireUuid(kind, 'id', o.id);
  if (!isRev(o.rev)) throw new RecordValidationError(kind, 'rev', 'a revision "<13-digit ms>-<6-digit counter>-<device>"', o.rev);
  requireTime(kind, 'updated_ms', o.updated_ms);
  if (o.deleted !== undefined && o.deleted !== true) throw new RecordValidationError(kind, 'deleted', 'true or absent', o.deleted);
}

// Validation by kind: a record's body, a whole stored record, a sync record, a conflict.
import type { RecordKind, StoredRecords, SyncKind, SyncRecord } from './types';
import { SYNC_KINDS } from './types';
import { requireObject, requireOneOf, requireRef, requireTime, requireUuid } from './checks';
import { validateEnvelope, validateSeen } from './envelope';
import { isRev } from './hlc';
import { RecordValidationError } from './validation-error';
import { validateAnalysisBody } from './validate-analysis';
import { validateDraftBody } from './validate-draft';
import { validateLoggerDayBody } from './validate-logger-day';
import { validateGaugingBody } from './validate-gauging';
import { validateRatingBody } from './validate-rating';
import { validateReadingBody } from './validate-reading';
import { validatePhotoBody } from './validate-photo';
import { validateSiteBody } from './validate-site';

/** Checks a sync record: kind, id, rev, tombstone flag and the body of its kind (with updated_ms). */
export function validateSyncRecord(x: unknown): asserts x is SyncRecord {
  const o = requireObject('sync record', 'sync record', x);
  const kind = requireOneOf('sync record', 'kind', o.kind, SYNC_KINDS);
  requireUuid(kind, 'id', o.id);
  if (!isRev(o.rev)) throw new RecordValidationError(kind, 'rev', 'a revision "<13-digit ms>-<6-digit counter>-<device>"', o.rev);
  if (o.deleted !== undefined && o.deleted !== true) throw new RecordValidationError(kind, 'deleted', 'true or absent', o.deleted);
  const body = requireObject(kind, 'body', o.body);
  requireTime(kind, 'body.updated_ms', body.updated_ms);
  validateSeen(kind, 'body.seen', body.seen);
  validateBody(kind, body);
}

/** Checks a conflict's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateConflictBody(x: unknown): void {
  const k = 'conflict';
  const o = requireObject(k, 'conflict', x);
  const kind = requireOneOf(k, 'kind', o.kind, SYNC_KINDS);
  requireRef(k, 'recordId', o.recordId);
  validateSyncRecord(o.losing);
  const losing = o.losing as SyncRecord;
  if (losing.kind !== kind || losing.id !== o.recordId) {
    throw new RecordValidationError(k, 'losing', `a ${kind} record with id ${String(o.recordId)}`, `${losing.kind} ${losing.id}`);
  }
  if (!isRev(o.winnerRev)) throw new RecordValidationError(k, 'winnerRev', 'a revision string', o.winnerRev);
  if (o.reason !== undefined) requireOneOf(k, 'reason', o.reason, ['concurrent', 'ahead']);
  requireTime(k, 'found_ms', o.found_ms);
}

/** Checks the body fields of a record of `kind`, without its envelope. */
export function validateBody(kind: RecordKind, x: unknown): void {
  switch (kind) {
    case 'site':
      return validateSiteBody(x);
    case 'reading':
      return validateReadingBody(x);
    case 'gauging':
      return validateGaugingBody(x);
    case 'rating':
      return validateRatingBody(x);
    case 'analysis':
      return validateAnalysisBody(x);
    case 'logger-day':
      return validateLoggerDayBody(x);
    case 'photo':
      return validatePhotoBody(x);
    case 'draft':
      return validateDraftBody(x);
    case 'conflict':
      return validateConflictBody(x);
    default: {
      const unknownKind: never = kind;
      throw new RecordValidationError('record', 'kind', 'a known record kind', unknownKind);
    }
  }
}

/** Checks a whole stored record of `kind`: envelope and body. */
export function validateRecord<K extends RecordKind>(kind: K, x: unknown): asserts x is StoredRecords[K] {
  validateEnvelope(kind, x);
  validateBody(kind, x);
}

/** True when `kind` is a kind that syncs with the office. */
export function isSyncKind(kind: string): kind is SyncKind {
  return (SYNC_KINDS as readonly string[]).includes(kind);
}

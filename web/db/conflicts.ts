// Conflicts: losing versions kept after a merge for the user to review. Local only, never synced.
// Settling one writes a new version of the record that knows both sides (so the choice reaches the office
// and the same conflict never comes back), in one transaction with the removal of the conflict.
import {
  fromSyncRecord, parseRev, toSyncRecord, type ConflictRecord, type LoggerDayRecord, type ReadingRecord,
} from '../../core/records/index';
import { seenAfter, stampOf } from '../../core/sync/index';
import { now_ms, stampInTx } from './clock';
import { StorageError, storageMessage } from './errors';
import { putLoggerDaysInTx } from './logger-days';
import { afterWrite, listAll, listRange, putRecordsInTx, removeIn, removeInTx, saveIn, type PlainStore, type SaveInput } from './records';
import { putReadingsInTx, withReadingsWrite } from './readings-write';
import { beyondReadingsWrite, SCOPES, STORE_OF_KIND } from './stores';

/** What settling holds besides the readings writer's own stores: every other synced store and conflicts. */
const SETTLE_ALSO = beyondReadingsWrite(SCOPES.settle);

/** Keeps a losing version for review; resolves once it is durable. */
export const saveConflict = (conflict: SaveInput<ConflictRecord>): Promise<ConflictRecord> => saveIn('conflicts', conflict);
/** Removes a reviewed conflict. */
export const dismissConflict = (id: string): Promise<void> => removeIn('conflicts', id);

/** Every conflict waiting for review, oldest found first; only those of recordId when given. */
export async function listConflicts(recordId?: string): Promise<ConflictRecord[]> {
  const all = recordId === undefined ? await listAll('conflicts') : await listRange('conflicts', 'by-record', recordId, recordId);
  return all.sort((a, b) => a.found_ms - b.found_ms);
}

/**
 * Settles conflict `id`: with `useKept` the kept (losing) version's content becomes the record again,
 * otherwise the version in use stays. Either way a new version built on both is written (except for an
 * ahead-of-clock notice left as it is, which is only removed), and the conflict goes, in one transaction.
 */
export async function settleConflict(id: string, useKept: boolean): Promise<void> {
  const at = now_ms();
  // The one readings writer opens the transaction, so a settled reading and its series are written its way.
  const kind = await withReadingsWrite(SETTLE_ALSO, async (tx) => {
    const conflict = await tx.objectStore('conflicts').get(id);
    if (!conflict) throw new StorageError('not-found', storageMessage('not-found'));
    const store = tx.objectStore(STORE_OF_KIND[conflict.kind]);
    const current = await store.get(conflict.recordId);
    removeInTx(tx, 'conflicts', [id]);
    const notice = conflict.reason === 'ahead' && !useKept;
    if (!notice) {
      const inUse = current ? toSyncRecord(conflict.kind, current as never) : undefined;
      const rev = await stampInTx(tx, at, current?.rev);
      const chosen = useKept || !inUse ? conflict.losing : inUse;
      const bases = inUse ? [stampOf(inUse), stampOf(conflict.losing)] : [stampOf(conflict.losing)];
      const seen = seenAfter(parseRev(rev).deviceId, bases);
      const { seen: _old, ...body } = chosen.body as typeof chosen.body & { seen?: string[] };
      const record = fromSyncRecord({ ...chosen, rev, body: { ...body, updated_ms: at, ...(seen ? { seen } : {}) } } as typeof chosen);
      if (conflict.kind === 'reading') await putReadingsInTx(tx, [record as ReadingRecord]);
      else if (conflict.kind === 'logger-day') putLoggerDaysInTx(tx, [record as LoggerDayRecord]);
      else putRecordsInTx(tx, STORE_OF_KIND[conflict.kind] as PlainStore, [record as never]);
    }
    return conflict.kind;
  });
  afterWrite([kind, 'conflict']);
}

// Conflicts: losing versions kept after a merge for the user to review. Local only, never synced.
import type { ConflictRecord } from '../../core/records/index';
import { listAll, listRange, removeIn, saveIn, type SaveInput } from './records';

/** Keeps a losing version for review; resolves once it is durable. */
export const saveConflict = (conflict: SaveInput<ConflictRecord>): Promise<ConflictRecord> => saveIn('conflicts', conflict);
/** Removes a reviewed conflict. */
export const dismissConflict = (id: string): Promise<void> => removeIn('conflicts', id);

/** Every conflict waiting for review, oldest found first; only those of recordId when given. */
export async function listConflicts(recordId?: string): Promise<ConflictRecord[]> {
  const all = recordId === undefined ? await listAll('conflicts') : await listRange('conflicts', 'by-record', recordId, recordId);
  return all.sort((a, b) => a.found_ms - b.found_ms);
}

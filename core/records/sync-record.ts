// Conversion between stored records and the sync shape { kind, id, rev, deleted?, body }.
import type { StoredRecords, SyncBodies, SyncKind, SyncRecord } from './types';

/** The sync record for a stored record of `kind`: envelope fields lifted out, the rest (with updated_ms) as body. */
export function toSyncRecord<K extends SyncKind>(kind: K, record: StoredRecords[K]): SyncRecord<K> {
  const { id, rev, deleted, ...body } = record as StoredRecords[K] & { deleted?: true };
  const out = { kind, id, rev, body } as unknown as SyncRecord<K> & { deleted?: true };
  if (deleted === true) out.deleted = true;
  return out;
}

/** The stored record for a sync record: body fields plus id, rev, updated_ms and the tombstone flag. */
export function fromSyncRecord<K extends SyncKind>(sync: SyncRecord<K>): StoredRecords[K] {
  const s = sync as { id: string; rev: string; deleted?: true; body: SyncBodies[K] & { updated_ms: number } };
  const record = { ...s.body, id: s.id, rev: s.rev } as StoredRecords[K] & { deleted?: true };
  if (s.deleted === true) record.deleted = true;
  else delete record.deleted;
  return record;
}

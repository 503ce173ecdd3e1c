// The one place the receiver asks core which version of a record is current. Core owns the rule (core/sync:
// for one record the higher revision wins; the same revision is the same record); nothing here restates it.
// Every version stays in record_versions, so a losing version is never dropped: the office keeps them all.
import { decide, type SyncRecord } from '../../core/index';

/** The version that is current after `incoming` meets `held` (both the same kind and id): one of the two. */
export function winningRecord(held: SyncRecord, incoming: SyncRecord): SyncRecord {
  return decide(held, incoming, { now_ms: Date.now() }).winner === 'incoming' ? incoming : held;
}

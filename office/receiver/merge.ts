// The one place the receiver asks core which version of a record is current. Core owns the rule (for one
// record the higher revision wins; the same revision is the same record); nothing here restates it.
import { compareRev, type SyncRecord } from '../../core/index';

/** The version that is current after `incoming` meets `held` (both the same kind and id): one of the two. */
export function winningRecord(held: SyncRecord, incoming: SyncRecord): SyncRecord {
  return compareRev(incoming.rev, held.rev) > 0 ? incoming : held;
}

// The rule for one record id, given the stored version and an incoming one: the higher revision wins;
// the same revision is the same record; the loser is kept for review when it changed concurrently with
// the winner, or when the winner is dated ahead of the receiver's clock.
import type { ConflictReason, SyncRecord } from '../records/types';
import { descends, stampOf } from './ancestry';
import { AHEAD_TOLERANCE_MS, isAhead } from './ahead';
import { winsOver } from './winner';

/** The outcome for one incoming version against the stored one (stored may be absent). */
export type Decision =
  /** The same revision is already stored: nothing to do. */
  | { winner: 'same' }
  | {
      winner: 'stored' | 'incoming';
      /** Why the losing version must be kept for review; absent when it may be let go (or there is none). */
      keepLoser?: ConflictReason;
      /** The winner is dated more than the tolerance ahead of the receiver's clock. */
      ahead: boolean;
    };

/** The clock the decision is made against: now_ms (UTC ms) and the ahead tolerance in ms. */
export interface DecideOptions {
  now_ms: number;
  tolerance_ms?: number;
}

/** Decides between the stored version of a record (or none) and an incoming version of the same kind and id. */
export function decide(stored: SyncRecord | undefined, incoming: SyncRecord, options: DecideOptions): Decision {
  const tolerance = options.tolerance_ms ?? AHEAD_TOLERANCE_MS;
  if (stored !== undefined && (stored.kind !== incoming.kind || stored.id !== incoming.id)) {
    throw new RangeError(`decide compares two versions of one record; got ${stored.kind} ${stored.id} and ${incoming.kind} ${incoming.id}`);
  }
  if (stored === undefined) return { winner: 'incoming', ahead: isAhead(incoming.rev, options.now_ms, tolerance) };
  if (stored.rev === incoming.rev) return { winner: 'same' };
  const incomingWins = winsOver(incoming, stored);
  const [winner, loser] = incomingWins ? [incoming, stored] : [stored, incoming];
  const ahead = isAhead(winner.rev, options.now_ms, tolerance);
  const keepLoser: ConflictReason | undefined = !descends(stampOf(winner), stampOf(loser)) ? 'concurrent' : ahead ? 'ahead' : undefined;
  return keepLoser ? { winner: incomingWins ? 'incoming' : 'stored', keepLoser, ahead } : { winner: incomingWins ? 'incoming' : 'stored', ahead };
}

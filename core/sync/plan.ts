// Merging a list of incoming versions (one bundle, or all bundles of a pull) into a replica's state, as
// a plan the storage layer applies in one transaction: which records change, which versions are kept for
// review, which winners are dated ahead of the receiver's clock, and a summary for the screen.
import type { SyncKind, SyncRecord } from '../records/types';
import { AHEAD_TOLERANCE_MS, isAhead } from './ahead';
import { mergeIntoFrontier, recordKey, type Frontier } from './frontier';

/** One record whose kept versions change: before (absent for a new record) and after. */
export interface FrontierChange {
  before?: Frontier;
  after: Frontier;
}

/** A winner dated ahead of the receiver's clock, with the version it displaced (absent for a new record). */
export interface AheadFlag {
  record: SyncRecord;
  displaced?: SyncRecord;
}

/** Counts for the screen: records new here, updated, versions kept for review, repeats, ahead-dated winners. */
export interface MergeSummary {
  /** Records this replica did not have. */
  new: number;
  /** Records whose current version changes. */
  updated: number;
  /** Versions newly kept for review because two sides changed the record since they last agreed. */
  conflicts: number;
  /** Incoming versions that change nothing (already here, or older than what is here). */
  unchanged: number;
  /** Winners dated more than the tolerance ahead of the receiver's clock. */
  ahead: number;
  /** New and updated records by kind. */
  byKind: Partial<Record<SyncKind, { new: number; updated: number }>>;
}

/** What applying the incoming versions changes, keyed by recordKey(kind, id). */
export interface MergePlan {
  changes: Map<string, FrontierChange>;
  ahead: AheadFlag[];
  summary: MergeSummary;
}

/**
 * Plans the merge of `incoming` into the replica whose kept versions are `current` (it needs an entry for
 * every incoming key the replica holds), against the receiver's clock now_ms (UTC ms).
 */
export function planMerge(
  incoming: readonly SyncRecord[],
  current: ReadonlyMap<string, Frontier>,
  now_ms: number,
  tolerance_ms: number = AHEAD_TOLERANCE_MS,
): MergePlan {
  const changes = new Map<string, FrontierChange>();
  let unchanged = 0;
  for (const v of incoming) {
    const key = recordKey(v.kind, v.id);
    const change = changes.get(key);
    const f = change ? change.after : current.get(key);
    const next = mergeIntoFrontier(f, v);
    if (next === f) {
      unchanged++;
      continue;
    }
    if (change) change.after = next;
    else changes.set(key, { before: f, after: next });
  }
  const summary: MergeSummary = { new: 0, updated: 0, conflicts: 0, unchanged, ahead: 0, byKind: {} };
  const ahead: AheadFlag[] = [];
  for (const { before, after } of changes.values()) {
    const kind = after.winner.kind;
    const counts = (summary.byKind[kind] ??= { new: 0, updated: 0 });
    if (!before) {
      summary.new++;
      counts.new++;
    } else if (before.winner.rev !== after.winner.rev) {
      summary.updated++;
      counts.updated++;
    }
    const had = new Set(before ? before.others.map((o) => o.rev) : []);
    summary.conflicts += after.others.filter((o) => !had.has(o.rev)).length;
    if (before?.winner.rev !== after.winner.rev && isAhead(after.winner.rev, now_ms, tolerance_ms)) {
      ahead.push(before ? { record: after.winner, displaced: before.winner } : { record: after.winner });
    }
  }
  summary.ahead = ahead.length;
  return { changes, ahead, summary };
}

/** The replica state after a plan: `current` with every changed record's kept versions replaced. */
export function applyPlan(current: ReadonlyMap<string, Frontier>, plan: MergePlan): Map<string, Frontier> {
  const next = new Map(current);
  for (const [key, change] of plan.changes) next.set(key, change.after);
  return next;
}

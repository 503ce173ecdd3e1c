// The versions of one record a replica must keep: every version no other known version descends from
// (the frontier). The highest revision among them is the record; the others are concurrent changes kept
// for review. Merging a version is a set union followed by "keep the maximal ones", so it is idempotent
// and the order in which versions arrive does not change the result.
import type { SyncRecord } from '../records/types';
import { descends, stampOf } from './ancestry';
import { byRevision } from './winner';

/** The kept versions of one record: the winner (winningVersion: highest revision) and concurrent versions, by revision. */
export interface Frontier {
  winner: SyncRecord;
  /** Concurrent versions that lost to the winner, oldest revision first: the conflicts to review. */
  others: SyncRecord[];
}

/** The key of a record in merge state: kind and id. */
export function recordKey(kind: string, id: string): string {
  return `${kind}/${id}`;
}

/** The frontier of a set of versions of one record (empty input is refused). */
export function frontierOf(versions: readonly SyncRecord[]): Frontier {
  let f: Frontier | undefined;
  for (const v of versions) f = mergeIntoFrontier(f, v);
  if (!f) throw new RangeError('frontierOf needs at least one version');
  return f;
}

/**
 * The frontier after learning version v (of the same record): the same object when v adds nothing (it is
 * kept already or some kept version descends it), else the kept versions v does not descend, plus v.
 */
export function mergeIntoFrontier(f: Frontier | undefined, v: SyncRecord): Frontier {
  if (!f) return { winner: v, others: [] };
  if (f.winner.kind !== v.kind || f.winner.id !== v.id) {
    throw new RangeError(`mergeIntoFrontier merges versions of one record; got ${v.kind} ${v.id} for ${f.winner.kind} ${f.winner.id}`);
  }
  const kept = [f.winner, ...f.others];
  const sv = stampOf(v);
  if (kept.some((k) => descends(stampOf(k), sv))) return f;
  const members = [v, ...kept.filter((k) => !descends(sv, stampOf(k)))].sort(byRevision);
  return { winner: members[members.length - 1], others: members.slice(0, -1) };
}

// The outbox's own state beside its bundles (in the sync store): the limits that size the next bundle and
// the record versions set aside, each with its reason. A version the office refused (or this phone's own
// bundle checks refuse) is kept out of bundles so everything else keeps moving; the record itself stays on
// the phone. Fixing it (an edit, a delete) makes a new version that waits as usual; dropping it is a choice
// recorded here with its time. DOM-free: the service worker runs this too.
import type { BundleLimits, SyncKind } from '../../core/index';

/** The limits of the next bundle: the receiver's stated limit, a lowered budget, and a search for an unnamed refused record. */
export interface OutboxLimits extends BundleLimits {
  /**
   * A search in progress: the office refused a bundle without naming the record. Bundles hold at most
   * `records` records (halved at each refusal) until `left` records of the refused range were delivered
   * or the record was found and set aside.
   */
  search?: { records: number; left: number };
}

/** A record version kept out of bundles, with why, when, and whether the user chose not to send it. */
export interface SetAsideEntry {
  /** The version's mark "<rev> <kind> <id>". */
  mark: string;
  kind: SyncKind;
  id: string;
  rev: string;
  /** The site the record belongs to (for the link to its form), when it has one. */
  siteId?: string;
  /** A tombstone: the record was deleted on this phone. */
  deleted?: boolean;
  /** The reason in the office's or this phone's words. */
  reason: string;
  /** 'office': the office refused it; 'phone': this phone's bundle checks did. */
  by: 'office' | 'phone';
  at_ms: number;
  /** Set when the version will never be sent: the user chose so, or it is a deletion of a version that never went. */
  dropped?: { at_ms: number; because: 'chosen' | 'deleted' };
}

/** Most set-aside entries kept; the oldest dropped ones go first. */
export const MAX_SET_ASIDE = 500;

/** The marks that never go in a bundle: every version set aside, dropped or not. */
export function setAsideMarks(entries: readonly SetAsideEntry[] | undefined): Set<string> {
  return new Set((entries ?? []).map((e) => e.mark));
}

/** The list with `added` in it (one entry per mark, the newest reason wins), trimmed to MAX_SET_ASIDE. */
export function withSetAside(entries: readonly SetAsideEntry[] | undefined, added: readonly SetAsideEntry[]): SetAsideEntry[] {
  const byMark = new Map((entries ?? []).map((e) => [e.mark, e]));
  for (const a of added) byMark.set(a.mark, a);
  const all = [...byMark.values()];
  while (all.length > MAX_SET_ASIDE) {
    const i = all.findIndex((e) => e.dropped !== undefined);
    all.splice(i >= 0 ? i : 0, 1);
  }
  return all;
}

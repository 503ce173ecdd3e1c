// Which version of a record wins: the one with the higher revision. Revisions sort as strings (wall time,
// then counter, then device; core/records/hlc.ts), so every replica picks the same winner from the same
// versions whatever order they came in. The one home of the rule: the phone's merge (frontier.ts, plan.ts),
// the pairwise decision (decide.ts), the office receiver and the command line's exports all ask here.

/** Orders versions by revision, oldest first: a comparator for Array.prototype.sort. */
export function byRevision(a: { rev: string }, b: { rev: string }): number {
  return a.rev < b.rev ? -1 : a.rev > b.rev ? 1 : 0;
}

/** True when version a wins over version b of the same record (a strictly higher revision). */
export function winsOver(a: { rev: string }, b: { rev: string }): boolean {
  return a.rev > b.rev;
}

/** The winning version among versions of one record (the highest revision); undefined for none. */
export function winningVersion<T extends { rev: string }>(versions: Iterable<T>): T | undefined {
  let best: T | undefined;
  for (const v of versions) if (best === undefined || winsOver(v, best)) best = v;
  return best;
}

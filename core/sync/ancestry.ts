// Which version knew which. Each version carries its revision and a `seen` list (the latest revision of
// every other device it was built on), a version vector in revision form. A version descends an older
// one when it was made knowing it; two versions where neither descends the other changed concurrently.
//
// What a version knows (the one definition; test/support/sync-history.ts's reference says the same):
// - itself;
// - the versions it was built on (the version edited, or every version a settlement covered), and all
//   they knew;
// - every earlier version of the SAME record written by its own device (a device knows what it wrote),
//   and all they knew: so a new version's `seen` also covers its device's own versions of the record
//   still kept (`ownKeptBases`).
// Never anything through another record: that a device edited record B after receiving some version of
// B says nothing about which versions of record A it had reviewed.
import { parseRev } from '../records/hlc';
import type { SyncRecord } from '../records/types';

/** What ancestry reads of a version: its revision and its `seen` list (revisions of other devices). */
export interface VersionStamp {
  rev: string;
  seen?: readonly string[];
}

/** The revision and `seen` list of a sync record (the list travels in its body). */
export function stampOf(record: SyncRecord): VersionStamp {
  return { rev: record.rev, seen: record.body.seen };
}

/**
 * True when version a was made knowing version b (or is b): the same revision, a later revision from
 * b's own device, or a `seen` entry from b's device at or after b's revision.
 */
export function descends(a: VersionStamp, b: VersionStamp): boolean {
  if (a.rev === b.rev) return true;
  const device = parseRev(b.rev).deviceId;
  if (parseRev(a.rev).deviceId === device) return a.rev > b.rev;
  for (const s of a.seen ?? []) {
    if (parseRev(s).deviceId === device) return s >= b.rev;
  }
  return false;
}

/**
 * The bases a new version by `deviceId` carries in its `seen` besides the version(s) it was built on:
 * that device's own versions of the record still kept as concurrent changes (`kept`, e.g. a frontier's
 * others or the record's conflicts), since the new version knows them by device order.
 */
export function ownKeptBases<T extends VersionStamp>(deviceId: string, kept: readonly T[]): T[] {
  return kept.filter((k) => parseRev(k.rev).deviceId === deviceId);
}

/**
 * The `seen` list of a new version written by `deviceId` on top of `bases` (the version edited, or every
 * version a review settles): the latest revision of each other device among the bases and their own
 * `seen` lists, sorted; undefined when there is none. Pass the device's own kept versions of the record
 * too (`ownKeptBases`), or device order would claim knowledge `seen` does not carry. The new version's own revision must sort above
 * every base (the revision clock guarantees it), so entries of its own device are left out.
 */
export function seenAfter(deviceId: string, bases: readonly VersionStamp[]): string[] | undefined {
  const latest = new Map<string, string>();
  const note = (rev: string) => {
    const d = parseRev(rev).deviceId;
    if (d === deviceId) return;
    const had = latest.get(d);
    if (had === undefined || rev > had) latest.set(d, rev);
  };
  for (const b of bases) {
    note(b.rev);
    for (const s of b.seen ?? []) note(s);
  }
  return latest.size === 0 ? undefined : [...latest.values()].sort();
}

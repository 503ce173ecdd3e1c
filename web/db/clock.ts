// The device id and the revision clock. The last revision lives in meta and is read and advanced inside
// each save's own transaction, so two tabs of one browser never issue the same revision.
import { maxRev, nextRev } from '../../core/records/index';
import { withDb } from './connection';
import { quietly } from './quietly';

let clock: () => number = () => Date.now();
let lastIssued: string | undefined;

/** The wall clock used for revisions and updated_ms, UTC ms. */
export function now_ms(): number {
  return clock();
}

/** Replaces the wall clock (tests only); undefined restores Date.now. */
export function setClockForTests(fn: (() => number) | undefined): void {
  clock = fn ?? (() => Date.now());
  lastIssued = undefined;
}

/** What stampInTx needs of a readwrite transaction: its meta store. */
export interface MetaTx {
  objectStore(name: 'meta'): { get(key: string): Promise<unknown>; put(value: string, key: string): Promise<unknown> };
}

/**
 * Issues the next revision inside tx: reads the device id (creating it on first use) and the last
 * revision from meta, advances the clock past it, this tab's memory and `above` (the revision being
 * replaced, when there is one), and writes it back.
 */
export async function stampInTx(tx: MetaTx, at_ms: number, above?: string): Promise<string> {
  const meta = tx.objectStore('meta');
  const [storedDevice, storedLast] = await Promise.all([meta.get('deviceId'), meta.get('lastRev')]);
  let deviceId: string;
  if (typeof storedDevice === 'string') deviceId = storedDevice;
  else {
    deviceId = crypto.randomUUID();
    quietly(meta.put(deviceId, 'deviceId'));
  }
  // `above`: the revision of the version being replaced, which may come from a clock ahead of this one;
  // the new revision must sort above it or the edit would lose to its own starting point.
  const previous = maxRev(maxRev(typeof storedLast === 'string' ? storedLast : undefined, lastIssued), above);
  const rev = nextRev(previous, at_ms, deviceId);
  quietly(meta.put(rev, 'lastRev'));
  lastIssued = rev;
  return rev;
}

/** This browser profile's device id (a UUID), created and stored on first use. */
export function deviceId(): Promise<string> {
  return withDb(async (db) => {
    const tx = db.transaction('meta', 'readwrite');
    const meta = tx.objectStore('meta');
    let id = await meta.get('deviceId');
    if (typeof id !== 'string') {
      id = crypto.randomUUID();
      quietly(meta.put(id, 'deviceId'));
    }
    await tx.done;
    return id;
  });
}

/**
 * Moves the revision clock in meta past `highest` (a revision seen from another device) inside an open
 * transaction that holds meta, so later local revisions sort above it; nothing when undefined or lower.
 */
export async function observeRevsInTx(tx: MetaTx, highest: string | undefined): Promise<void> {
  if (highest === undefined) return;
  const meta = tx.objectStore('meta');
  const stored = await meta.get('lastRev');
  const next = maxRev(typeof stored === 'string' ? stored : undefined, highest);
  if (next !== stored && next !== undefined) quietly(meta.put(next, 'lastRev'));
}

/** Records a revision seen from another device, so every later local revision sorts above it. */
export function observeRev(rev: string): Promise<void> {
  return withDb(async (db) => {
    const tx = db.transaction('meta', 'readwrite');
    const meta = tx.objectStore('meta');
    const stored = await meta.get('lastRev');
    const highest = maxRev(typeof stored === 'string' ? stored : undefined, rev);
    if (highest !== stored && highest !== undefined) quietly(meta.put(highest, 'lastRev'));
    await tx.done;
  });
}

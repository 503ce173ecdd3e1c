// Notifications for screens: database events (reload needed, blocked) and record changes, the latter
// also from other tabs through a BroadcastChannel when the browser has one.
import type { RecordKind } from '../../core/records/index';

/** Something about the database connection the UI may need to tell the user. */
export type DbEvent =
  | { type: 'reload-needed' } // a newer version opened in another tab: this page must reload to keep saving
  | { type: 'blocked' } // an older tab keeps this page's upgrade waiting until it closes
  | { type: 'reopened' }; // the browser closed the connection and it was opened again

/** Which records changed: their kinds and, when few, their ids; fromOtherTab when another tab saved them. */
export interface RecordsChange {
  kinds: RecordKind[];
  /** Ids of the changed records; absent after a bulk import (re-read the whole window). */
  ids?: string[];
  fromOtherTab: boolean;
}

const CHANNEL = 'freshet-records';
const dbListeners = new Set<(e: DbEvent) => void>();
const changeListeners = new Set<(c: RecordsChange) => void>();
let channel: BroadcastChannel | undefined;

/** Calls cb on every database event; returns the function that stops it. */
export function onDbEvent(cb: (e: DbEvent) => void): () => void {
  dbListeners.add(cb);
  return () => dbListeners.delete(cb);
}

/** Tells every database-event listener. */
export function emitDbEvent(e: DbEvent): void {
  for (const cb of [...dbListeners]) cb(e);
}

function ensureChannel(): BroadcastChannel | undefined {
  if (channel || typeof BroadcastChannel === 'undefined') return channel;
  channel = new BroadcastChannel(CHANNEL);
  channel.onmessage = (ev: MessageEvent<{ kinds: RecordKind[]; ids?: string[] }>) => {
    deliver({ kinds: ev.data.kinds, ids: ev.data.ids, fromOtherTab: true });
  };
  // Node (tests) keeps the process alive while a channel listens; a browser tab has no such method.
  (channel as BroadcastChannel & { unref?: () => void }).unref?.();
  return channel;
}

function deliver(change: RecordsChange): void {
  for (const cb of [...changeListeners]) cb(change);
}

/** Calls cb after records are saved, deleted or restored, in this tab or another; returns the stop function. */
export function onRecordsChanged(cb: (c: RecordsChange) => void): () => void {
  ensureChannel();
  changeListeners.add(cb);
  return () => changeListeners.delete(cb);
}

/** Tells this tab's listeners and other tabs that records of `kinds` changed. */
export function notifyRecordsChanged(kinds: RecordKind[], ids?: string[]): void {
  deliver({ kinds, ids, fromOtherTab: false });
  ensureChannel()?.postMessage({ kinds, ids });
}

/** Closes the cross-tab channel and forgets every listener (tests only). */
export function resetEventsForTests(): void {
  channel?.close();
  channel = undefined;
  dbListeners.clear();
  changeListeners.clear();
}

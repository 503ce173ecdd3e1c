// The sync store (version 2): settings, marks, the pull cursor and the status, one value per key.
import { withDb } from './connection';
import type { SyncKey, SyncStatusRecord, SyncValues } from './schema';
import { notifySyncChanged } from './sync-events';

/** The value kept under a sync key, or undefined. */
export function getSyncValue<K extends SyncKey>(key: K): Promise<SyncValues[K] | undefined> {
  return withDb(async (db) => (await db.get('sync', key)) as SyncValues[K] | undefined);
}

/** Puts a sync value inside an open transaction that holds the sync store (the merge's pull cursor, the outbox's marks). */
export function putSyncInTx<K extends SyncKey>(
  tx: { objectStore(name: 'sync'): { put(value: SyncValues[SyncKey], key: SyncKey): Promise<unknown> } },
  key: K,
  value: SyncValues[K],
): Promise<unknown> {
  return tx.objectStore('sync').put(value, key);
}

/** Stores a sync value; resolves once it is written. */
export async function setSyncValue<K extends SyncKey>(key: K, value: SyncValues[K]): Promise<void> {
  await withDb(async (db) => {
    const tx = db.transaction('sync', 'readwrite');
    await Promise.all([tx.store.put(value, key), tx.done]);
  });
  notifySyncChanged();
}

/** Changes the sync status in one transaction: `change` gets the stored status and returns the new one. */
export async function updateSyncStatus(change: (s: SyncStatusRecord) => SyncStatusRecord): Promise<SyncStatusRecord> {
  const next = await withDb(async (db) => {
    const tx = db.transaction('sync', 'readwrite');
    const s = change(((await tx.store.get('status')) as SyncStatusRecord | undefined) ?? {});
    await Promise.all([tx.store.put(s, 'status'), tx.done]);
    return s;
  });
  notifySyncChanged();
  return next;
}

/** Records a failed exchange in the sync status, in words for the Sync screen (UTC ms now). */
export async function noteSyncProblem(problem: { message: string; kind: 'retry' | 'fix' }): Promise<void> {
  await updateSyncStatus((s) => ({ ...s, lastProblem: { message: problem.message, kind: problem.kind, at_ms: Date.now() } }));
}

// The meta store: device id, the revision clock, sync cursors.
import type { MetaKey, MetaValues } from './schema';
import { withDb } from './connection';

/** The value kept under a meta key, or undefined. */
export function getMeta<K extends MetaKey>(key: K): Promise<MetaValues[K] | undefined> {
  return withDb(async (db) => (await db.get('meta', key)) as MetaValues[K] | undefined);
}

/** Stores a meta value (e.g. a sync cursor "cursor:office"); resolves once it is durable. */
export function setMeta<K extends MetaKey>(key: K, value: MetaValues[K]): Promise<void> {
  return withDb(async (db) => {
    const tx = db.transaction('meta', 'readwrite');
    await Promise.all([tx.store.put(value, key), tx.done]);
  });
}

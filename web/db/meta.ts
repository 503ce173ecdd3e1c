// The meta store, read side: the device id and the revision clock (written only by clock.ts).
import type { MetaKey, MetaValues } from './schema';
import { withDb } from './connection';

/** The value kept under a meta key, or undefined. */
export function getMeta<K extends MetaKey>(key: K): Promise<MetaValues[K] | undefined> {
  return withDb(async (db) => (await db.get('meta', key)) as MetaValues[K] | undefined);
}

// Never called: writes that only each store's writer (web/db/stores.ts) may make, written the ways a
// module might slip them in. test/db/one-writer.test.ts checks that its detector finds every one here.
import { unwrap, type IDBPTransaction, type StoreNames } from 'idb';
import type { FreshetConnection } from '../../web/db/connection';
import type { FreshetDB } from '../../web/db/schema';

/** A readwrite transaction on readings by name. */
export function byName(db: FreshetConnection): unknown {
  return db.transaction('readings', 'readwrite');
}

/** A readwrite transaction whose store list includes readings. */
export function inList(db: FreshetConnection): unknown {
  return db.transaction(['sites', 'readings'], 'readwrite');
}

/** A readwrite transaction over a store chosen at run time that may be readings. */
export function generic<S extends StoreNames<FreshetDB>>(db: FreshetConnection, store: S): unknown {
  return db.transaction([store, 'meta'], 'readwrite');
}

/** idb's shortcut put, which opens its own readwrite transaction. */
export function shortcut(db: FreshetConnection, r: FreshetDB['readings']['value']): unknown {
  return db.put('readings', r);
}

/** A put on a store reached by name inside a transaction opened elsewhere. */
export function inOpenTx(tx: IDBPTransaction<FreshetDB, StoreNames<FreshetDB>[], 'readwrite'>): unknown {
  const meta = tx.objectStore('meta');
  return meta.put('x', 'lastRev');
}

/** A delete on the raw store behind idb's wrapper (the fast path of bulk writes). */
export function raw(tx: IDBPTransaction<FreshetDB, StoreNames<FreshetDB>[], 'readwrite'>): unknown {
  return unwrap(tx.objectStore('loggerDays')).delete('x');
}

/** A write through a structural type that only promises `objectStore('outbox')`. */
export function structural(tx: { objectStore(name: 'outbox'): { delete(id: string): Promise<void> } }): unknown {
  return tx.objectStore('outbox').delete('x');
}

/** A raw store whose name the types cannot know: it may be any store. */
export function unknownStore(store: IDBObjectStore): unknown {
  return store.clear();
}

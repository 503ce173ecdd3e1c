// Never called: the writes to `readings` that only web/db/readings-write.ts may make, written the ways a
// module might slip them in. test/db/one-writer.test.ts checks that its detector finds every one here.
import type { StoreNames } from 'idb';
import type { FreshetDb } from '../../web/db/index';
import type { FreshetDB } from '../../web/db/schema';

/** A readwrite transaction on readings by name. */
export function byName(db: FreshetDb): unknown {
  return db.transaction('readings', 'readwrite');
}

/** A readwrite transaction whose store list includes readings. */
export function inList(db: FreshetDb): unknown {
  return db.transaction(['sites', 'readings'], 'readwrite');
}

/** A readwrite transaction over a store chosen at run time that may be readings. */
export function generic<S extends StoreNames<FreshetDB>>(db: FreshetDb, store: S): unknown {
  return db.transaction([store, 'meta'], 'readwrite');
}

/** idb's shortcut put, which opens its own readwrite transaction. */
export function shortcut(db: FreshetDb, r: FreshetDB['readings']['value']): unknown {
  return db.put('readings', r);
}

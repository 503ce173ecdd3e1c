// The one table of the stores (shared design notes, Storage): for each IndexedDB store, the record kind
// it keeps (none for local bookkeeping), whether it syncs with the office, and the one module that writes
// it. KIND_OF_STORE, STORE_OF_KIND and every multi-store transaction's store list come from here, and
// test/db/one-writer.test.ts holds every store to its writer. Pure data: the service worker may import it.
import type { StoreNames } from 'idb';
import type { RecordKind, SyncKind } from '../../core/records/index';
import type { FreshetDB } from './schema';

/** What the table says of one store: its record kind (null: no records), whether it syncs, its writer. */
export interface StoreFacts {
  kind: RecordKind | null;
  syncs: boolean;
  /** The only module (path from the repository root) that puts, adds, deletes or clears in this store. */
  writer: string;
}

/** Every store of the database, in one table. */
export const STORES = {
  sites: { kind: 'site', syncs: true, writer: 'web/db/records.ts' },
  readings: { kind: 'reading', syncs: true, writer: 'web/db/readings-write.ts' },
  gaugings: { kind: 'gauging', syncs: true, writer: 'web/db/records.ts' },
  ratings: { kind: 'rating', syncs: true, writer: 'web/db/records.ts' },
  analyses: { kind: 'analysis', syncs: true, writer: 'web/db/records.ts' },
  loggerDays: { kind: 'logger-day', syncs: true, writer: 'web/db/logger-days.ts' },
  photos: { kind: 'photo', syncs: true, writer: 'web/db/records.ts' },
  drafts: { kind: 'draft', syncs: false, writer: 'web/db/records.ts' },
  conflicts: { kind: 'conflict', syncs: false, writer: 'web/db/records.ts' },
  meta: { kind: null, syncs: false, writer: 'web/db/clock.ts' },
  series: { kind: null, syncs: false, writer: 'web/db/series-edit.ts' },
  sync: { kind: null, syncs: false, writer: 'web/db/sync-store.ts' },
  outbox: { kind: null, syncs: false, writer: 'web/db/outbox.ts' },
  photoBytes: { kind: null, syncs: false, writer: 'web/db/photo-bytes.ts' },
} as const satisfies { [S in StoreNames<FreshetDB>]: StoreFacts };

type Table = typeof STORES;
/** Every store name. */
export type StoreName = keyof Table;
/** Stores that hold records (an envelope with id, rev, updated_ms). */
export type RecordStore = { [S in StoreName]: Table[S]['kind'] extends null ? never : S }[StoreName];
/** Stores whose records sync with the office. */
export type SyncedStore = { [S in StoreName]: Table[S]['syncs'] extends true ? S : never }[StoreName];

const names = Object.keys(STORES) as StoreName[];

/** Every store name, in table order. */
export const STORE_NAMES: readonly StoreName[] = names;

/** The stores whose records sync, in table order. */
export const SYNCED_STORES = names.filter((s) => STORES[s].syncs) as SyncedStore[];

/** The record kind kept in each record store. */
export const KIND_OF_STORE = Object.fromEntries(
  names.filter((s) => STORES[s].kind !== null).map((s) => [s, STORES[s].kind]),
) as { [S in RecordStore]: Table[S]['kind'] };

/** The store that keeps each kind of synced record. */
export const STORE_OF_KIND = Object.fromEntries(SYNCED_STORES.map((s) => [STORES[s].kind, s])) as {
  [S in SyncedStore as Table[S]['kind'] & SyncKind]: S;
};

/** Stores written by `writer` (a module path from the repository root). */
export function storesWrittenBy(writer: string): StoreName[] {
  return names.filter((s) => STORES[s].writer === writer);
}

/**
 * The store list of every multi-store transaction, named by what the transaction does: no module spells a
 * store list by hand (test/db/store-lists.test.ts). A single-store transaction names its one store.
 */
export const SCOPES = {
  /** Every write of readings: the readings, their series (kept in step) and meta (the revision clock). */
  readingsWrite: ['readings', 'series', 'meta'],
  /** What a save or delete holds beside the record's own store: meta (its revision) and conflicts (its kept versions). */
  save: ['meta', 'conflicts'],
  /** A save that also removes the form's draft in the same transaction. */
  saveWithDraft: ['meta', 'conflicts', 'drafts'],
  /** A logger import, beside the readings write: the logger days. */
  loggerImport: ['loggerDays'],
  /** A merge of incoming records: every synced store, series (written with readings), conflicts, meta, sync. */
  merge: [...SYNCED_STORES, 'series', 'conflicts', 'meta', 'sync'],
  /** Settling a conflict: every synced store and conflicts (beside the readings write's own stores). */
  settle: [...SYNCED_STORES, 'conflicts'],
  /** The outbox and its marks, limits and set-aside list (the sync store). */
  outbox: ['outbox', 'sync'],
  /** What waits to be sent: every synced store, the device id (meta) and the acknowledged mark (sync). */
  waiting: [...SYNCED_STORES, 'meta', 'sync'],
  /** The set-aside versions with the records they name: every synced store and sync. */
  setAside: [...SYNCED_STORES, 'sync'],
  /** Spot readings with the site's ratings (their discharge). */
  readingsDischarge: ['readings', 'ratings'],
  /** A stage series (spot readings' chunks and logger days) with the site's ratings. */
  seriesDischarge: ['series', 'loggerDays', 'ratings'],
  /** A stage record (spot readings and logger days) with the site's ratings. */
  recordDischarge: ['readings', 'loggerDays', 'ratings'],
  /** A stage series: the spot readings' day chunks and the logger days. */
  series: ['series', 'loggerDays'],
  /** A site's ratings with its gaugings. */
  ratingsGaugings: ['ratings', 'gaugings'],
  /** Photo bytes with the photo records that name them (by hash). */
  photoBytesNamed: ['photoBytes', 'photos'],
} as const satisfies Record<string, readonly StoreName[]>;

/** The stores every readings write holds. */
export type ReadingsWriteStore = (typeof SCOPES.readingsWrite)[number];

/** `stores` less those every readings write holds already: what a caller of the readings writer asks for beside them. */
export function beyondReadingsWrite<S extends StoreName>(stores: readonly S[]): Exclude<S, ReadingsWriteStore>[] {
  const own: readonly StoreName[] = SCOPES.readingsWrite;
  return stores.filter((s): s is Exclude<S, ReadingsWriteStore> => !own.includes(s));
}

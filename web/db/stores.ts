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

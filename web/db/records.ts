// The operations every record store shares: save, get, tombstone, restore, list by index range.
// Each write is one transaction over the store and meta (for the revision), awaited to tx.done.
import type { IndexNames, StoreNames } from 'idb';
import {
  isSyncKind, isUuid, parseRev, RecordValidationError, validateBody, type ConflictRecord, type RecordKind, type StoredRecords,
} from '../../core/records/index';
import { ownKeptBases, seenAfter, stampOf, type VersionStamp } from '../../core/sync/index';
import type { FreshetDB } from './schema';
import { KIND_OF_STORE, SCOPES, type RecordStore } from './stores';

/** Stores this module writes (saveIn and its kin): every record store but readings and loggerDays (stores.ts). */
export type PlainStore = Exclude<RecordStore, 'readings' | 'loggerDays'>;
import { withDb } from './connection';
import { now_ms, stampInTx } from './clock';
import { StorageError, storageMessage } from './errors';
import { notifyRecordsChanged } from './events';
import { requestPersistenceOnce } from './persist';
import { quietly } from './quietly';

/** The record type kept in store S. */
export type RecordOf<S extends RecordStore> = StoredRecords[(typeof KIND_OF_STORE)[S]];

/** What a caller passes to save: the fields, with id to overwrite an existing record (rev, updated_ms, deleted are ignored). */
export type SaveInput<T> = Omit<T, 'id' | 'rev' | 'updated_ms' | 'deleted'> & { id?: string; rev?: string; updated_ms?: number; deleted?: true };

/** Options for reads: tombstones are left out unless includeDeleted is true. */
export interface ReadOptions {
  includeDeleted?: boolean;
}

/**
 * Transaction options for every record write: 'strict' asks the browser to flush to disk before
 * reporting complete, so "saved" survives the phone dying a moment later (a human-paced save can
 * afford the flush; a bulk import pays it once).
 */
export const DURABLE: IDBTransactionOptions = { durability: 'strict' };

/** Runs fn inside tx; on any failure aborts tx (so nothing of it is written) and rethrows. */
export async function inTx<T>(tx: { abort(): void; done: Promise<void> }, fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    try {
      tx.abort();
    } catch {
      // Already finished or aborted: nothing left to undo.
    }
    await tx.done.catch(() => undefined);
    throw e;
  }
}

/** After a write is durable: ask for persistent storage (first time) and tell the screens. */
export function afterWrite(kinds: RecordKind[], ids?: string[]): void {
  requestPersistenceOnce();
  notifyRecordsChanged(kinds, ids);
}

function splitInput(kind: RecordKind, input: object): { id: string | undefined; body: Record<string, unknown> } {
  const { id, rev: _rev, updated_ms: _updated, deleted: _deleted, seen: _seen, ...body } = input as Record<string, unknown>;
  if (id !== undefined && !isUuid(id)) throw new RecordValidationError(kind, 'id', 'a lower-case UUID or absent for a new record', id);
  validateBody(kind, body);
  return { id: id as string | undefined, body };
}

/**
 * The record with the `seen` list of a new version `rev` written on top of `before` (none for a first
 * version) and `kept`, the record's versions kept for review (its conflicts): those this device wrote are
 * known to the new version by device order, so it carries what they knew (core/sync/ancestry.ts).
 */
export function withSeen<T extends object>(
  record: T,
  rev: string,
  before: VersionStamp | undefined,
  kept: readonly ConflictRecord[] = [],
): T & { seen?: string[] } {
  const deviceId = parseRev(rev).deviceId;
  const bases = [...(before ? [before] : []), ...ownKeptBases(deviceId, kept.map((c) => stampOf(c.losing)))];
  const seen = bases.length > 0 ? seenAfter(deviceId, bases) : undefined;
  return seen ? { ...record, seen } : record;
}

/** Store names without repeats (a transaction over `conflicts` itself names it once). */
function uniqueStores<T extends string>(names: readonly T[]): T[] {
  return [...new Set(names)];
}

/** The versions of record `id` of `kind` kept for review, read inside a transaction that holds `conflicts`. */
export async function keptInTx(
  tx: { objectStore(name: 'conflicts'): { index(name: 'by-record'): { getAll(key: string): Promise<ConflictRecord[]> } } },
  kind: RecordKind,
  id: string,
): Promise<ConflictRecord[]> {
  const all = await tx.objectStore('conflicts').index('by-record').getAll(id);
  return all.filter((c) => c.kind === kind);
}

/** Options of a save: the draft of the form the record came from, deleted in the same transaction. */
export interface SaveOptions {
  draftId?: string;
}

/**
 * Validates and saves one record in store S: new id when absent, new rev, updated_ms now; resolves when
 * durable. `draftId`'s draft is removed in the same transaction, so a crash never offers it again.
 */
export async function saveIn<S extends PlainStore>(store: S, input: SaveInput<RecordOf<S>>, options: SaveOptions = {}): Promise<RecordOf<S>> {
  const kind = KIND_OF_STORE[store];
  const { id: given, body } = splitInput(kind, input);
  const id = given ?? crypto.randomUUID();
  const at = now_ms();
  const saved = await withDb(async (db) => {
    const tx = db.transaction(uniqueStores([store, ...(options.draftId !== undefined ? SCOPES.saveWithDraft : SCOPES.save)]), 'readwrite', DURABLE);
    return inTx(tx, async () => {
      const s = tx.objectStore(store);
      if (options.draftId !== undefined) quietly(tx.objectStore('drafts').delete(options.draftId));
      // The earlier version: its revision and `seen` list carry over (sync tells edits from concurrent
      // changes by them), with what this device's own kept versions of the record knew.
      const before = (await s.get(id)) as RecordOf<S> | undefined;
      const kept = isSyncKind(kind) ? await keptInTx(tx, kind, id) : [];
      const rev = await stampInTx(tx, at, before?.rev);
      const record = withSeen({ ...body, id, rev, updated_ms: at }, rev, before, kept) as unknown as RecordOf<S>;
      quietly(s.put(record as FreshetDB[S]['value']));
      await tx.done;
      return record;
    });
  });
  afterWrite(options.draftId !== undefined ? [kind, 'draft'] : [kind], [id]);
  return saved;
}

/** The record with this id in store S, or undefined; tombstones only with includeDeleted. */
export async function getIn<S extends RecordStore>(store: S, id: string, options: ReadOptions = {}): Promise<RecordOf<S> | undefined> {
  const record = (await withDb((db) => db.get(store, id))) as RecordOf<S> | undefined;
  if (!record || (record.deleted && !options.includeDeleted)) return undefined;
  return record;
}

/** Marks or unmarks a record deleted under a new revision; undefined when there is nothing to change. */
async function setDeleted<S extends PlainStore>(store: S, id: string, deleted: boolean): Promise<RecordOf<S> | undefined> {
  const kind = KIND_OF_STORE[store];
  const at = now_ms();
  const changed = await withDb(async (db) => {
    const tx = db.transaction(uniqueStores([store, ...SCOPES.save]), 'readwrite', DURABLE);
    return inTx(tx, async () => {
      const s = tx.objectStore(store);
      const existing = (await s.get(id)) as RecordOf<S> | undefined;
      if (!existing) throw new StorageError('not-found', storageMessage('not-found'));
      const kept = isSyncKind(kind) ? await keptInTx(tx, kind, id) : [];
      if ((existing.deleted === true) === deleted) {
        await tx.done;
        return undefined;
      }
      const rev = await stampInTx(tx, at, existing.rev);
      const { deleted: _was, seen: _seen, ...rest } = existing as RecordOf<S> & { deleted?: true };
      const fields = withSeen({ ...rest, rev, updated_ms: at }, rev, existing, kept);
      const record = (deleted ? { ...fields, deleted: true } : fields) as RecordOf<S>;
      quietly(s.put(record as FreshetDB[S]['value']));
      await tx.done;
      return record;
    });
  });
  if (changed) afterWrite([kind], [id]);
  return changed;
}

/** Deletes by tombstone (deleted: true, new rev); returns the tombstone, or undefined when already deleted. */
export function tombstoneIn<S extends PlainStore>(store: S, id: string): Promise<RecordOf<S> | undefined> {
  return setDeleted(store, id, true);
}

/** Undoes a deletion: writes the record again without the tombstone under a new rev; undefined when not deleted. */
export function restoreIn<S extends PlainStore>(store: S, id: string): Promise<RecordOf<S> | undefined> {
  return setDeleted(store, id, false);
}

/**
 * Puts whole records (each with its own id and rev: merged from another device, or a settled conflict)
 * into store S inside an open transaction that holds it. The writers of readings and logger days have
 * their own (putReadingsInTx, putLoggerDaysInTx).
 */
export function putRecordsInTx<S extends PlainStore>(
  tx: { objectStore(name: S): { put(value: FreshetDB[S]['value']): Promise<unknown> } },
  store: S,
  records: readonly FreshetDB[S]['value'][],
): void {
  const s = tx.objectStore(store);
  for (const r of records) quietly(s.put(r));
}

/** Deletes local-only records (drafts, conflicts) by id inside an open transaction that holds the store. */
export function removeInTx<S extends 'drafts' | 'conflicts'>(
  tx: { objectStore(name: S): { delete(key: string): Promise<unknown> } },
  store: S,
  ids: readonly string[],
): void {
  const s = tx.objectStore(store);
  for (const id of ids) quietly(s.delete(id));
}

/** Removes a local-only record outright (drafts, conflicts: they never sync, so no tombstone is needed). */
export async function removeIn(store: 'drafts' | 'conflicts', id: string): Promise<void> {
  await withDb(async (db) => {
    const tx = db.transaction(store, 'readwrite');
    await inTx(tx, async () => {
      quietly(tx.objectStore(store).delete(id));
      await tx.done;
    });
  });
  afterWrite([KIND_OF_STORE[store]], [id]);
}

/** Records of store S whose index key lies in [lower, upper], in index order; tombstones only with includeDeleted. */
export async function listRange<S extends RecordStore>(
  store: S,
  index: IndexNames<FreshetDB, S>,
  lower: IDBValidKey,
  upper: IDBValidKey,
  options: ReadOptions = {},
): Promise<RecordOf<S>[]> {
  const all = (await withDb((db) => db.getAllFromIndex(store, index, IDBKeyRange.bound(lower, upper)))) as RecordOf<S>[];
  return options.includeDeleted ? all : all.filter((r) => !r.deleted);
}

/** Every record of store S; tombstones only with includeDeleted. */
export async function listAll<S extends RecordStore>(store: S, options: ReadOptions = {}): Promise<RecordOf<S>[]> {
  const all = (await withDb((db) => db.getAll(store))) as RecordOf<S>[];
  return options.includeDeleted ? all : all.filter((r) => !r.deleted);
}

/** Records of store S (tombstones included) whose rev sorts after `afterRev`, oldest first: what sync sends. */
export async function changedSince<S extends 'sites' | 'readings' | 'gaugings' | 'ratings' | 'analyses' | 'loggerDays' | 'photos'>(
  store: S,
  afterRev: string | undefined,
): Promise<RecordOf<S>[]> {
  const range = afterRev === undefined ? undefined : IDBKeyRange.lowerBound(afterRev, true);
  return (await withDb((db) => db.getAllFromIndex(store, 'by-rev' as IndexNames<FreshetDB, S>, range))) as RecordOf<S>[];
}

// The one readings writer: the only code that opens a readwrite transaction on `readings`. Every way a
// reading reaches IndexedDB (one save, delete and restore, a bulk import, records merged from another
// device) goes through here and keeps the readings, the derived series (series-edit.ts) and meta (the
// revision clock) in step in the same transaction. Callers that must write other stores in that same
// transaction (sync merge, logger import) use withReadingsWrite and the *InTx functions.
import { unwrap, type StoreNames } from 'idb';
import {
  isUuid, maxRev, RecordValidationError, validateReadingBody, validateRecord, type ReadingBody, type ReadingRecord,
} from '../../core/records/index';
import { withDb } from './connection';
import { now_ms, observeRevsInTx, stampInTx } from './clock';
import { StorageError, storageMessage } from './errors';
import { afterWrite, DURABLE, inTx, keptInTx, removeInTx, withSeen, type SaveInput } from './records';
import { isAhead } from '../../core/sync/index';
import type { FreshetDB, ReadingsTx } from './schema';
import { putChunksInTx, updateSeriesInTx } from './series-edit';
import { abortError, DEFAULT_IMPORT_BATCH, planReadingsAdd, type ImportOptions, type ImportResult } from './readings-add';
import { quietly } from './quietly';
import { beyondReadingsWrite, SCOPES, type ReadingsWriteStore } from './stores';

export { DEFAULT_IMPORT_BATCH, type ImportDuplicate, type ImportOptions, type ImportProgress, type ImportResult } from './readings-add';
export { type ReadingsTx };
/** Stores every readings write holds: the readings, their series, and meta for the revision clock. */
export type ReadingsStores = ReadingsWriteStore;

/** Other stores a caller may write in the same transaction as readings. */
export type OtherStore = Exclude<StoreNames<FreshetDB>, ReadingsStores>;

/**
 * Opens ONE durable readwrite transaction over readings, series, meta and the `also` stores, runs fn in
 * it and resolves once the transaction is complete (all or nothing: anything fn throws aborts it). The
 * screens are told that readings (and `alsoKinds`) changed. fn must await nothing but this transaction's
 * requests, and must write readings only through putReadingsInTx / addReadingsInTx.
 */
export async function withReadingsWrite<T>(
  also: readonly OtherStore[],
  fn: (tx: ReadingsTx) => Promise<T>,
): Promise<T> {
  const result = await withDb(async (db) => {
    const tx = db.transaction([...SCOPES.readingsWrite, ...also], 'readwrite', DURABLE);
    return inTx(tx, async () => {
      // Widened to every store (see ReadingsTx): the scope opened here is readings, series, meta and `also`.
      const value = await fn(tx as unknown as ReadingsTx);
      await tx.done;
      return value;
    });
  });
  afterWrite(['reading']);
  return result;
}

/**
 * Writes whole reading records as given (each with its own id, rev and updated_ms: records merged from
 * another device, or tombstones) inside tx, updates the series, and moves the revision clock in meta
 * past the highest rev written so later local changes sort above it. Each record is validated first;
 * a bad one throws a RecordValidationError naming it ("readings[3].stage_m") and nothing is written.
 * The same id twice: the later one is written. Resolves with the stored versions they replaced.
 */
export async function putReadingsInTx(tx: ReadingsTx, records: readonly ReadingRecord[]): Promise<(ReadingRecord | undefined)[]> {
  records.forEach((r, i) => {
    try {
      validateRecord('reading', r);
    } catch (e) {
      throw e instanceof RecordValidationError ? e.within(`readings[${i}].`) : e;
    }
  });
  const last = new Map<string, ReadingRecord>();
  for (const r of records) last.set(r.id, r);
  const unique = [...last.values()];
  const store = tx.objectStore('readings');
  const befores = await Promise.all(unique.map((r) => store.get(r.id)));
  for (const r of unique) quietly(store.put(r));
  // Revisions dated ahead of this device's clock (a wrong date elsewhere) do not move it (core/sync/ahead.ts).
  const at = now_ms();
  await observeRevsInTx(tx, unique.reduce<string | undefined>((m, r) => (isAhead(r.rev, at) ? m : maxRev(m, r.rev)), undefined));
  await updateSeriesInTx(tx, unique.map((after, i) => ({ before: befores[i], after })));
  const byId = new Map(unique.map((r, i) => [r.id, befores[i]]));
  return records.map((r) => byId.get(r.id));
}

/** Why saveReading may refuse an edit, beyond a bad field. */
export interface SaveReadingOptions {
  /** The rev of the reading when the form opened: the save is refused if it was changed or deleted since. */
  expectedRev?: string;
  /** A draft of this form, removed in the same transaction as the reading is written. */
  draftId?: string;
}

function splitReading(input: SaveInput<ReadingRecord>): { id: string | undefined; body: ReadingBody } {
  const { id, rev: _rev, updated_ms: _updated, deleted: _deleted, seen: _seen, ...body } = input as SaveInput<ReadingRecord> & Record<string, unknown>;
  if (id !== undefined && !isUuid(id)) throw new RecordValidationError('reading', 'id', 'a lower-case UUID or absent for a new record', id);
  validateReadingBody(body);
  return { id, body };
}

/**
 * Validates and saves one reading (new id when absent) with a new rev and updated_ms now; resolves once
 * durable. An edit is refused (StorageError 'stale', nothing written) when `expectedRev` is given and the
 * stored reading was changed or deleted since, and (StorageError 'moved') when it would move the reading
 * to another site. `draftId`'s draft is removed in the same transaction.
 */
export async function saveReading(input: SaveInput<ReadingRecord>, options: SaveReadingOptions = {}): Promise<ReadingRecord> {
  const { id: given, body } = splitReading(input);
  const id = given ?? crypto.randomUUID();
  const at = now_ms();
  const also = beyondReadingsWrite(options.draftId !== undefined ? SCOPES.saveWithDraft : SCOPES.save);
  const saved = await withDb(async (db) => {
    const tx = db.transaction([...SCOPES.readingsWrite, ...also], 'readwrite', DURABLE);
    return inTx(tx, async () => {
      // The new revision sorts above the one it replaces, and carries its `seen` list on (core/sync) with
      // what this device's own kept versions of the reading knew.
      const before = await tx.objectStore('readings').get(id);
      const kept = await keptInTx(tx, 'reading', id);
      const rev = await stampInTx(tx, at, before?.rev);
      if (options.expectedRev !== undefined && (!before || before.deleted || before.rev !== options.expectedRev)) {
        throw new StorageError('stale', storageMessage('stale'));
      }
      if (before && !before.deleted && before.siteId !== body.siteId) throw new StorageError('moved', storageMessage('moved'));
      const record: ReadingRecord = withSeen({ ...body, id, rev, updated_ms: at }, rev, before, kept);
      quietly(tx.objectStore('readings').put(record));
      if (options.draftId !== undefined) removeInTx(tx, 'drafts', [options.draftId]);
      await updateSeriesInTx(tx, [{ before, after: record }]);
      await tx.done;
      return record;
    });
  });
  afterWrite(options.draftId !== undefined ? ['reading', 'draft'] : ['reading'], [id]);
  return saved;
}

async function setDeleted(id: string, deleted: boolean): Promise<ReadingRecord | undefined> {
  const at = now_ms();
  const changed = await withDb(async (db) => {
    const tx = db.transaction([...SCOPES.readingsWrite, ...beyondReadingsWrite(SCOPES.save)], 'readwrite', DURABLE);
    return inTx(tx, async () => {
      const existing = await tx.objectStore('readings').get(id);
      if (!existing) throw new StorageError('not-found', storageMessage('not-found'));
      const kept = await keptInTx(tx, 'reading', id);
      if ((existing.deleted === true) === deleted) {
        await tx.done;
        return undefined;
      }
      const rev = await stampInTx(tx, at, existing.rev);
      const { deleted: _was, seen: _seen, ...rest } = existing;
      const fields = withSeen({ ...rest, rev, updated_ms: at }, rev, existing, kept);
      const record: ReadingRecord = deleted ? { ...fields, deleted: true } : fields;
      quietly(tx.objectStore('readings').put(record));
      await updateSeriesInTx(tx, [{ before: existing, after: record }]);
      await tx.done;
      return record;
    });
  });
  if (changed) afterWrite(['reading'], [id]);
  return changed;
}

/** Deletes a reading by tombstone; returns the tombstone (undo with restoreReading), or undefined if already deleted. */
export function deleteReading(id: string): Promise<ReadingRecord | undefined> {
  return setDeleted(id, true);
}

/** Undoes deleteReading under a new revision; undefined when the reading is not deleted. */
export function restoreReading(id: string): Promise<ReadingRecord | undefined> {
  return setDeleted(id, false);
}

/**
 * Imports many readings (e.g. 100,000 from a logger file) in one transaction: every reading is written
 * or none is. Readings whose (site, source, time) is already stored, or appears earlier in the input,
 * are reported in `duplicates` and not written. Throws a RecordValidationError naming the first bad
 * field ("readings[12].stage_m") before writing anything, or a StorageError if the write fails.
 */
export async function importReadings(readings: readonly ReadingBody[], options: ImportOptions = {}): Promise<ImportResult> {
  const result = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.readingsWrite, 'readwrite', DURABLE);
    return inTx(tx, async () => {
      const r = await addReadingsInTx(tx as unknown as ReadingsTx, readings, now_ms(), options); // see ReadingsTx
      await tx.done;
      return r;
    });
  });
  if (result.imported > 0) afterWrite(['reading']);
  return result;
}

/**
 * Adds new readings inside tx (which holds readings, series and meta): each gets a new id and one new
 * revision stamped at at_ms (UTC ms). Readings whose (site, source, time) is already stored, or appears
 * earlier in the input, are reported in `duplicates` and not written. Throws a RecordValidationError
 * naming the first bad field ("readings[12].stage_m") before writing anything. The caller awaits tx.done.
 */
export async function addReadingsInTx(
  tx: ReadingsTx,
  readings: readonly ReadingBody[],
  at: number,
  options: ImportOptions = {},
): Promise<ImportResult> {
  const batch = Math.max(1, Math.floor(options.batchSize ?? DEFAULT_IMPORT_BATCH));
  const plan = await planReadingsAdd(tx, readings, at, options);
  await writeInBatches(tx, plan.toWrite, batch, options);
  putChunksInTx(tx, plan.chunks);
  return plan.result;
}

/**
 * Puts the records batch by batch on the raw store (no promise per put: the hot loop of the import),
 * keeping two batches in flight so the next is queued while the previous completes.
 */
async function writeInBatches(tx: ReadingsTx, records: ReadingRecord[], batch: number, options: ImportOptions): Promise<void> {
  const store = unwrap(tx.objectStore('readings'));
  const total = records.length;
  const inFlight: { done: Promise<void>; end: number }[] = [];
  const settle = async (): Promise<void> => {
    const next = inFlight.shift();
    if (!next) return;
    await next.done;
    options.onProgress?.({ written: next.end, total });
    if (options.signal?.aborted) throw abortError();
  };
  for (let start = 0; start < total; start += batch) {
    const end = Math.min(total, start + batch);
    let last!: IDBRequest;
    for (let i = start; i < end; i++) last = store.put(records[i]);
    const done = new Promise<void>((resolve, reject) => {
      last.onsuccess = () => resolve();
      last.onerror = () => reject(last.error ?? new StorageError('aborted', storageMessage('aborted')));
    });
    done.catch(() => undefined);
    inFlight.push({ done, end });
    if (inFlight.length >= 2) await settle();
  }
  while (inFlight.length > 0) await settle();
  if (total === 0) options.onProgress?.({ written: 0, total: 0 });
}

// Applying incoming records (an imported bundle file, or the bundles of a pull) in ONE transaction: the
// record stores, the series of any reading, the conflicts kept for review, the revision clock and the
// pull cursor are written together or not at all. The rules themselves are core/sync's.
import type { IDBPTransaction } from 'idb';
import {
  fromSyncRecord, maxRev, toSyncRecord, validateSyncRecord, RecordValidationError,
  type ConflictRecord, type LoggerDayRecord, type ReadingRecord, type SyncKind, type SyncRecord,
} from '../../core/records/index';
import { byRevision, isAhead, planMerge, recordKey, type Frontier, type MergePlan, type MergeSummary } from '../../core/sync/index';
import { withDb } from './connection';
import { now_ms, observeRevsInTx, stampInTx } from './clock';
import { putLoggerDaysInTx } from './logger-days';
import { afterWrite, putRecordsInTx, removeInTx, type PlainStore } from './records';
import type { FreshetDB } from './schema';
import { putReadingsInTx, withReadingsWrite } from './readings-write';
import { beyondReadingsWrite, SCOPES, STORE_OF_KIND, type StoreName } from './stores';
import { putSyncInTx } from './sync-store';

type MergeTx = IDBPTransaction<FreshetDB, StoreName[], 'readonly'>;
type MergeWriteTx = IDBPTransaction<FreshetDB, StoreName[], 'readwrite'>;
/** What the merge asks of the readings writer beyond its own stores (readings, series, meta). */
const MERGE_ALSO = beyondReadingsWrite(SCOPES.merge);

/** What a merge did (or would do): the counts for the screen and how many winners were dated ahead. */
export interface IncomingResult {
  summary: MergeSummary;
}

interface Current {
  frontiers: Map<string, Frontier>;
  stored: Map<string, unknown>;
  conflicts: Map<string, ConflictRecord[]>;
}

/** Reads, for every incoming record, the stored version and the versions kept for review. */
async function readCurrent(tx: MergeTx | MergeWriteTx, records: readonly SyncRecord[]): Promise<Current> {
  const keys = new Map<string, SyncRecord>();
  for (const r of records) keys.set(recordKey(r.kind, r.id), r);
  const conflictIndex = tx.objectStore('conflicts').index('by-record');
  const entries = [...keys];
  const read = await Promise.all(
    entries.map(([, r]) => Promise.all([tx.objectStore(STORE_OF_KIND[r.kind]).get(r.id), conflictIndex.getAll(r.id)])),
  );
  const current: Current = { frontiers: new Map(), stored: new Map(), conflicts: new Map() };
  entries.forEach(([key, r], i) => {
    const [stored, conflicts] = read[i];
    const mine = conflicts.filter((c) => c.kind === r.kind);
    current.stored.set(key, stored);
    current.conflicts.set(key, mine);
    const others = mine.filter((c) => (c.reason ?? 'concurrent') === 'concurrent').map((c) => c.losing);
    const all = [...(stored ? [toSyncRecord(r.kind, stored as never)] : []), ...others];
    if (all.length === 0) return;
    const sorted = all.sort(byRevision);
    current.frontiers.set(key, { winner: sorted[sorted.length - 1], others: sorted.slice(0, -1) });
  });
  return current;
}

function checkAll(records: readonly SyncRecord[]): void {
  records.forEach((r, i) => {
    try {
      validateSyncRecord(r);
    } catch (e) {
      throw e instanceof RecordValidationError ? e.within(`records[${i}].`) : e;
    }
  });
}

/** What merging `records` would change, without writing anything: for the summary shown before an import. */
export async function previewIncoming(records: readonly SyncRecord[]): Promise<IncomingResult> {
  checkAll(records);
  const at = now_ms();
  return withDb(async (db) => {
    const tx = db.transaction([...SCOPES.merge], 'readonly');
    const current = await readCurrent(tx, records);
    return { summary: planMerge(records, current.frontiers, at).summary };
  });
}

/**
 * Merges incoming records by core/sync's rules in one durable transaction; with `cursor`, the pull
 * cursor is stored in the same transaction, so it never runs ahead of what was merged. Throws a
 * RecordValidationError (nothing written) for an invalid record, or a StorageError if the write fails.
 */
export async function applyIncoming(records: readonly SyncRecord[], options: { cursor?: string } = {}): Promise<IncomingResult> {
  checkAll(records);
  const at = now_ms();
  // The one readings writer opens the transaction, so readings and their series are written its way.
  const { plan, kinds } = await withReadingsWrite(MERGE_ALSO, async (rtx) => {
    const tx = rtx as unknown as MergeWriteTx;
    {
      const current = await readCurrent(tx, records);
      const plan = planMerge(records, current.frontiers, at);
      const kinds = await writePlan(tx, plan, current, at);
      // Revisions seen move this device's clock on, except those dated ahead of it (a wrong date
      // elsewhere must not drag every later local revision into the future).
      let highest: string | undefined;
      for (const r of records) if (!isAhead(r.rev, at)) highest = maxRev(highest, r.rev);
      await observeRevsInTx(tx, highest);
      if (options.cursor !== undefined) putSyncInTx(tx, 'cursor', options.cursor);
      return { plan, kinds };
    }
  });
  if (kinds.size > 0) afterWrite([...kinds]);
  return { summary: plan.summary };
}

async function writePlan(tx: MergeWriteTx, plan: MergePlan, current: Current, at: number): Promise<Set<SyncKind | 'conflict'>> {
  const kinds = new Set<SyncKind | 'conflict'>();
  const newConflicts: Omit<ConflictRecord, 'id' | 'rev' | 'updated_ms'>[] = [];
  const readings: ReadingRecord[] = [];
  const loggerDays: LoggerDayRecord[] = [];
  for (const [key, { before, after }] of plan.changes) {
    const kind = after.winner.kind;
    if (before?.winner.rev !== after.winner.rev) {
      const record = fromSyncRecord(after.winner);
      if (kind === 'reading') readings.push(record as ReadingRecord);
      else if (kind === 'logger-day') loggerDays.push(record as LoggerDayRecord);
      else putRecordsInTx(tx, STORE_OF_KIND[kind] as PlainStore, [record as never]);
      kinds.add(kind);
    }
    const keep = new Set(after.others.map((o) => o.rev));
    const existing = (current.conflicts.get(key) ?? []).filter((c) => (c.reason ?? 'concurrent') === 'concurrent');
    removeInTx(tx, 'conflicts', existing.filter((c) => !keep.has(c.losing.rev)).map((c) => c.id));
    putRecordsInTx(tx, 'conflicts', existing.filter((c) => keep.has(c.losing.rev) && c.winnerRev !== after.winner.rev).map((c) => ({ ...c, winnerRev: after.winner.rev })));
    const had = new Set(existing.map((c) => c.losing.rev));
    for (const o of after.others) {
      if (!had.has(o.rev)) newConflicts.push({ kind, recordId: o.id, losing: o, winnerRev: after.winner.rev, found_ms: at, reason: 'concurrent' });
    }
  }
  if (loggerDays.length > 0) putLoggerDaysInTx(tx, loggerDays);
  if (readings.length > 0) await putReadingsInTx(tx as unknown as Parameters<typeof putReadingsInTx>[0], readings);
  for (const flag of plan.ahead) {
    const losing = flag.displaced ?? flag.record;
    newConflicts.push({ kind: flag.record.kind, recordId: flag.record.id, losing, winnerRev: flag.record.rev, found_ms: at, reason: 'ahead' });
  }
  if (newConflicts.length > 0) {
    const rev = await stampInTx(tx, at);
    putRecordsInTx(tx, 'conflicts', newConflicts.map((c) => ({ ...c, id: crypto.randomUUID(), rev, updated_ms: at })));
    kinds.add('conflict');
  }
  return kinds;
}

/** The stored version of a synced record as it would travel (tombstones included), or undefined. */
export function syncedVersion(kind: SyncKind, id: string): Promise<SyncRecord | undefined> {
  return withDb(async (db) => {
    const stored = await db.get(STORE_OF_KIND[kind], id);
    return stored ? toSyncRecord(kind, stored as never) : undefined;
  });
}

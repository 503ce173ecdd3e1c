// Logger records stored as one record per site and UTC day (kind 'logger-day'): the import writer (all
// days in ONE transaction, or nothing), re-correction from new checks, and reads of a window.
import { unwrap } from 'idb';
import {
  loggerDayId, LOGGER_DAY_MS, mergeLoggerDay, RecordValidationError, splitLoggerDays, validateLoggerDayBody,
  type LoggerDayBody, type LoggerDayCheck, type LoggerDayRecord,
} from '../../core/index';
import { withDb } from './connection';
import { now_ms, stampInTx } from './clock';
import { StorageError } from './errors';
import { afterWrite } from './records';
import { quietly } from './quietly';
import { withReadingsWrite } from './readings-write';
import { SCOPES } from './stores';

/** A corrected logger record to store at one site: times (UTC ms, strictly ascending), raw values and corrections (m). */
export interface LoggerImportInput {
  siteId: string;
  fileName: string;
  time_ms: ArrayLike<number>;
  raw_m: ArrayLike<number>;
  correction_m: ArrayLike<number>;
  /** The checks the corrections came from. */
  checks: readonly LoggerDayCheck[];
  note?: string;
}

/** A value not stored because the site already has a logger value at its time. */
export interface LoggerImportDuplicate {
  time_ms: number;
  /** The record already holding that time: a logger day, or a single logger reading. */
  existingId: string;
  existingKind: 'logger-day' | 'reading';
}

/** Progress of a logger import: days written so far of the days to write. */
export interface LoggerImportProgress {
  written: number;
  total: number;
}

/** What a logger import wrote: values and day records, the duplicates left out, and the revision given. */
export interface LoggerImportResult {
  stored: number;
  days: number;
  duplicates: LoggerImportDuplicate[];
  rev: string;
}

/** Options: progress after each batch of day records, and a signal whose abort rolls everything back. */
export interface LoggerImportOptions {
  onProgress?: (p: LoggerImportProgress) => void;
  signal?: AbortSignal;
  /** Day records put per batch (progress is reported after each). */
  batchDays?: number;
}

function stopped(): StorageError {
  return new StorageError('aborted', 'The import was stopped and nothing was written.');
}

/**
 * Stores a corrected logger record as day records in one transaction: every day is written or none is.
 * A time the site already holds (in a stored logger day or a single logger reading) is reported in
 * `duplicates` and not doubled. Throws a RecordValidationError naming the first bad value before writing.
 */
export async function importLoggerRecord(input: LoggerImportInput, options: LoggerImportOptions = {}): Promise<LoggerImportResult> {
  const bodies = splitLoggerDays(input, { siteId: input.siteId, fileName: input.fileName, checks: input.checks, note: input.note });
  bodies.forEach((b) => {
    try {
      validateLoggerDayBody(b);
    } catch (e) {
      throw e instanceof RecordValidationError ? e.within(`day ${b.day}: `) : e;
    }
  });
  if (options.signal?.aborted) throw stopped();
  const batch = Math.max(1, options.batchDays ?? 100);
  const at = now_ms();
  const n = input.time_ms.length;
  // Through the readings writer's transaction: the single logger readings it checks against cannot
  // change between the check and the write.
  const result = await withReadingsWrite(SCOPES.loggerImport, async (tx) => {
    if (bodies.length === 0) {
      const rev = await stampInTx(tx, at);
      return { stored: 0, days: 0, duplicates: [], rev };
    }
    const first = bodies[0].day;
    const last = bodies[bodies.length - 1].day;
    const [rev, storedDays, singles] = await Promise.all([
      stampInTx(tx, at),
      tx.objectStore('loggerDays').index('by-site-day').getAll(IDBKeyRange.bound([input.siteId, first], [input.siteId, last])),
      tx.objectStore('readings').index('by-site-source-time').getAll(
        IDBKeyRange.bound([input.siteId, 'logger', input.time_ms[0]], [input.siteId, 'logger', input.time_ms[n - 1]]),
      ),
    ]);
    const duplicates: LoggerImportDuplicate[] = [];
    const singleAt = new Map<number, string>();
    for (const r of singles) if (!r.deleted) singleAt.set(r.time_ms, r.id);
    const byDay = new Map<number, LoggerDayRecord>();
    for (const d of storedDays) if (!d.deleted && !byDay.has(d.day)) byDay.set(d.day, d);
    const toPut: LoggerDayRecord[] = [];
    let stored = 0;
    for (const incoming of bodies) {
      const body = singleAt.size > 0 ? withoutTimes(incoming, singleAt, duplicates) : incoming;
      if (body.offset_ms.length === 0) continue;
      const existing = byDay.get(body.day);
      let next: LoggerDayBody = body;
      if (existing) {
        const merged = mergeLoggerDay(existing, body);
        for (const t of merged.repeated_ms) duplicates.push({ time_ms: t, existingId: existing.id, existingKind: 'logger-day' });
        if (merged.body === existing) continue;
        next = merged.body;
      }
      stored += next.offset_ms.length - (existing ? existing.offset_ms.length : 0);
      const { id: _id, rev: _rev, updated_ms: _u, deleted: _d, ...clean } = next as LoggerDayRecord;
      toPut.push({ ...clean, id: existing?.id ?? loggerDayId(input.siteId, body.day), rev, updated_ms: at });
    }
    const store = unwrap(tx.objectStore('loggerDays'));
    for (let start = 0; start < toPut.length; start += batch) {
      const end = Math.min(toPut.length, start + batch);
      let lastPut!: IDBRequest;
      for (let i = start; i < end; i++) lastPut = store.put(toPut[i]);
      await new Promise<void>((resolve, reject) => {
        lastPut.onsuccess = () => resolve();
        lastPut.onerror = () => reject(lastPut.error);
      });
      options.onProgress?.({ written: end, total: toPut.length });
      if (options.signal?.aborted) throw stopped();
    }
    duplicates.sort((a, b) => a.time_ms - b.time_ms);
    return { stored, days: toPut.length, duplicates, rev };
  });
  if (result.days > 0) afterWrite(['logger-day']);
  return result;
}

/**
 * Puts whole logger-day records as given (each with its own id and rev: merged from another device, or a
 * settled conflict) inside an open transaction that holds loggerDays.
 */
export function putLoggerDaysInTx(
  tx: { objectStore(name: 'loggerDays'): { put(value: LoggerDayRecord): Promise<unknown> } },
  records: readonly LoggerDayRecord[],
): void {
  const store = tx.objectStore('loggerDays');
  for (const r of records) quietly(store.put(r));
}

/** The day without the times held by single logger readings (reported as duplicates). */
function withoutTimes(day: LoggerDayBody, taken: ReadonlyMap<number, string>, duplicates: LoggerImportDuplicate[]): LoggerDayBody {
  const start = day.day * LOGGER_DAY_MS;
  const keep: number[] = [];
  day.offset_ms.forEach((o, i) => {
    const id = taken.get(start + o);
    if (id === undefined) keep.push(i);
    else duplicates.push({ time_ms: start + o, existingId: id, existingKind: 'reading' });
  });
  if (keep.length === day.offset_ms.length) return day;
  return {
    ...day,
    offset_ms: keep.map((i) => day.offset_ms[i]),
    raw_m: keep.map((i) => day.raw_m[i]),
    correction_m: keep.map((i) => day.correction_m[i]),
  };
}

/** The site's logger days (not deleted) whose day overlaps [from_ms, to_ms] (UTC ms), in day order. */
export async function listLoggerDays(siteId: string, from_ms: number, to_ms: number): Promise<LoggerDayRecord[]> {
  const lo = Number.isFinite(from_ms) ? Math.floor(from_ms / LOGGER_DAY_MS) : 0;
  const hi = Number.isFinite(to_ms) ? Math.floor(to_ms / LOGGER_DAY_MS) : Number.MAX_SAFE_INTEGER;
  const all = await withDb((db) => db.getAllFromIndex('loggerDays', 'by-site-day', IDBKeyRange.bound([siteId, lo], [siteId, hi])));
  return all.filter((d) => !d.deleted);
}

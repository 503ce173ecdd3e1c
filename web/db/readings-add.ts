// Planning the addition of many new readings inside a transaction of the readings writer: validated first;
// (site, source, time) duplicates, already stored or repeated in the input, are reported and skipped; the
// series (series-edit.ts) of the days added is merged in memory. Nothing is written here: the readings
// writer (readings-write.ts, addReadingsInTx) writes the readings in batches and each day's chunk once.
import { RecordValidationError, validateReadingBody, type ReadingBody, type ReadingRecord, type ReadingSource } from '../../core/records/index';
import { stampInTx } from './clock';
import { StorageError } from './errors';
import type { ReadingsTx, SeriesChunk } from './schema';
import { dayOf, mergeIntoChunks } from './series-edit';

/** Readings written per batch unless told otherwise. */
export const DEFAULT_IMPORT_BATCH = 5000;

/** Progress of an import: readings written so far and the number that will be written. */
export interface ImportProgress {
  written: number;
  total: number;
}

/** How to run an import: progress callback (after each batch), batch size, and a signal that aborts it. */
export interface ImportOptions {
  onProgress?: (p: ImportProgress) => void;
  batchSize?: number;
  /** Aborting rolls the whole import back: nothing is written. */
  signal?: AbortSignal;
}

/** An input reading skipped because its site, source and time are already taken. */
export interface ImportDuplicate {
  /** Position in the input list. */
  index: number;
  siteId: string;
  source: ReadingSource;
  time_ms: number;
  /** The stored reading it repeats, when it repeats one already on the phone. */
  existingId?: string;
  /** The earlier input position it repeats, when it repeats one in the same import. */
  firstIndex?: number;
}

/** What an import wrote: the number of readings, the duplicates skipped, and the revision given to all. */
export interface ImportResult {
  imported: number;
  duplicates: ImportDuplicate[];
  rev: string;
}

interface Group {
  siteId: string;
  source: ReadingSource;
  min_ms: number;
  max_ms: number;
  /** time_ms → input index of the first reading at that time. */
  times: Map<number, number>;
}

/** The error of an import stopped by its signal. */
export function abortError(): StorageError {
  return new StorageError('aborted', 'The import was stopped and nothing was written.');
}

/** What planReadingsAdd found: the records to write, the series chunks after them, and the result to report. */
export interface ReadingsAddPlan {
  toWrite: ReadingRecord[];
  chunks: SeriesChunk[];
  result: ImportResult;
}

/**
 * Plans adding new readings inside tx (which holds readings, series and meta): each gets a new id and one
 * new revision stamped at at_ms (UTC ms). Readings whose (site, source, time) is already stored, or
 * appears earlier in the input, are reported in `duplicates` and left out. Throws a RecordValidationError
 * naming the first bad field ("readings[12].stage_m") before anything is written.
 */
export async function planReadingsAdd(
  tx: ReadingsTx,
  readings: readonly ReadingBody[],
  at: number,
  options: ImportOptions = {},
): Promise<ReadingsAddPlan> {
  const groups = new Map<string, Group>();
  const duplicates: ImportDuplicate[] = [];
  const keep: number[] = [];
  for (let i = 0; i < readings.length; i++) {
    const r = readings[i];
    try {
      validateReadingBody(r);
    } catch (e) {
      throw e instanceof RecordValidationError ? e.within(`readings[${i}].`) : e;
    }
    const key = `${r.siteId}\u0000${r.source}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { siteId: r.siteId, source: r.source, min_ms: r.time_ms, max_ms: r.time_ms, times: new Map() }));
    const first = g.times.get(r.time_ms);
    if (first !== undefined) {
      duplicates.push({ index: i, siteId: r.siteId, source: r.source, time_ms: r.time_ms, firstIndex: first });
      continue;
    }
    g.times.set(r.time_ms, i);
    if (r.time_ms < g.min_ms) g.min_ms = r.time_ms;
    if (r.time_ms > g.max_ms) g.max_ms = r.time_ms;
    keep.push(i);
  }
  if (options.signal?.aborted) throw abortError();
  const ids = keep.map(() => crypto.randomUUID());
  const days = new Map<string, { min: number; max: number }>();
  for (const g of groups.values()) {
    const d = days.get(g.siteId);
    if (!d) days.set(g.siteId, { min: dayOf(g.min_ms), max: dayOf(g.max_ms) });
    else {
      d.min = Math.min(d.min, dayOf(g.min_ms));
      d.max = Math.max(d.max, dayOf(g.max_ms));
    }
  }
  const index = tx.objectStore('readings').index('by-site-source-time');
  const series = tx.objectStore('series');
  const [rev, stored, chunks] = await Promise.all([
    stampInTx(tx, at),
    Promise.all(
      [...groups.values()].map((g) => index.getAll(IDBKeyRange.bound([g.siteId, g.source, g.min_ms], [g.siteId, g.source, g.max_ms]))),
    ),
    Promise.all([...days].map(([siteId, d]) => series.getAll(IDBKeyRange.bound([siteId, d.min], [siteId, d.max])))),
  ]);
  const skip = new Set<number>();
  [...groups.values()].forEach((g, gi) => {
    for (const old of stored[gi]) {
      const i = old.deleted ? undefined : g.times.get(old.time_ms);
      if (i === undefined || skip.has(i)) continue;
      skip.add(i);
      duplicates.push({ index: i, siteId: g.siteId, source: g.source, time_ms: old.time_ms, existingId: old.id });
    }
  });
  const toWrite: ReadingRecord[] = [];
  keep.forEach((i, j) => {
    if (!skip.has(i)) toWrite.push({ ...readings[i], id: ids[j], rev, updated_ms: at });
  });
  const storedChunks = new Map<string, SeriesChunk>();
  for (const c of chunks.flat()) storedChunks.set(`${c.siteId}\u0000${c.day}`, c);
  const merged = mergeIntoChunks(toWrite, storedChunks);
  return { toWrite, chunks: merged, result: { imported: toWrite.length, duplicates: duplicates.sort((a, b) => a.index - b.index), rev } };
}

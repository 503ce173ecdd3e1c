// Edits of the compact series kept beside the readings: one chunk of arrays per site and UTC day
// (schema.ts, SeriesChunk). Only the readings writer (readings-write.ts) calls these, inside the
// transaction that writes the readings, so the series never disagrees with the readings store.
import { MS_PER_DAY } from '../../core/time/index';
import { READING_SOURCE_CODES, type ReadingRecord } from '../../core/records/index';
import { unwrap } from 'idb';
import type { ReadingsTx, SeriesChunk } from './schema';
import { quietly } from './quietly';

/** The UTC day index of a time (UTC ms): the chunk it belongs to. */
export function dayOf(time_ms: number): number {
  return Math.floor(time_ms / MS_PER_DAY);
}

/** What a write transaction must offer to keep the series: its series store. */
export interface SeriesTx {
  objectStore(name: 'series'): {
    get(key: [string, number]): Promise<SeriesChunk | undefined>;
    put(value: SeriesChunk): Promise<unknown>;
    delete(key: [string, number]): Promise<unknown>;
  };
}

/** True when (t1, id1) sorts before (t2, id2): by time, then id (the order of the [siteId, time_ms] index). */
function sortsBefore(t1: number, id1: string, t2: number, id2: string): boolean {
  return t1 < t2 || (t1 === t2 && id1 < id2);
}

function sameEntry(a: ReadingRecord, b: ReadingRecord): boolean {
  return a.siteId === b.siteId && a.time_ms === b.time_ms && a.stage_m === b.stage_m && a.source === b.source;
}

/** One reading write: the stored version it replaces (undefined for a new reading) and what was written. */
export interface ReadingChange {
  before: ReadingRecord | undefined;
  after: ReadingRecord;
}

const keyOf = (siteId: string, day: number): string => `${siteId}\u0000${day}`;

/**
 * Brings the series in line with reading writes made in tx (each id at most once): a tombstone leaves the
 * series; an edit that moves a reading to another day (or site) leaves its old chunk for the new one.
 * Reads each touched chunk once and puts (or deletes) it once. Awaits only tx's requests.
 */
export async function updateSeriesInTx(tx: SeriesTx, changes: readonly ReadingChange[]): Promise<void> {
  const touched = new Map<string, { siteId: string; day: number; drop: Set<string>; add: ReadingRecord[] }>();
  const at = (siteId: string, day: number) => {
    const k = keyOf(siteId, day);
    let t = touched.get(k);
    if (!t) touched.set(k, (t = { siteId, day, drop: new Set(), add: [] }));
    return t;
  };
  for (const { before, after } of changes) {
    const was = before && !before.deleted ? before : undefined;
    const now = after.deleted ? undefined : after;
    if (was && now && sameEntry(was, now)) continue;
    if (was) at(was.siteId, dayOf(was.time_ms)).drop.add(after.id);
    if (now) at(now.siteId, dayOf(now.time_ms)).add.push(now);
  }
  if (touched.size === 0) return;
  const store = tx.objectStore('series');
  const groups = [...touched.values()];
  const stored = await Promise.all(groups.map((g) => store.get([g.siteId, g.day])));
  groups.forEach((g, i) => {
    let chunk = stored[i];
    if (chunk && g.drop.size > 0) chunk = chunkWithoutIds(chunk, g.drop);
    if (g.add.length > 0) {
      const base = new Map<string, SeriesChunk>();
      if (chunk) base.set(keyOf(g.siteId, g.day), chunk);
      chunk = mergeIntoChunks(g.add, base)[0];
    }
    if (chunk === stored[i]) return;
    if (chunk && chunk.id.length > 0) quietly(store.put(chunk));
    else if (stored[i]) quietly(store.delete([g.siteId, g.day]));
  });
}

/** The chunk without the entries of the given reading ids (one pass). */
function chunkWithoutIds(chunk: SeriesChunk, ids: ReadonlySet<string>): SeriesChunk {
  const keep: number[] = [];
  for (let i = 0; i < chunk.id.length; i++) if (!ids.has(chunk.id[i])) keep.push(i);
  if (keep.length === chunk.id.length) return chunk;
  return {
    siteId: chunk.siteId,
    day: chunk.day,
    time_ms: Float64Array.from(keep, (i) => chunk.time_ms[i]),
    stage_m: Float64Array.from(keep, (i) => chunk.stage_m[i]),
    source: Uint8Array.from(keep, (i) => chunk.source[i]),
    id: keep.map((i) => chunk.id[i]),
  };
}

/** Puts whole chunks (a bulk import's, from mergeIntoChunks) inside an open transaction that holds series. */
export function putChunksInTx(tx: ReadingsTx, chunks: readonly SeriesChunk[]): void {
  // The raw store: no promise per put in the import's hot path.
  const series = unwrap(tx.objectStore('series'));
  for (const c of chunks) series.put(c);
}

/**
 * The chunks of many new readings merged into the stored chunks of the same site-days (`stored`, keyed
 * by `${siteId}\u0000${day}`), each day sorted by time then id: what a bulk import puts, one per day.
 */
export function mergeIntoChunks(records: readonly ReadingRecord[], stored: ReadonlyMap<string, SeriesChunk>): SeriesChunk[] {
  const groups = new Map<string, { siteId: string; day: number; rows: number[] }>();
  let last: { siteId: string; day: number; rows: number[] } | undefined;
  for (let i = 0; i < records.length; i++) {
    const r = records[i];
    const day = dayOf(r.time_ms);
    // Logger files come in time order: most readings join the group of the one before.
    if (!last || last.day !== day || last.siteId !== r.siteId) {
      const key = keyOf(r.siteId, day);
      last = groups.get(key);
      if (!last) groups.set(key, (last = { siteId: r.siteId, day, rows: [] }));
    }
    last.rows.push(i);
  }
  const out: SeriesChunk[] = [];
  for (const [key, g] of groups) {
    const rows = g.rows;
    let sorted = true;
    for (let k = 1; k < rows.length && sorted; k++) {
      const a = records[rows[k - 1]];
      const b = records[rows[k]];
      sorted = sortsBefore(a.time_ms, a.id, b.time_ms, b.id);
    }
    if (!sorted) {
      rows.sort((x, y) => {
        const a = records[x];
        const b = records[y];
        return a.time_ms - b.time_ms || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
      });
    }
    out.push(mergeOne(g.siteId, g.day, stored.get(key), records, rows));
  }
  return out;
}

/** Merges sorted new rows into a sorted stored chunk (or none). */
function mergeOne(siteId: string, day: number, old: SeriesChunk | undefined, records: readonly ReadingRecord[], rows: number[]): SeriesChunk {
  const m = old ? old.time_ms.length : 0;
  const n = m + rows.length;
  const time_ms = new Float64Array(n);
  const stage_m = new Float64Array(n);
  const source = new Uint8Array(n);
  const id = new Array<string>(n);
  let i = 0;
  let j = 0;
  for (let k = 0; k < n; k++) {
    const r = j < rows.length ? records[rows[j]] : undefined;
    if (old && i < m && (!r || sortsBefore(old.time_ms[i], old.id[i], r.time_ms, r.id))) {
      time_ms[k] = old.time_ms[i];
      stage_m[k] = old.stage_m[i];
      source[k] = old.source[i];
      id[k] = old.id[i];
      i++;
    } else {
      const rr = r as ReadingRecord;
      time_ms[k] = rr.time_ms;
      stage_m[k] = rr.stage_m;
      source[k] = READING_SOURCE_CODES[rr.source];
      id[k] = rr.id;
      j++;
    }
  }
  return { siteId, day, time_ms, stage_m, source, id };
}

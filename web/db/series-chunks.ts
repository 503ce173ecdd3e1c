// The compact series kept beside the readings: one chunk of arrays per site and UTC day (schema.ts,
// SeriesChunk). These functions build and edit chunks; every write to readings calls them inside its own
// transaction so the series never disagrees with the readings store.
import { READING_SOURCE_CODES, type ReadingRecord } from '../../core/records/index';
import type { SeriesChunk } from './schema';
import { quietly } from './quietly';

/** Milliseconds in a UTC day: the width of one series chunk. */
export const SERIES_DAY_MS = 86_400_000;

/** The UTC day index of a time (UTC ms): the chunk it belongs to. */
export function dayOf(time_ms: number): number {
  return Math.floor(time_ms / SERIES_DAY_MS);
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

/** The chunk without the entry of reading `id`; the same chunk when it holds no such entry. */
export function chunkWithout(chunk: SeriesChunk, id: string): SeriesChunk {
  const at = chunk.id.indexOf(id);
  if (at < 0) return chunk;
  return {
    siteId: chunk.siteId,
    day: chunk.day,
    time_ms: without(chunk.time_ms, at),
    stage_m: without(chunk.stage_m, at),
    source: without(chunk.source, at),
    id: [...chunk.id.slice(0, at), ...chunk.id.slice(at + 1)],
  };
}

/** A copy of a without its element at index `at`. */
function without<T extends Float64Array | Uint8Array>(a: T, at: number): T {
  const out = a.slice(0, a.length - 1) as T; // slice keeps the array's own type
  out.set(a.subarray(at + 1), at);
  return out;
}

/** a with v inserted at index `at`, written into `out` (one element longer). */
function inserted<T extends Float64Array | Uint8Array>(a: T, at: number, v: number, out: T): T {
  out.set(a.subarray(0, at));
  out[at] = v;
  out.set(a.subarray(at), at + 1);
  return out;
}

/** The chunk with reading r added in time order (r must fall in the chunk's site and day). */
export function chunkWith(chunk: SeriesChunk | undefined, r: ReadingRecord): SeriesChunk {
  const base = chunk ?? emptyChunk(r.siteId, dayOf(r.time_ms));
  const n = base.time_ms.length;
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sortsBefore(base.time_ms[mid], base.id[mid], r.time_ms, r.id)) lo = mid + 1;
    else hi = mid;
  }
  const time_ms = inserted(base.time_ms, lo, r.time_ms, new Float64Array(n + 1));
  const stage_m = inserted(base.stage_m, lo, r.stage_m, new Float64Array(n + 1));
  const source = inserted(base.source, lo, READING_SOURCE_CODES[r.source], new Uint8Array(n + 1));
  return { siteId: base.siteId, day: base.day, time_ms, stage_m, source, id: [...base.id.slice(0, lo), r.id, ...base.id.slice(lo)] };
}

function emptyChunk(siteId: string, day: number): SeriesChunk {
  return { siteId, day, time_ms: new Float64Array(0), stage_m: new Float64Array(0), source: new Uint8Array(0), id: [] };
}

function sameEntry(a: ReadingRecord, b: ReadingRecord): boolean {
  return a.siteId === b.siteId && a.time_ms === b.time_ms && a.stage_m === b.stage_m && a.source === b.source;
}

/**
 * Brings the series in line with one reading written in tx: `before` is the stored reading the write
 * replaces (undefined for a new one), `after` what was written. A tombstone leaves the series; an edit that
 * moves the reading to another day (or site) leaves its old chunk for the new one. Awaits only tx's requests.
 */
export async function updateSeriesInTx(tx: SeriesTx, before: ReadingRecord | undefined, after: ReadingRecord): Promise<void> {
  const was = before && !before.deleted ? before : undefined;
  const now = after.deleted ? undefined : after;
  if (!was && !now) return;
  if (was && now && sameEntry(was, now)) return;
  const keys: [string, number][] = [];
  for (const r of [was, now]) {
    if (!r) continue;
    const day = dayOf(r.time_ms);
    if (!keys.some(([s, d]) => s === r.siteId && d === day)) keys.push([r.siteId, day]);
  }
  const store = tx.objectStore('series');
  const chunks = await Promise.all(keys.map((k) => store.get(k)));
  keys.forEach(([siteId, day], i) => {
    const stored = chunks[i];
    let chunk = stored && chunkWithout(stored, after.id);
    if (now && now.siteId === siteId && dayOf(now.time_ms) === day) chunk = chunkWith(chunk, now);
    if (chunk === stored) return;
    if (chunk && chunk.id.length > 0) quietly(store.put(chunk));
    else if (stored) quietly(store.delete([siteId, day]));
  });
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
      const key = `${r.siteId}\u0000${day}`;
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

// The outbox: what waits for the office. Every record this device wrote whose mark ("<rev> <kind> <id>")
// sorts above the acknowledged mark waits, unless that version is set aside (outbox-state.ts). A bundle of
// the oldest of them, packed by bytes, is kept in the outbox store and sent under the same id until the
// office acknowledges it (201 or 200); only then does the mark move past its records. A bundle the office
// refused is rebuilt from the records (outbox-refusals.ts). The records never leave IndexedDB; the demo
// site's never wait. DOM-free: the service worker sends the outbox with this module too.
import { DEMO_SITE_ID } from '../../core/demo/index';
import { bundleBudget, bundleRecordProblem, makeBundle, recordsThatFit, utf8Length, type Bundle } from '../../core/exchange/index';
import { parseRev, toSyncRecord, type SyncKind, type SyncRecord } from '../../core/records/index';
import { withDb } from './connection';
import { now_ms } from './clock';
import type { OutboxEntry, SyncStatusRecord } from './schema';
import { setAsideMarks, withSetAside, type OutboxLimits, type SetAsideEntry } from './outbox-state';
import { SCOPES, STORE_OF_KIND, SYNCED_STORES } from './stores';
import { notifySyncChanged } from './sync-events';
import { putSyncInTx } from './sync-store';

/** Most records in one bundle sent to the office (the protocol page states it). */
export const MAX_BUNDLE_RECORDS = 500;

/** The mark of a record version: "<rev> <kind> <id>", ordered by revision first. */
export function markOf(r: { rev: string; kind: string; id: string }): string {
  return `${r.rev} ${r.kind} ${r.id}`;
}

/** True for records of the invented demo site, which are never bundled. */
function isDemo(r: SyncRecord): boolean {
  return r.id === DEMO_SITE_ID || (r.body as { siteId?: string }).siteId === DEMO_SITE_ID;
}

type ReadTx = {
  objectStore(name: (typeof SYNCED_STORES)[number]): {
    index(name: 'by-rev'): { getAll(range?: IDBKeyRange): Promise<unknown[]> };
  };
};

/** This device's records after mark `after` (all when undefined), oldest mark first, demo left out. */
async function mineAfter(tx: ReadTx, device: string, after: string | undefined): Promise<{ mark: string; record: SyncRecord }[]> {
  const range = after === undefined ? undefined : IDBKeyRange.lowerBound(after.slice(0, after.indexOf(' ')));
  const kinds = Object.keys(STORE_OF_KIND) as SyncKind[];
  const found = await Promise.all(kinds.map((k) => tx.objectStore(STORE_OF_KIND[k]).index('by-rev').getAll(range)));
  const out: { mark: string; record: SyncRecord }[] = [];
  kinds.forEach((kind, i) => {
    for (const stored of found[i] as { rev: string }[]) {
      if (parseRev(stored.rev).deviceId !== device) continue;
      const record = toSyncRecord(kind, stored as never);
      const mark = markOf(record);
      if ((after === undefined || mark > after) && !isDemo(record)) out.push({ mark, record });
    }
  });
  return out.sort((a, b) => (a.mark < b.mark ? -1 : a.mark > b.mark ? 1 : 0));
}

/** How many records wait for the office (written here, not yet acknowledged, not set aside). */
export function waitingCount(): Promise<number> {
  return withDb(async (db) => {
    const tx = db.transaction(SCOPES.waiting, 'readonly');
    const sync = tx.objectStore('sync');
    const [device, acked, aside] = await Promise.all([tx.objectStore('meta').get('deviceId'), sync.get('acked'), sync.get('setAside')]);
    if (typeof device !== 'string') return 0;
    const skip = setAsideMarks(aside as SetAsideEntry[] | undefined);
    return (await mineAfter(tx, device, acked as string | undefined)).filter((w) => !skip.has(w.mark)).length;
  });
}

/** Bytes of a bundle's JSON (UTF-8), as it travels. */
export function bundleBytes(bundle: Bundle): number {
  return utf8Length(JSON.stringify(bundle));
}

/** True when a kept bundle may still go as it is: within the limits, and none of its records set aside since. */
function stillFits(entry: OutboxEntry, limits: OutboxLimits, skip: Set<string>): boolean {
  const n = entry.bundle.records.length;
  if (limits.search && n > limits.search.records) return false;
  if (entry.bundle.records.some((r) => skip.has(markOf(r)))) return false;
  return n === 1 || bundleBytes(entry.bundle) <= bundleBudget(limits);
}

/** A set-aside entry for a waiting record refused by this phone's own checks (a deletion of it is dropped at once). */
function refusedHere(w: { mark: string; record: SyncRecord }, reason: string, at_ms: number): SetAsideEntry {
  const siteId = w.record.kind === 'site' ? w.record.id : (w.record.body as { siteId?: string }).siteId;
  return {
    mark: w.mark, kind: w.record.kind, id: w.record.id, rev: w.record.rev, ...(siteId ? { siteId } : {}), reason, by: 'phone', at_ms,
    ...(w.record.deleted ? { deleted: true, dropped: { at_ms, because: 'deleted' as const } } : {}),
  };
}

/**
 * The next bundle to send: the oldest kept one while it still fits the limits, or a new one of the oldest
 * waiting records packed by bytes (core's recordsThatFit), kept in the outbox before it is returned.
 * Records this phone's bundle checks refuse are set aside on the way. Undefined when nothing waits.
 */
export async function nextOutgoing(): Promise<OutboxEntry | undefined> {
  const at = now_ms();
  const kept = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.outbox, 'readonly');
    const sync = tx.objectStore('sync');
    const [cursor, limits, aside] = await Promise.all([tx.objectStore('outbox').index('by-created').openCursor(), sync.get('outboxLimits'), sync.get('setAside')]);
    return { entry: cursor?.value, limits: (limits ?? {}) as OutboxLimits, skip: setAsideMarks(aside as SetAsideEntry[] | undefined) };
  });
  if (kept.entry && stillFits(kept.entry, kept.limits, kept.skip)) return kept.entry;
  if (kept.entry) {
    // Rebuilt from the records: the office never stored this bundle (it refused it), so its id goes with it.
    const stale = kept.entry.id;
    await withDb(async (db) => {
      const tx = db.transaction('outbox', 'readwrite');
      await Promise.all([tx.store.delete(stale), tx.done]);
    });
  }
  // Read in one transaction, then kept in another that only writes the outbox and the sync store (records
  // are read, never written here); if another tab kept a bundle meanwhile, that one goes first.
  const made = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.waiting, 'readonly');
    const sync = tx.objectStore('sync');
    const [device, acked, limitsRead, asideRead] = await Promise.all([
      tx.objectStore('meta').get('deviceId'), sync.get('acked'), sync.get('outboxLimits'), sync.get('setAside'),
    ]);
    if (typeof device !== 'string') return undefined;
    const limits = (limitsRead ?? {}) as OutboxLimits;
    const aside = asideRead as SetAsideEntry[] | undefined;
    const skip = setAsideMarks(aside);
    const waiting = (await mineAfter(tx, device, acked as string | undefined)).filter((w) => !skip.has(w.mark));
    const id = crypto.randomUUID();
    const empty = bundleBytes(makeBundle({ id, device, created_ms: at, records: [] }));
    const budget = bundleBudget(limits);
    const most = Math.min(MAX_BUNDLE_RECORDS, limits.search?.records ?? MAX_BUNDLE_RECORDS);
    const chosen: { mark: string; record: SyncRecord }[] = [];
    const sizes: number[] = [];
    const refused: SetAsideEntry[] = [];
    let total = empty;
    for (const w of waiting) {
      if (chosen.length >= most || (chosen.length > 0 && total > budget)) break;
      const problem = bundleRecordProblem(w.record);
      if (problem) {
        refused.push(refusedHere(w, `This version ${problem}.`, at));
        continue;
      }
      const size = utf8Length(JSON.stringify(w.record));
      if (limits.stated_bytes !== undefined && empty + size > limits.stated_bytes) {
        refused.push(refusedHere(w, `This record is larger (${mib(empty + size)}) than the office accepts in one bundle (${mib(limits.stated_bytes)}).`, at));
        continue;
      }
      chosen.push(w);
      sizes.push(size);
      total += size + 1;
    }
    const n = recordsThatFit(sizes, empty, budget, most);
    const records = chosen.slice(0, n);
    const bundle = records.length ? makeBundle({ id, device, created_ms: at, records: records.map((w) => w.record) }) : undefined;
    const entry = bundle && ({ id, bundle, through: records[records.length - 1].mark, created_ms: at, attempts: 0, nextAttempt_ms: at } satisfies OutboxEntry);
    return { entry, refused };
  });
  if (!made || (!made.entry && made.refused.length === 0)) return undefined;
  const entry = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.outbox, 'readwrite');
    const outbox = tx.objectStore('outbox');
    if (made.refused.length) {
      // Merged with the list as it is now (another tab may have added to it since it was read).
      const sync = tx.objectStore('sync');
      void sync.get('setAside').then((now) => putSyncInTx(tx, 'setAside', withSetAside(now as SetAsideEntry[] | undefined, made.refused)));
    }
    const other = await outbox.index('by-created').openCursor();
    if (other || !made.entry) {
      await tx.done;
      return other?.value;
    }
    await Promise.all([outbox.put(made.entry), tx.done]);
    return made.entry;
  });
  notifySyncChanged();
  return entry;
}

/** A size in MiB for a sentence, e.g. "16 MiB" or "4.3 MiB". */
export function mib(bytes: number): string {
  const m = bytes / 1024 / 1024;
  return `${m >= 10 || Number.isInteger(m) ? Math.round(m) : m.toFixed(1)} MiB`;
}

/**
 * The office acknowledged bundle `id` (201 or 200): in one transaction the acked mark moves past its
 * records, the bundle leaves the outbox, a search for a refused record counts them, and the status
 * records the success. False when it was not there.
 */
export async function acknowledge(id: string): Promise<boolean> {
  const at = now_ms();
  const done = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.outbox, 'readwrite');
    const sync = tx.objectStore('sync');
    const [entry, acked, status, limitsRead] = await Promise.all([tx.objectStore('outbox').get(id), sync.get('acked'), sync.get('status'), sync.get('outboxLimits')]);
    if (!entry) {
      await tx.done;
      return false;
    }
    const next = typeof acked === 'string' && acked > entry.through ? acked : entry.through;
    const { lastProblem: _cleared, ...rest } = (status as SyncStatusRecord | undefined) ?? {};
    const limits = limitsRead as OutboxLimits | undefined;
    const writes: Promise<unknown>[] = [putSyncInTx(tx, 'acked', next), putSyncInTx(tx, 'status', { ...rest, lastSuccess_ms: at }), tx.objectStore('outbox').delete(id)];
    if (limits?.search) {
      const left = limits.search.left - entry.bundle.records.length;
      const { search: _done, ...others } = limits;
      writes.push(putSyncInTx(tx, 'outboxLimits', left > 0 ? { ...limits, search: { ...limits.search, left } } : others));
    }
    await Promise.all([...writes, tx.done]);
    return true;
  });
  notifySyncChanged();
  return done;
}

/** Notes a failed attempt at bundle `id`: one more attempt, and the earliest time for the next (UTC ms). */
export async function noteAttempt(id: string, nextAttempt_ms: number): Promise<void> {
  await withDb(async (db) => {
    const tx = db.transaction('outbox', 'readwrite');
    const entry = await tx.store.get(id);
    if (entry) await tx.store.put({ ...entry, attempts: entry.attempts + 1, nextAttempt_ms });
    await tx.done;
  });
  notifySyncChanged();
}

/** A bundle file to save or share, and the mark to record once it has been handed over. */
export interface ExportFile {
  bundle: Bundle;
  /** Mark of the last record of this device in it; pass to markExported after the file was saved. */
  through?: string;
  /** Records left out because a bundle cannot carry them (core's bundleRecordProblem): no file is refused for one record. */
  leftOut: number;
}

/**
 * A bundle of every synced record on this phone (all devices, tombstones included, demo left out), or with
 * `changesOnly` of this device's records changed since the last acknowledged push or changes file.
 */
export function exportBundle(changesOnly: boolean): Promise<ExportFile> {
  const at = now_ms();
  return withDb(async (db) => {
    const tx = db.transaction(SCOPES.waiting, 'readonly');
    const [storedDevice, acked, exported] = await Promise.all([
      tx.objectStore('meta').get('deviceId'), tx.objectStore('sync').get('acked'), tx.objectStore('sync').get('exported'),
    ]);
    const device = typeof storedDevice === 'string' ? storedDevice : 'unnamed-device';
    let records: SyncRecord[];
    let through: string | undefined;
    if (changesOnly) {
      const a = acked as string | undefined;
      const e = exported as string | undefined;
      const after = a === undefined ? e : e === undefined ? a : a > e ? a : e;
      const mine = await mineAfter(tx, device, after);
      records = mine.map((m) => m.record);
      through = mine.length ? mine[mine.length - 1].mark : undefined;
    } else {
      const kinds = Object.keys(STORE_OF_KIND) as SyncKind[];
      const all = await Promise.all(kinds.map((k) => tx.objectStore(STORE_OF_KIND[k]).getAll()));
      records = kinds.flatMap((k, i) => all[i].map((r) => toSyncRecord(k, r as never))).filter((r) => !isDemo(r));
    }
    const carried = records.filter((r) => bundleRecordProblem(r) === undefined);
    return { bundle: makeBundle({ id: crypto.randomUUID(), device, created_ms: at, records: carried }), through, leftOut: records.length - carried.length };
  });
}

/** Records that a file of changes up to mark `through` was saved or shared (UTC ms now). */
export async function markExported(through: string | undefined): Promise<void> {
  const at = now_ms();
  await withDb(async (db) => {
    const tx = db.transaction('sync', 'readwrite');
    const [exported, status] = await Promise.all([tx.store.get('exported'), tx.store.get('status')]);
    const next = through !== undefined && (typeof exported !== 'string' || through > exported) ? through : undefined;
    await Promise.all([
      next !== undefined ? putSyncInTx(tx, 'exported', next) : undefined,
      putSyncInTx(tx, 'status', { ...((status as SyncStatusRecord | undefined) ?? {}), lastExport_ms: at }),
      tx.done,
    ]);
  });
  notifySyncChanged();
}

/** Removes one waiting bundle inside a caller's transaction (the outbox's refusal rules settle it). */
export function removeOutboxEntryInTx(tx: { objectStore(name: 'outbox'): { delete(key: string): Promise<unknown> } }, id: string): Promise<unknown> {
  return tx.objectStore('outbox').delete(id);
}

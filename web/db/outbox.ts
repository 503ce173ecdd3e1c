// The outbox: what waits for the office. Every record this device wrote whose mark ("<rev> <kind> <id>")
// sorts above the acknowledged mark waits; a bundle made of the oldest of them is kept in the outbox
// store and sent, unchanged and under the same id, until the office acknowledges it (201 or 200). Only
// then does the mark move past its records. The records never leave IndexedDB; the demo site's never wait.
import { DEMO_SITE_ID } from '../../core/demo/index';
import { makeBundle, type Bundle } from '../../core/exchange/index';
import { parseRev, toSyncRecord, type SyncKind, type SyncRecord } from '../../core/records/index';
import { withDb } from './connection';
import { now_ms } from './clock';
import type { OutboxEntry, SyncStatusRecord } from './schema';
import { STORE_OF_KIND, SYNCED_STORES } from './stores';
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

/** How many records wait for the office (written here and not yet acknowledged). */
export function waitingCount(): Promise<number> {
  return withDb(async (db) => {
    const tx = db.transaction([...SYNCED_STORES, 'meta', 'sync'], 'readonly');
    const [device, acked] = await Promise.all([tx.objectStore('meta').get('deviceId'), tx.objectStore('sync').get('acked')]);
    if (typeof device !== 'string') return 0;
    return (await mineAfter(tx, device, acked as string | undefined)).length;
  });
}

/**
 * The next bundle to send: the oldest unacknowledged one in the outbox, or a new one of the oldest
 * waiting records (at most MAX_BUNDLE_RECORDS), kept in the outbox before it is returned. Undefined when
 * nothing waits.
 */
export async function nextOutgoing(): Promise<OutboxEntry | undefined> {
  const at = now_ms();
  const oldest = () => withDb(async (db) => (await db.transaction('outbox').store.index('by-created').openCursor())?.value);
  const pending = await oldest();
  if (pending) return pending;
  // Read in one transaction, then kept in another that only writes the outbox (records are read, never
  // written here); if another tab kept a bundle meanwhile, that one goes first.
  const made = await withDb(async (db) => {
    const tx = db.transaction([...SYNCED_STORES, 'meta', 'sync'], 'readonly');
    const [device, acked] = await Promise.all([tx.objectStore('meta').get('deviceId'), tx.objectStore('sync').get('acked')]);
    if (typeof device !== 'string') return undefined;
    const waiting = (await mineAfter(tx, device, acked as string | undefined)).slice(0, MAX_BUNDLE_RECORDS);
    if (waiting.length === 0) return undefined;
    const bundle = makeBundle({ id: crypto.randomUUID(), device, created_ms: at, records: waiting.map((w) => w.record) });
    return { id: bundle.id, bundle, through: waiting[waiting.length - 1].mark, created_ms: at, attempts: 0, nextAttempt_ms: at } satisfies OutboxEntry;
  });
  if (!made) return undefined;
  const entry = await withDb(async (db) => {
    const tx = db.transaction('outbox', 'readwrite');
    const other = await tx.store.index('by-created').openCursor();
    if (other) {
      await tx.done;
      return other.value;
    }
    await Promise.all([tx.store.put(made), tx.done]);
    return made;
  });
  notifySyncChanged();
  return entry;
}

/**
 * The office acknowledged bundle `id` (201 or 200): in one transaction the acked mark moves past its
 * records, the bundle leaves the outbox and the status records the success. False when it was not there.
 */
export async function acknowledge(id: string): Promise<boolean> {
  const at = now_ms();
  const done = await withDb(async (db) => {
    const tx = db.transaction(['outbox', 'sync'], 'readwrite');
    const [entry, acked, status] = await Promise.all([tx.objectStore('outbox').get(id), tx.objectStore('sync').get('acked'), tx.objectStore('sync').get('status')]);
    if (!entry) {
      await tx.done;
      return false;
    }
    const next = typeof acked === 'string' && acked > entry.through ? acked : entry.through;
    const { lastProblem: _cleared, ...rest } = (status as SyncStatusRecord | undefined) ?? {};
    await Promise.all([putSyncInTx(tx, 'acked', next), putSyncInTx(tx, 'status', { ...rest, lastSuccess_ms: at }), tx.objectStore('outbox').delete(id), tx.done]);
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
}

/**
 * A bundle of every synced record on this phone (all devices, tombstones included, demo left out), or with
 * `changesOnly` of this device's records changed since the last acknowledged push or changes file.
 */
export function exportBundle(changesOnly: boolean): Promise<ExportFile> {
  const at = now_ms();
  return withDb(async (db) => {
    const tx = db.transaction([...SYNCED_STORES, 'meta', 'sync'], 'readonly');
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
    return { bundle: makeBundle({ id: crypto.randomUUID(), device, created_ms: at, records }), through };
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

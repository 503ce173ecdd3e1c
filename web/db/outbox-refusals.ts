// What the outbox does when the office refuses a bundle for what is in it (core/sync/refusal.ts reads the
// answer): the named record's version is set aside and the rest is rebuilt into new bundles; a refusal
// that names no record starts a search (bundles of half the records until the refused one is alone); a
// bundle too large lowers the byte budget, and a lone record too large is set aside. Each refusal either
// sets a version aside or halves a bundle, so the outbox never sends the same refused bundle twice.
// DOM-free: the service worker runs this too.
import { MIN_BUNDLE_BYTES, type SyncKind, type SyncRecord } from '../../core/index';
import { withDb } from './connection';
import { now_ms } from './clock';
import { bundleBytes, markOf, mib, removeOutboxEntryInTx } from './outbox';
import { putSyncInTx } from './sync-store';
import { withSetAside, type OutboxLimits, type SetAsideEntry } from './outbox-state';
import type { OutboxEntry } from './schema';
import { SCOPES, STORE_OF_KIND } from './stores';
import { notifySyncChanged } from './sync-events';

/** The set-aside entry for a version the office refused. */
function refusedByOffice(record: SyncRecord, reason: string, at_ms: number): SetAsideEntry {
  const siteId = record.kind === 'site' ? record.id : (record.body as { siteId?: string }).siteId;
  return {
    mark: markOf(record), kind: record.kind, id: record.id, rev: record.rev, ...(siteId ? { siteId } : {}),
    ...(record.deleted ? { deleted: true } : {}), reason, by: 'office', at_ms,
  };
}

/** In one transaction: bundle `id` leaves the outbox and `change` gives the new limits and set-aside versions. False when it was gone. */
async function settle(id: string, change: (entry: OutboxEntry, limits: OutboxLimits) => { limits: OutboxLimits; aside?: SetAsideEntry }): Promise<boolean> {
  const done = await withDb(async (db) => {
    const tx = db.transaction(SCOPES.outbox, 'readwrite');
    const sync = tx.objectStore('sync');
    const [entry, limits, aside] = await Promise.all([tx.objectStore('outbox').get(id), sync.get('outboxLimits'), sync.get('setAside')]);
    if (!entry) {
      await tx.done;
      return false;
    }
    const next = change(entry, (limits ?? {}) as OutboxLimits);
    const writes: Promise<unknown>[] = [removeOutboxEntryInTx(tx, id), putSyncInTx(tx, 'outboxLimits', next.limits)];
    if (next.aside) writes.push(putSyncInTx(tx, 'setAside', withSetAside(aside as SetAsideEntry[] | undefined, [next.aside])));
    await Promise.all([...writes, tx.done]);
    return true;
  });
  notifySyncChanged();
  return done;
}

function withoutSearch(limits: OutboxLimits): OutboxLimits {
  const { search: _found, ...rest } = limits;
  return rest;
}

/** The office refused record `index` of bundle `id` (its words in `reason`): that version is set aside, the rest goes again. */
export function setAsideRefused(id: string, index: number, reason: string): Promise<boolean> {
  const at = now_ms();
  return settle(id, (entry, limits) => {
    const record = entry.bundle.records[index];
    if (!record) return startSearch(entry, limits, reason, at);
    return { limits: withoutSearch(limits), aside: refusedByOffice(record, reason, at) };
  });
}

function startSearch(entry: OutboxEntry, limits: OutboxLimits, reason: string, at: number): { limits: OutboxLimits; aside?: SetAsideEntry } {
  const n = entry.bundle.records.length;
  if (n === 1) return { limits: withoutSearch(limits), aside: refusedByOffice(entry.bundle.records[0], reason, at) };
  return { limits: { ...limits, search: { records: Math.ceil(n / 2), left: Math.max(limits.search?.left ?? 0, n) } } };
}

/** The office refused bundle `id` for a record it did not name: bundles of half as many records until that record is alone and set aside. */
export function searchRefused(id: string, reason: string): Promise<boolean> {
  const at = now_ms();
  return settle(id, (entry, limits) => startSearch(entry, limits, reason, at));
}

/** The office refused bundle `id` as too large (its stated limit, bytes, when it gave one): smaller bundles, or a lone record set aside. */
export function refusedAsTooLarge(id: string, limit_bytes?: number): Promise<boolean> {
  const at = now_ms();
  return settle(id, (entry, limits) => {
    const bytes = bundleBytes(entry.bundle);
    const stated = limit_bytes !== undefined ? { stated_bytes: limit_bytes } : {};
    if (entry.bundle.records.length === 1) {
      const reason = `This record is too large for the office (${mib(bytes)}${limit_bytes !== undefined ? `; it takes at most ${mib(limit_bytes)}` : ''}).`;
      return { limits: { ...limits, ...stated }, aside: refusedByOffice(entry.bundle.records[0], reason, at) };
    }
    return { limits: { ...limits, ...stated, lowered_bytes: Math.max(MIN_BUNDLE_BYTES, Math.floor(bytes / 2)) } };
  });
}

/** Keeps the largest bundle the office says it takes (its Freshet-Max-Bundle-Bytes header), bytes. */
export async function noteStatedLimit(limit_bytes: number): Promise<void> {
  await withDb(async (db) => {
    const tx = db.transaction('sync', 'readwrite');
    const limits = ((await tx.store.get('outboxLimits')) ?? {}) as OutboxLimits;
    if (limits.stated_bytes !== limit_bytes) void putSyncInTx(tx, 'outboxLimits', { ...limits, stated_bytes: limit_bytes });
    await tx.done;
  });
}

/** A set-aside version as the Sync screen shows it: still to decide, replaced by a newer version, or not to be sent. */
export interface SetAsideView extends SetAsideEntry {
  state: 'open' | 'replaced' | 'dropped';
}

/** Every set-aside version with its state (newest first); `replaced` when the record was edited or deleted since. */
export function listSetAside(): Promise<SetAsideView[]> {
  return withDb(async (db) => {
    const tx = db.transaction(SCOPES.setAside, 'readonly');
    const entries = ((await tx.objectStore('sync').get('setAside')) ?? []) as SetAsideEntry[];
    const current = await Promise.all(entries.map((e) => tx.objectStore(STORE_OF_KIND[e.kind as SyncKind]).get(e.id) as Promise<{ rev?: string } | undefined>));
    return entries
      .map((e, i): SetAsideView => ({ ...e, state: e.dropped ? 'dropped' : current[i]?.rev === e.rev ? 'open' : 'replaced' }))
      .sort((a, b) => b.at_ms - a.at_ms);
  });
}

/** Records the user's choice not to send the set-aside version `mark` (the record stays on this phone). */
export async function dropSetAside(mark: string): Promise<void> {
  const at = now_ms();
  await withDb(async (db) => {
    const tx = db.transaction('sync', 'readwrite');
    const entries = ((await tx.store.get('setAside')) ?? []) as SetAsideEntry[];
    const next = entries.map((e) => (e.mark === mark && !e.dropped ? { ...e, dropped: { at_ms: at, because: 'chosen' as const } } : e));
    await Promise.all([putSyncInTx(tx, 'setAside', next), tx.done]);
  });
  notifySyncChanged();
}

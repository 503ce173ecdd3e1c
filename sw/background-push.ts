// Background Sync as a trigger only. When the browser fires the push tag (the network came back), an open
// page is told to run its sync; with no page open, the worker sends the bundles the page already put in
// the outbox, each until the office acknowledges it, exactly as the page would. The outbox in IndexedDB
// stays the store of record: a bundle leaves it only after a 201/200 with the office's JSON answer.
import { openDB, type IDBPDatabase } from 'idb';
import { readPushAnswer, type PushOutcome } from '../core/sync/answer';

/** Tag the page registers (web/sync/engine.ts PUSH_TAG). */
export const PUSH_TAG = 'freshet-push';
/** Message the page listens for (web/sync/triggers.ts SYNC_NOW_MESSAGE). */
export const SYNC_NOW_MESSAGE = 'SYNC_NOW';

interface Entry {
  id: string;
  bundle: { id: string };
  through: string;
  created_ms: number;
  attempts: number;
}

async function post(base: string, token: string, entry: Entry): Promise<PushOutcome> {
  try {
    const res = await fetch(`${base}/bundles`, {
      method: 'POST', mode: 'cors', credentials: 'omit', cache: 'no-store',
      headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', 'Idempotency-Key': entry.id },
      body: JSON.stringify(entry.bundle),
    });
    const body = await res.text().catch(() => '');
    return readPushAnswer({ status: res.status, contentType: res.headers.get('Content-Type'), body, retryAfter: res.headers.get('Retry-After') }, entry.id);
  } catch {
    return readPushAnswer({ status: 0, contentType: null, body: '', retryAfter: null }, entry.id);
  }
}

/** The acknowledgement, as web/db/outbox.ts `acknowledge` writes it: mark, status, entry gone, one transaction. */
async function acknowledge(db: IDBPDatabase, entry: Entry): Promise<void> {
  const tx = db.transaction(['outbox', 'sync'] as const, 'readwrite');
  const sync = tx.objectStore('sync');
  const [acked, status] = await Promise.all([sync.get('acked'), sync.get('status')]);
  const next = typeof acked === 'string' && acked > entry.through ? acked : entry.through;
  const { lastProblem: _cleared, ...rest } = (status ?? {}) as Record<string, unknown>;
  await Promise.all([sync.put(next, 'acked'), sync.put({ ...rest, lastSuccess_ms: Date.now() }, 'status'), tx.objectStore('outbox').delete(entry.id), tx.done]);
}

async function noteProblem(db: IDBPDatabase, outcome: Exclude<PushOutcome, { kind: 'delivered' }>): Promise<void> {
  const tx = db.transaction('sync', 'readwrite');
  const status = ((await tx.store.get('status')) ?? {}) as Record<string, unknown>;
  await Promise.all([tx.store.put({ ...status, lastProblem: { message: outcome.message, kind: outcome.kind, at_ms: Date.now() } }, 'status'), tx.done]);
}

/** Answers the Background Sync event: tells open pages to sync, or sends the waiting bundles itself. */
export async function pushFromWorker(self: ServiceWorkerGlobalScope): Promise<void> {
  const pages = await self.clients.matchAll({ type: 'window', includeUncontrolled: true });
  if (pages.length > 0) {
    for (const p of pages) p.postMessage({ type: SYNC_NOW_MESSAGE });
    return;
  }
  // Open whatever version is there, never create: an upgrade here (no database yet) is aborted, so the
  // app's own upgrade ladder still starts from nothing.
  let db: IDBPDatabase;
  try {
    db = await openDB('freshet', undefined, { upgrade: (_db, _old, _new, tx) => tx.abort() });
  } catch {
    return;
  }
  try {
    if (!db.objectStoreNames.contains('outbox')) return;
    const settings = (await db.get('sync', 'settings')) as { base: string; token: string } | undefined;
    if (!settings) return;
    for (const entry of (await db.getAllFromIndex('outbox', 'by-created')) as Entry[]) {
      const outcome = await post(settings.base, settings.token, entry);
      if (outcome.kind === 'delivered') {
        await acknowledge(db, entry);
        continue;
      }
      await noteProblem(db, outcome);
      // Rejecting asks the browser to fire the event again later; a problem to fix waits for the user.
      if (outcome.kind === 'retry') throw new Error(outcome.message);
      return;
    }
  } finally {
    db.close();
  }
}

// Background Sync as a trigger only. When the browser fires the push tag (the network came back), an open
// page is told to run its sync; with no page open, the worker sends the outbox itself with the page's own
// push loop (web/sync/push.ts over web/db's outbox and typed schema): one copy of the protocol, the
// acknowledgement, the set-aside rules and the status. The outbox in IndexedDB stays the store of record.
import { PUSH_TAG, pushWaiting, storedSettings, SYNC_NOW_MESSAGE } from '../web/sync/push';

export { PUSH_TAG };

/** Answers the Background Sync event: tells open pages to sync, or sends the waiting bundles itself. */
export async function pushFromWorker(self: ServiceWorkerGlobalScope): Promise<void> {
  const pages = await self.clients.matchAll({ type: 'window', includeUncontrolled: true });
  if (pages.length > 0) {
    for (const p of pages) p.postMessage({ type: SYNC_NOW_MESSAGE });
    return;
  }
  let settings;
  try {
    settings = await storedSettings();
  } catch {
    // No database to read (storage unavailable, or a newer version is open): the page syncs when it opens.
    return;
  }
  if (!settings) return;
  const run = await pushWaiting(settings);
  // Rejecting asks the browser to fire the event again later; a problem to fix waits for the user.
  if (run.kind === 'stopped' && run.outcome.kind === 'retry') throw new Error(run.outcome.message);
}

// When the app syncs by itself: at start, when the browser says the network is back, when the app comes
// to the foreground, a few seconds after records change, and when the service worker's Background Sync
// fires while a page is open. Each trigger only starts a run; the outbox in IndexedDB holds the data.
import { onRecordsChanged } from '../db';
import { syncNow } from './engine';
import { SYNC_NOW_MESSAGE } from './names';

/** Quiet time after a record change before a run starts, ms (several saves in a row go together). */
export const AFTER_CHANGE_MS = 3000;

/** Message the service worker posts to open pages when Background Sync fires (declared in names.ts). */
export { SYNC_NOW_MESSAGE };

/** Starts the automatic triggers. */
export function startSyncTriggers(): void {
  let pending: ReturnType<typeof setTimeout> | undefined;
  const soon = () => {
    if (pending !== undefined) clearTimeout(pending);
    pending = setTimeout(() => {
      pending = undefined;
      void syncNow();
    }, AFTER_CHANGE_MS);
  };
  addEventListener('online', () => void syncNow());
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'visible') void syncNow();
  });
  onRecordsChanged((c) => {
    // Only this tab's own saves: another tab runs its own triggers, and merges made here are not news.
    if (!c.fromOtherTab && c.kinds.some((k) => k !== 'draft' && k !== 'conflict')) soon();
  });
  navigator.serviceWorker?.addEventListener('message', (e: MessageEvent<unknown>) => {
    const data = e.data as { type?: unknown } | null;
    if (data && data.type === SYNC_NOW_MESSAGE) void syncNow();
  });
  void syncNow();
}

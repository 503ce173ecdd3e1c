/// <reference lib="webworker" />
// The service worker: precaches the whole app shell at install so the app starts with no network,
// serves navigations from the cached shell, and waits for the user before an update takes over.
import { clientsClaim } from 'workbox-core';
import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { PUSH_TAG, pushFromWorker } from './background-push';

declare const self: ServiceWorkerGlobalScope & { __WB_MANIFEST: Array<{ url: string; revision: string | null }> };

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();
registerRoute(new NavigationRoute(createHandlerBoundToURL('index.html')));

// A first install has no page to disturb, so it takes control at once. A later version installs and
// waits (no skipWaiting here): it takes over only when the page the user is on asks for it.
clientsClaim();

// Sent by the page (web/app/updates.ts) when the user accepts the update.
self.addEventListener('message', (event) => {
  const data: unknown = event.data;
  if (typeof data === 'object' && data !== null && (data as { type?: unknown }).type === 'SKIP_WAITING') {
    void self.skipWaiting();
  }
});

// Background Sync (where the browser has it) only triggers a push; the data stays in the app's outbox.
interface SyncEventLike extends ExtendableEvent {
  readonly tag: string;
}
self.addEventListener('sync' as keyof ServiceWorkerGlobalScopeEventMap, (event) => {
  const e = event as unknown as SyncEventLike;
  if (e.tag === PUSH_TAG) e.waitUntil(pushFromWorker(self));
});

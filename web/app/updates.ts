// Service-worker registration and the update flow. A first install takes control at once (the worker
// calls clientsClaim). A later version waits; the app shows that an update is ready, and only when the
// user accepts do we save what is open, let the new worker take over and reload this page. A page that
// did not ask is never reloaded: it is told that a newer version is running in another tab.
import type { UpdateNoticeState } from '../components/UpdateNotice';
import { createStore } from '../store';
import { noteRequest, online } from './online';

/** Where the update flow stands: the states the notice at the bottom of the screen shows. */
export type UpdateStatus = UpdateNoticeState;

export const updateStatus = createStore<UpdateStatus>({ kind: 'current' });

/** True once the service worker controls this page (the app then starts offline). */
export const offlineReady = createStore<boolean>(false);

type BeforeUpdate = () => Promise<void>;
const beforeUpdate = new Set<BeforeUpdate>();
let registration: ServiceWorkerRegistration | undefined;
let acceptedHere = false;

/** Registers work to finish before a new version takes over (saving an open form as a draft). */
export function onBeforeUpdate(task: BeforeUpdate): () => void {
  beforeUpdate.add(task);
  return () => beforeUpdate.delete(task);
}

/** Registers the service worker and starts watching for new versions. */
export function startServiceWorker(): void {
  if (!('serviceWorker' in navigator)) return;
  const sw = navigator.serviceWorker;
  let hadController = !!sw.controller;
  offlineReady.set(hadController);
  sw.addEventListener('controllerchange', () => {
    offlineReady.set(true);
    // The first install claiming this page is not an update; a replacement is.
    if (!hadController) {
      hadController = true;
      return;
    }
    if (acceptedHere) location.reload();
    else updateStatus.set({ kind: 'changed-elsewhere' });
  });
  void sw.register('./sw.js', { scope: './' }).then((reg) => {
    registration = reg;
    offlineReady.set(!!sw.controller);
    const offerIfWaiting = () => {
      // A waiting worker with a controller in place is a new version; without one it is the first install.
      if (reg.waiting && sw.controller && updateStatus.get().kind === 'current') updateStatus.set({ kind: 'ready' });
    };
    offerIfWaiting();
    reg.addEventListener('updatefound', () => {
      const incoming = reg.installing;
      incoming?.addEventListener('statechange', () => {
        if (incoming.state === 'installed') offerIfWaiting();
      });
    });
  });
  // Look for a new version when the app comes back to the foreground, and hourly while it is open.
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'visible') void checkForUpdate();
  });
  setInterval(() => void checkForUpdate(), 60 * 60 * 1000);
}

/** Asks the server for a newer version; resolves quietly when offline. */
export async function checkForUpdate(): Promise<void> {
  if (!registration || !online.get()) return;
  try {
    await registration.update();
    noteRequest('answered');
  } catch {
    // Offline or the server is away: try again at the next chance.
  }
}

/** The user accepted the update: save open work, then let the waiting worker take over and reload. */
export async function acceptUpdate(): Promise<void> {
  const waiting = registration?.waiting;
  if (!waiting) return;
  updateStatus.set({ kind: 'applying' });
  try {
    for (const task of [...beforeUpdate]) await task();
  } catch (err) {
    updateStatus.set({ kind: 'failed', message: `Could not save the open form first, so the update waits: ${String(err)}` });
    return;
  }
  acceptedHere = true;
  waiting.postMessage(TAKE_OVER);
}

/** The message the waiting worker acts on (sw/sw.ts checks the same type). */
const TAKE_OVER = { type: 'SKIP_WAITING' } as const;

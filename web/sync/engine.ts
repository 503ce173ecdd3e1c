// One sync run: send every waiting bundle (each until acknowledged), then, when the page is visible,
// pull what others sent and merge it (a hidden tab only sends). One run at a time per tab, and per
// browser where Web Locks exist (tabs and the service worker).
// A failure that can pass (no network, 408, 429, 5xx, a login page) schedules another run with growing
// waits and asks the service worker's Background Sync to trigger one when the network returns; a failure
// the user must fix (token, address) stops until the settings change or the user asks again.
import { retryDelay_ms, type PushOutcome } from '../../core';
import { applyIncoming, getSyncValue, noteSyncProblem, updateSyncStatus, type SyncStatusRecord } from '../db';
import { createStore } from '../store';
import { pullBundles } from './http';
import { PUSH_TAG } from './names';
import { pushWaiting } from './push';
import { loadSettings } from './settings';

/** The tag the page registers for Background Sync; the service worker answers it (declared in names.ts). */
export { PUSH_TAG };

/** How a run ended: nothing set up, everything done, or stopped on a problem (retry or fix). */
export type RunResult = { kind: 'no-settings' } | { kind: 'done'; sent: number; received: number } | { kind: 'retry' | 'fix'; message: string };

/** True while a run is in progress in this tab (for the "Sync now" button). */
export const syncRunning = createStore<boolean>(false);

let current: Promise<RunResult> | undefined;
let timer: ReturnType<typeof setTimeout> | undefined;
/** Pulls that failed in a row: their retries wait longer each time, like a push's. */
let pullFailures = 0;

/** True when this run may pull: never from a hidden tab (web/sync/triggers.ts has the whole rule). */
function mayPull(): boolean {
  return typeof document === 'undefined' || document.visibilityState !== 'hidden';
}

/** Runs a sync now (or joins the run already going); resolves with how it ended. */
export function syncNow(): Promise<RunResult> {
  if (current) return current;
  if (timer !== undefined) clearTimeout(timer);
  timer = undefined;
  syncRunning.set(true);
  const locks = typeof navigator !== 'undefined' ? (navigator as Navigator & { locks?: LockManager }).locks : undefined;
  const run = locks ? (async () => await locks.request('freshet-sync', () => runOnce()))() : runOnce();
  current = run.finally(() => {
    current = undefined;
    syncRunning.set(false);
  });
  return current;
}

function withoutProblem(s: SyncStatusRecord, at_ms: number): SyncStatusRecord {
  const { lastProblem: _gone, ...rest } = s;
  return { ...rest, lastSuccess_ms: at_ms };
}

async function runOnce(): Promise<RunResult> {
  const settings = await loadSettings();
  if (!settings) return { kind: 'no-settings' };
  const pushed = await pushWaiting(settings);
  if (pushed.kind === 'stopped') return stop(pushed.outcome, pushed.attempts, true);
  const sent = pushed.sent;
  if (!mayPull()) return { kind: 'done', sent, received: 0 };
  let received = 0;
  let cursor = await getSyncValue('cursor');
  for (let page = 0; page < 1000; page++) {
    const answer = await pullBundles(settings, cursor);
    if (answer.kind !== 'bundles') return stop(answer, ++pullFailures);
    const records = answer.bundles.flatMap((b) => b.records);
    // The cursor is stored in the merge's own transaction: never ahead of what was merged.
    await applyIncoming(records, { cursor: answer.cursor });
    received += records.length;
    cursor = answer.cursor;
    if (!answer.more) break;
  }
  pullFailures = 0;
  await updateSyncStatus((s) => withoutProblem(s, Date.now()));
  return { kind: 'done', sent, received };
}

async function stop(outcome: Exclude<PushOutcome, { kind: 'delivered' }>, attempts: number, noted = false): Promise<RunResult> {
  if (!noted) await noteSyncProblem(outcome);
  if (outcome.kind === 'retry') {
    // ±20 % spread so many phones coming back at once do not knock together.
    const wait = outcome.after_ms ?? retryDelay_ms(attempts) * (0.8 + 0.4 * Math.random());
    timer = setTimeout(() => void syncNow(), wait);
    // Background Sync fires as soon as the browser believes it is online, so it is asked for only when the
    // browser knows it is offline; otherwise a failing office would be retried in a tight loop.
    if (!navigator.onLine) void askForBackgroundSync();
  }
  return { kind: outcome.kind, message: outcome.message };
}

interface SyncManagerLike {
  register(tag: string): Promise<void>;
}

/** Asks the service worker to be woken when the network returns (browsers with Background Sync only). */
async function askForBackgroundSync(): Promise<void> {
  try {
    if (!('serviceWorker' in navigator)) return;
    const reg = (await navigator.serviceWorker.ready) as ServiceWorkerRegistration & { sync?: SyncManagerLike };
    await reg.sync?.register(PUSH_TAG);
  } catch {
    // No Background Sync here (Firefox, Safari) or not allowed: start, online and visibility still trigger.
  }
}

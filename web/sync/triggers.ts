// When the app syncs by itself. A run sends what waits and then, in a visible tab, asks the office for
// what others sent (web/sync/engine.ts). The phone asks only when it has a reason:
//   - when the app opens, and when the network comes back (seen by a request that got an answer, not by
//     the browser's flag alone: web/app/online.ts);
//   - a few seconds after this tab saved records that now wait for the office (a push, then a pull);
//   - when the service worker's Background Sync fires while a page is open;
//   - "Send and receive now" on the Sync screen (the screen calls the engine itself);
//   - otherwise at most every 15 minutes while the app is visible; a hidden tab never pulls (it may send),
//     and coming back to the foreground pulls only when the last exchange is that old, or when records
//     wait to be sent (then the run sends them and pulls after the push).
// The sync client (engine, HTTP, bundle code) loads only once an office endpoint is set up, so a first
// visit never downloads it. Each trigger only starts a run; the outbox in IndexedDB holds the data.
import { onRecordsChanged } from '../db/events';
import { onSyncChanged } from '../db/sync-events';
import { getSyncValue } from '../db/sync-store';
import type { Store } from '../store';
import type { RunResult } from './engine';
import { SYNC_NOW_MESSAGE } from './names';

/** Quiet time after a record change before a run starts, ms (several saves in a row go together). */
export const AFTER_CHANGE_MS = 3000;

/** Longest quiet time between pulls while the app is visible and nothing else gave a reason, ms. */
export const PULL_EVERY_MS = 15 * 60_000;

/** Message the service worker posts to open pages when Background Sync fires (declared in names.ts). */
export { SYNC_NOW_MESSAGE };

/** What the triggers need from the app's network watch (web/app/online.ts). */
export interface NetworkWatch {
  /** True while the last request to the network got an answer. */
  online: Store<boolean>;
  /** Asks the network once and records the outcome in `online`. */
  probe(): Promise<boolean>;
}

type Engine = typeof import('./engine');

let engine: Promise<Engine> | undefined;
let periodic: ReturnType<typeof setTimeout> | undefined;
/** When the last run in a visible tab ended (it pulled), ms; -Infinity before any. */
let lastPull_ms = -Infinity;

const visible = () => document.visibilityState === 'visible';

/** Loads the sync client once and follows its runs (those the Sync screen starts too). */
function loadEngine(): Promise<Engine> {
  engine ??= import('./engine').then((m) => {
    m.syncRunning.subscribe((running) => {
      if (running || !visible()) return;
      lastPull_ms = Date.now();
      schedulePull();
    });
    return m;
  });
  return engine;
}

/** Sets the one timer for the next pull by the clock: PULL_EVERY_MS after the last one. */
function schedulePull(): void {
  if (periodic !== undefined) clearTimeout(periodic);
  periodic = setTimeout(() => {
    periodic = undefined;
    // A hidden tab lets the time pass; coming back to the foreground pulls if it is due.
    if (visible()) void run();
  }, Math.max(0, lastPull_ms + PULL_EVERY_MS - Date.now()));
}

/** Runs a sync when an office endpoint is set up; resolves with how it ended (undefined when none is). */
async function run(network?: NetworkWatch): Promise<RunResult | undefined> {
  if (!(await getSyncValue('settings'))) return undefined;
  const result = await (await loadEngine()).syncNow();
  // No answer from the office may mean the network is gone although the browser says otherwise: ask,
  // so the top bar says so and the network's return starts the next run at once.
  if (result.kind === 'retry') void network?.probe();
  return result;
}

/** True when this device has records the office has not acknowledged. */
async function somethingWaits(): Promise<boolean> {
  const { waitingCount } = await import('../db/outbox');
  return (await waitingCount()) > 0;
}

/** Starts the automatic triggers; `network` is the app's network watch (without it, the browser's `online` event). */
export function startSyncTriggers(network?: NetworkWatch): void {
  let pending: ReturnType<typeof setTimeout> | undefined;
  const afterChange = () => {
    if (pending !== undefined) clearTimeout(pending);
    pending = setTimeout(() => {
      pending = undefined;
      // Records merged from a pull notify too, but none of them waits for the office: no run for them.
      void somethingWaits().then((waits) => (waits ? run(network) : undefined));
    }, AFTER_CHANGE_MS);
  };
  if (network) {
    let wasOnline = network.online.get();
    network.online.subscribe((now) => {
      if (now && !wasOnline) void run(network);
      wasOnline = now;
    });
    // The browser's event is a hint: run once a request confirms it (the watch probes on it too).
    addEventListener('online', () => void network.probe().then((ok) => (ok ? run(network) : undefined)));
  } else {
    addEventListener('online', () => void run());
  }
  document.addEventListener('visibilitychange', () => {
    if (!visible()) return;
    // Back in the foreground: a pull when the last is 15 minutes old, else a run only to send what waits.
    if (Date.now() - lastPull_ms >= PULL_EVERY_MS) void run(network);
    else void getSyncValue('settings').then((s) => (s ? somethingWaits() : false)).then((waits) => (waits ? run(network) : undefined));
  });
  onRecordsChanged((c) => {
    // Only this tab's own saves: another tab runs its own triggers.
    if (!c.fromOtherTab && c.kinds.some((k) => k !== 'draft' && k !== 'conflict')) afterChange();
  });
  // Settings saved on the Sync screen: load the client so its runs count for the 15-minute rule.
  onSyncChanged(() => {
    if (!engine) void getSyncValue('settings').then((s) => s && loadEngine());
  });
  navigator.serviceWorker?.addEventListener('message', (e: MessageEvent<unknown>) => {
    const data = e.data as { type?: unknown } | null;
    if (data && data.type === SYNC_NOW_MESSAGE) void run(network);
  });
  void run(network);
}

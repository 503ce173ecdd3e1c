// The pull rule of web/sync/triggers.ts in Node with fake timers, the engine and the stores replaced by
// counters: runs at start, when a request shows the network is back, after a local save that waits for
// the office, otherwise at most every 15 minutes while visible, never by the clock in a hidden tab, and no
// sync client at all without an office endpoint (the rule stated in issue 23; the browser test
// test/browser/sync-schedule.test.ts checks the same against a real endpoint).
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createStore } from '../../web/store';

const state = vi.hoisted(() => ({
  settings: undefined as object | undefined,
  waiting: 0,
  runs: 0,
  engineLoads: 0,
  recordListeners: [] as ((c: { kinds: string[]; fromOtherTab: boolean }) => void)[],
}));

vi.mock('../../web/db/sync-store', () => ({ getSyncValue: async () => state.settings }));
vi.mock('../../web/db/sync-events', () => ({ onSyncChanged: () => () => undefined }));
vi.mock('../../web/db/events', () => ({
  onRecordsChanged: (cb: (c: { kinds: string[]; fromOtherTab: boolean }) => void) => {
    state.recordListeners.push(cb);
    return () => undefined;
  },
}));
vi.mock('../../web/db/outbox', () => ({ waitingCount: async () => state.waiting }));
vi.mock('../../web/sync/engine', async () => {
  const { createStore: store } = await import('../../web/store');
  state.engineLoads++;
  const syncRunning = store(false);
  return {
    syncRunning,
    syncNow: async () => {
      state.runs++;
      syncRunning.set(true);
      await Promise.resolve();
      syncRunning.set(false);
      return { kind: 'done', sent: 0, received: 0 };
    },
  };
});

const MINUTE = 60_000;
let page: EventTarget;
let doc: EventTarget & { visibilityState: string };

/** Lets the promise chains started by a trigger finish (dynamic imports, store reads). */
async function settle(): Promise<void> {
  for (let i = 0; i < 20; i++) await vi.advanceTimersByTimeAsync(0);
}

async function start() {
  const online = createStore(true);
  const probe = vi.fn(async () => true);
  const m = await import('../../web/sync/triggers');
  m.startSyncTriggers({ online, probe });
  await settle();
  return { online, probe, m };
}

function show(visible: boolean): void {
  doc.visibilityState = visible ? 'visible' : 'hidden';
  doc.dispatchEvent(new Event('visibilitychange'));
}

beforeEach(() => {
  vi.resetModules();
  vi.useFakeTimers();
  Object.assign(state, { settings: { base: 'https://office.example.org/freshet', token: 't' }, waiting: 0, runs: 0, engineLoads: 0, recordListeners: [] });
  page = new EventTarget();
  doc = Object.assign(new EventTarget(), { visibilityState: 'visible' });
  vi.stubGlobal('document', doc);
  vi.stubGlobal('addEventListener', page.addEventListener.bind(page));
  vi.stubGlobal('navigator', {});
});

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

describe('the pull rule (issue 23)', () => {
  it('runs on opening, then not again until 15 minutes have passed while visible', async () => {
    await start();
    expect(state.runs).toBe(1);
    await vi.advanceTimersByTimeAsync(14 * MINUTE + 59_000);
    expect(state.runs).toBe(1);
    await vi.advanceTimersByTimeAsync(1000);
    await settle();
    expect(state.runs).toBe(2);
    await vi.advanceTimersByTimeAsync(14 * MINUTE);
    expect(state.runs).toBe(2);
  });

  it('never runs by the clock in a hidden tab; coming back pulls only when 15 minutes are up', async () => {
    await start();
    show(false);
    await vi.advanceTimersByTimeAsync(60 * MINUTE);
    expect(state.runs).toBe(1);
    show(true);
    await settle();
    expect(state.runs).toBe(2);
    show(false);
    await vi.advanceTimersByTimeAsync(5 * MINUTE);
    show(true);
    await settle();
    expect(state.runs).toBe(2);
  });

  it('runs when a request shows the network is back, and not when it goes', async () => {
    const { online } = await start();
    online.set(false);
    await settle();
    expect(state.runs).toBe(1);
    online.set(true);
    await settle();
    expect(state.runs).toBe(2);
  });

  it('runs 3 s after a local save that waits for the office; merged records (nothing waiting) start nothing', async () => {
    await start();
    const save = { kinds: ['reading'], fromOtherTab: false };
    for (const cb of state.recordListeners) cb(save);
    await vi.advanceTimersByTimeAsync(3000);
    await settle();
    expect(state.runs).toBe(1);
    state.waiting = 2;
    for (const cb of state.recordListeners) cb(save);
    await vi.advanceTimersByTimeAsync(2999);
    expect(state.runs).toBe(1);
    await vi.advanceTimersByTimeAsync(1);
    await settle();
    expect(state.runs).toBe(2);
  });

  it('loads no sync client and runs nothing without an office endpoint', async () => {
    state.settings = undefined;
    const { online } = await start();
    online.set(false);
    online.set(true);
    show(false);
    show(true);
    await vi.advanceTimersByTimeAsync(60 * MINUTE);
    await settle();
    expect(state.runs).toBe(0);
    expect(state.engineLoads).toBe(0);
  });
});

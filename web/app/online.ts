// Whether the network answers, as a store for the top bar and for code that talks to the office. The
// browser's flag is only a hint: some browsers report navigator.onLine === true on a page started from
// the service worker with no network at all, and then no `online` event comes when the network returns.
// So the state follows real outcomes: a request that got a response (any HTTP status) means online, a
// request that got none means offline, whatever the flag says. While offline and visible the app asks
// again every second, so the top bar (and the sync that waits on it) follows within about two seconds.
import { createStore } from '../store';

/** True while the last request to the network got an answer (or, before any, while the browser says online). */
export const online = createStore<boolean>(typeof navigator === 'undefined' ? true : navigator.onLine);

/** How long a probe waits for an answer before counting the network as gone, ms. */
const PROBE_TIMEOUT_MS = 10_000;
/** How often the network is asked while the app is visible and online, ms. */
const PROBE_EVERY_MS = 30_000;
/**
 * How often it is asked while visible and offline, ms. A probe with no network fails at once on this
 * phone (no radio traffic), and the network's return is seen within this time plus one request.
 */
export const PROBE_OFFLINE_EVERY_MS = 1000;

let probing: Promise<boolean> | undefined;

/** Records the outcome of a real request: 'answered' (any HTTP response) or 'failed' (no response at all). */
export function noteRequest(outcome: 'answered' | 'failed'): void {
  online.set(outcome === 'answered');
}

/**
 * Asks the network once: a HEAD request to the app's own address, which the service worker does not
 * answer from its cache (it serves GET only), so only the network can. Resolves with, and records, the
 * outcome. Calls made while one probe is under way share it.
 */
export function probeNetwork(): Promise<boolean> {
  probing ??= (async () => {
    const stop = new AbortController();
    const timer = setTimeout(() => stop.abort(), PROBE_TIMEOUT_MS);
    try {
      const url = new URL(`./?network-check=${Date.now()}`, location.href);
      await fetch(url, { method: 'HEAD', cache: 'no-store', signal: stop.signal });
      noteRequest('answered');
      return true;
    } catch {
      noteRequest('failed');
      return false;
    } finally {
      clearTimeout(timer);
      probing = undefined;
    }
  })();
  return probing;
}

/**
 * Keeps `online` true to what the network does: offline at once when the browser says so; otherwise
 * confirmed by a probe at start, when the browser says it is back, when the app comes to the foreground
 * and on every change of screen; then every 30 s while visible and online, every second while visible
 * and offline, never while hidden.
 */
export function watchOnline(): void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const visible = () => document.visibilityState === 'visible';
  const plan = () => {
    if (timer !== undefined) clearTimeout(timer);
    timer = undefined;
    if (!visible()) return;
    timer = setTimeout(() => void probeNetwork().finally(plan), online.get() ? PROBE_EVERY_MS : PROBE_OFFLINE_EVERY_MS);
  };
  online.subscribe(plan);
  addEventListener('offline', () => online.set(false));
  addEventListener('online', () => void probeNetwork());
  addEventListener('hashchange', () => void probeNetwork());
  document.addEventListener('visibilitychange', () => {
    if (visible()) void probeNetwork();
    plan();
  });
  plan();
  void probeNetwork();
}

// Whether the network answers, as a store for the top bar and for code that talks to the office. The
// browser's flag is only a hint: some browsers report navigator.onLine === true on a page started from
// the service worker with no network at all. So the state follows real outcomes: a request that got a
// response (any HTTP status) means online, a request that got none means offline, whatever the flag says.
import { createStore } from '../store';

/** True while the last request to the network got an answer (or, before any, while the browser says online). */
export const online = createStore<boolean>(typeof navigator === 'undefined' ? true : navigator.onLine);

/** How long a probe waits for an answer before counting the network as gone, ms. */
const PROBE_TIMEOUT_MS = 10_000;
/** How often the network is asked while the app is visible, ms. */
const PROBE_EVERY_MS = 30_000;

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
 * confirmed by a probe at start, when the browser says it is back, when the app comes to the foreground,
 * on every change of screen, and every 30 s while visible.
 */
export function watchOnline(): void {
  addEventListener('offline', () => online.set(false));
  addEventListener('online', () => void probeNetwork());
  addEventListener('hashchange', () => void probeNetwork());
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'visible') void probeNetwork();
  });
  setInterval(() => {
    if (document.visibilityState === 'visible') void probeNetwork();
  }, PROBE_EVERY_MS);
  void probeNetwork();
}

// Tells the Sync screen (in this tab and others) that sync state changed: settings, outbox, status.
const CHANNEL = 'freshet-sync';
const listeners = new Set<() => void>();
let channel: BroadcastChannel | undefined;

function ensureChannel(): BroadcastChannel | undefined {
  if (channel || typeof BroadcastChannel === 'undefined') return channel;
  channel = new BroadcastChannel(CHANNEL);
  channel.onmessage = () => {
    for (const cb of [...listeners]) cb();
  };
  // Node (tests) keeps the process alive while a channel listens; a browser tab has no such method.
  (channel as BroadcastChannel & { unref?: () => void }).unref?.();
  return channel;
}

/** Calls cb whenever sync state changes here or in another tab; returns the function that stops it. */
export function onSyncChanged(cb: () => void): () => void {
  ensureChannel();
  listeners.add(cb);
  return () => listeners.delete(cb);
}

/** Tells listeners here and in other tabs that sync state changed. */
export function notifySyncChanged(): void {
  for (const cb of [...listeners]) cb();
  ensureChannel()?.postMessage('changed');
}

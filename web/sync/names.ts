// Names the page and the service worker share for Background Sync. No imports: the first screen's triggers
// (triggers.ts) and the worker (sw/background-push.ts, through push.ts) name them without loading more.

/** The tag the page registers for Background Sync; the service worker answers it. */
export const PUSH_TAG = 'freshet-push';
/** Message the service worker posts to open pages when Background Sync fires. */
export const SYNC_NOW_MESSAGE = 'SYNC_NOW';

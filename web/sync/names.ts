// Names the page and the service worker share for Background Sync, declared once (tiny, so the app's
// first load need not carry the push code to know them).

/** The tag the page registers for Background Sync; the service worker answers it (sw/sw.ts). */
export const PUSH_TAG = 'freshet-push';
/** Message the service worker posts to open pages when Background Sync fires. */
export const SYNC_NOW_MESSAGE = 'SYNC_NOW';

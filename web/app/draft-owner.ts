// Which tab a draft belongs to. Each tab has an id for its life (kept in sessionStorage, so a reload of
// the same tab keeps it) and holds a Web Lock named after it while open. A form restores a draft of its
// own tab, or one whose tab is gone (closed, crashed, killed); never the draft of a tab still open,
// which would let two tabs save the same reading twice.

const TAB_KEY = 'freshet.tab';
const LOCK_PREFIX = 'freshet-tab-';
let id: string | undefined;

/** This tab's id (a UUID), the same across reloads of the tab. */
export function tabId(): string {
  if (id) return id;
  try {
    id = sessionStorage.getItem(TAB_KEY) ?? undefined;
  } catch {
    // No session storage: the id lasts for this page only.
  }
  if (!id) {
    id = crypto.randomUUID();
    try {
      sessionStorage.setItem(TAB_KEY, id);
    } catch {
      // As above.
    }
  }
  // Held until the page goes away; the browser releases it when the tab closes or its process dies.
  navigator.locks?.request(LOCK_PREFIX + id, () => new Promise<void>(() => undefined)).catch(() => undefined);
  return id;
}

/** True when the tab with this id is open now (in this browser profile), other than this one. */
export async function isOtherTabOpen(owner: string): Promise<boolean> {
  if (owner === tabId()) return false;
  if (!navigator.locks?.query) return false;
  const state = await navigator.locks.query();
  return (state.held ?? []).some((l) => l.name === LOCK_PREFIX + owner);
}

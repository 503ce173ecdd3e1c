// Persistent storage: asked for once, on the first save; and the storage state for the About screen.

/** Whether storage is persistent ('unsupported' without the Storage API), and bytes used and available. */
export interface StorageState {
  persisted: boolean | 'unsupported';
  usage_bytes?: number;
  quota_bytes?: number;
}

let asked = false;

function storageManager(): (StorageManager & { persist?: () => Promise<boolean> }) | undefined {
  // Node (tests) before version 21 has no navigator at all; a worker's StorageManager has no persist().
  return typeof navigator !== 'undefined' ? navigator.storage : undefined;
}

/** Asks the browser once per page to keep Freshet's data (never awaited by a save). */
export function requestPersistenceOnce(): void {
  if (asked) return;
  asked = true;
  const storage = storageManager();
  const persist = storage?.persist?.bind(storage);
  if (!storage || !persist || !storage.persisted) return;
  storage
    .persisted()
    .then((already) => (already ? true : persist()))
    .catch(() => false);
}

/** Reads persistence and the usage estimate without asking for anything. */
export async function storageState(): Promise<StorageState> {
  const storage = storageManager();
  if (!storage) return { persisted: 'unsupported' };
  const persisted = storage.persisted ? await storage.persisted().catch(() => false) : 'unsupported';
  const estimate = storage.estimate ? await storage.estimate().catch(() => undefined) : undefined;
  return { persisted, usage_bytes: estimate?.usage, quota_bytes: estimate?.quota };
}

/** Forgets that persistence was asked for (tests only). */
export function resetPersistForTests(): void {
  asked = false;
}

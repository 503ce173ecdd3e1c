// The browser's storage state for the About screen: persistence and the share of the quota in use.

/** Whether storage is persistent, and the estimate of bytes used and available. */
export interface StorageState {
  persisted: boolean | 'unsupported';
  usage_bytes?: number;
  quota_bytes?: number;
}

/** Reads the storage state without asking for anything. */
export async function storageState(): Promise<StorageState> {
  const storage = typeof navigator !== 'undefined' ? navigator.storage : undefined;
  const persisted = storage?.persisted ? await storage.persisted() : 'unsupported';
  const estimate = storage?.estimate ? await storage.estimate() : undefined;
  return { persisted, usage_bytes: estimate?.usage, quota_bytes: estimate?.quota };
}

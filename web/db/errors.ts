// Storage failures as errors the UI can show in words, with a reason code to branch on.
import { RecordValidationError } from '../../core/records/index';

/** Why a storage operation failed. */
export type StorageFailure =
  | 'quota' // the browser's storage for this site is full
  | 'aborted' // the transaction was aborted; nothing of it was written
  | 'blocked' // an older tab keeps the database from opening
  | 'version' // a newer version of the app changed the database: this page must reload
  | 'closed' // the connection was closed and could not be reopened
  | 'not-found' // no record with that id
  | 'stale' // an edit of a record that was changed or deleted since the form opened
  | 'moved' // an edit that would move a reading to another site
  | 'unavailable' // no IndexedDB in this browser (e.g. some private modes)
  | 'unknown';

/** A storage operation that failed and wrote nothing; `message` is a plain sentence for the screen. */
export class StorageError extends Error {
  /** What went wrong, as a code. */
  readonly reason: StorageFailure;

  constructor(reason: StorageFailure, message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'StorageError';
    this.reason = reason;
  }
}

const MESSAGES: Record<StorageFailure, string> = {
  quota: 'The phone has no room left for Freshet’s data, so nothing was saved. Send your records to the office or free some space, then try again.',
  aborted: 'Saving was interrupted and nothing was written. Please try again.',
  blocked: 'Freshet is open in another tab with an older version. Close that tab so this one can open its data.',
  version: 'A newer version of Freshet was opened in another tab. Reload this page to keep working.',
  closed: 'The browser closed Freshet’s data store and it could not be reopened. Reload the page and try again.',
  'not-found': 'That record is not on this phone.',
  stale: 'This reading was changed or deleted in another tab or on another device after you opened it, so your edit was not saved. Open the reading again to see it as it is now.',
  moved: 'A saved reading cannot be moved to another site. Record a new reading at the other site and delete this one instead.',
  unavailable: 'This browser does not let Freshet store data (private browsing may be on).',
  // Also reached by reads, so it says nothing about saving: plainError gives reads their own sentence.
  unknown: 'Freshet’s data store failed for an unexpected reason and nothing was changed. Please try again.',
};

const REASON_BY_NAME: Partial<Record<string, StorageFailure>> = {
  QuotaExceededError: 'quota',
  AbortError: 'aborted',
  VersionError: 'version',
  InvalidStateError: 'closed',
};

/** The plain sentence shown for a failure reason. */
export function storageMessage(reason: StorageFailure): string {
  return MESSAGES[reason];
}

/** Maps anything thrown by IndexedDB to a StorageError; validation errors and StorageErrors pass through. */
export function toStorageError(e: unknown): StorageError | RecordValidationError {
  if (e instanceof StorageError || e instanceof RecordValidationError) return e;
  const name = e instanceof Error || (typeof e === 'object' && e !== null && 'name' in e) ? String((e as { name: unknown }).name) : '';
  const reason = REASON_BY_NAME[name] ?? 'unknown';
  return new StorageError(reason, MESSAGES[reason], { cause: e });
}

// The one module-level connection: opened on first use, closed when a newer version wants the
// database (the page is told to reload), reopened when the browser closed it.
import { deleteDB, openDB, type IDBPDatabase } from 'idb';
import { DB_NAME, DB_VERSION, type FreshetDB } from './schema';
import { upgradeFreshetDb } from './upgrade';
import { StorageError, storageMessage, toStorageError } from './errors';
import { emitDbEvent } from './events';

/** An open Freshet database. */
export type FreshetConnection = IDBPDatabase<FreshetDB>;

let connection: Promise<FreshetConnection> | undefined;
let reloadNeeded = false;

/** Opens (or returns the already open) Freshet database, upgrading it to DB_VERSION when needed. */
export function openFreshetDb(): Promise<FreshetConnection> {
  if (reloadNeeded) return Promise.reject(new StorageError('version', storageMessage('version')));
  if (typeof indexedDB === 'undefined') return Promise.reject(new StorageError('unavailable', storageMessage('unavailable')));
  if (!connection) {
    const opening = open();
    connection = opening;
    opening.catch(() => {
      if (connection === opening) connection = undefined;
    });
  }
  return connection;
}

/** The open database (same as openFreshetDb). */
export const getDb = openFreshetDb;

async function open(): Promise<FreshetConnection> {
  try {
    const db = await openDB<FreshetDB>(DB_NAME, DB_VERSION, {
      upgrade: (database, oldVersion, _newVersion, tx) => upgradeFreshetDb(database, oldVersion, tx),
      blocked: () => emitDbEvent({ type: 'blocked' }),
      blocking: (_current, next, event) => {
        // Close at once so the other tab's upgrade (or delete) is not held up by this page.
        (event.target as IDBDatabase).close();
        forget();
        if (next !== null && next > DB_VERSION) {
          reloadNeeded = true;
          emitDbEvent({ type: 'reload-needed' });
        }
      },
      terminated: () => forget(),
    });
    return db;
  } catch (e) {
    const err = toStorageError(e);
    if (err instanceof StorageError && err.reason === 'version') {
      reloadNeeded = true;
      emitDbEvent({ type: 'reload-needed' });
    }
    throw err;
  }
}

function forget(): void {
  connection = undefined;
}

/**
 * Runs fn with the open database. When the browser had closed the connection (InvalidStateError on
 * starting a transaction, so nothing was written), reopens it and runs fn once more. Anything thrown
 * comes out as a StorageError (or the RecordValidationError fn threw).
 */
export async function withDb<T>(fn: (db: FreshetConnection) => Promise<T>): Promise<T> {
  const db = await openFreshetDb();
  try {
    return await fn(db);
  } catch (e) {
    if (!isClosedConnection(e)) throw toStorageError(e);
    if (connection) {
      const current = await connection.catch(() => undefined);
      if (current === db) forget();
    }
    let again: FreshetConnection;
    try {
      again = await openFreshetDb();
    } catch (openError) {
      throw toStorageError(openError);
    }
    emitDbEvent({ type: 'reopened' });
    try {
      return await fn(again);
    } catch (e2) {
      throw toStorageError(e2);
    }
  }
}

/** Closes the connection and deletes the database, so the next call starts empty (tests and benchmarks only). */
export async function deleteFreshetDbForTests(): Promise<void> {
  const open = connection;
  connection = undefined;
  reloadNeeded = false;
  if (open) (await open.catch(() => undefined))?.close();
  await deleteDB(DB_NAME);
}

/** Closes the connection without deleting anything (tests: to reopen a database written before). */
export async function closeDbForTests(): Promise<void> {
  const open = connection;
  connection = undefined;
  reloadNeeded = false;
  if (open) (await open.catch(() => undefined))?.close();
}

function isClosedConnection(e: unknown): boolean {
  return typeof e === 'object' && e !== null && (e as { name?: unknown }).name === 'InvalidStateError';
}

// Bundle files brought to the office (phones with no network share them as files) stored in the office's
// database as if pushed, under the device "bundle files": each in its own transaction, all or nothing,
// and handed to the phones on their next pull like any other bundle. The photo bytes a file carries
// (checked by their hashes before this) are stored in the same transaction as its records.
import { randomBytes } from 'node:crypto';
import type { BlobBytes, Bundle } from '../../core/index';
import { insertBlob } from './blob-store';
import type { Database, Queryable } from './db';
import { tokenHash } from './devices';
import { IntegrityError, storeBundle } from './store';

/** The device name bundle files are stored under. */
export const FILES_DEVICE = 'bundle files';

/** What became of one file: stored now, already there, or refused with a sentence. */
export type ImportOutcome = { status: 'stored' | 'had'; records: number } | { status: 'refused'; message: string };

/**
 * Stores one checked bundle from a file with its checked photo bytes (keys: hex SHA-256), all in one
 * transaction; refusals of the database (a reused revision or bundle id) come back as 'refused', nothing
 * of the file stored. A bundle the office already has still gets any photo bytes it lacked.
 */
export async function importBundle(db: Database, bundle: Bundle, blobs: ReadonlyMap<string, BlobBytes> = new Map()): Promise<ImportOutcome> {
  // The files device gets a random token nobody is shown: it can never push over HTTP.
  await db.query(
    'insert into office_devices (name, token_hash) values ($1, $2) on conflict (name) do nothing',
    [FILES_DEVICE, tokenHash(randomBytes(32).toString('base64url'))],
  );
  const [{ device_no }] = await db.query<{ device_no: number }>('select device_no from office_devices where name = $1', [FILES_DEVICE]);
  try {
    const storeBlobs = async (tx: Queryable) => {
      for (const [sha256, b] of blobs) await insertBlob(tx, sha256, b.type, b.bytes);
    };
    const out = await storeBundle(db, bundle, Number(device_no), { beforeCommit: storeBlobs });
    // An already stored bundle (pushed by its phone before its photos could follow) commits nothing more.
    if (out.status === 'had' && blobs.size > 0) await db.transaction(storeBlobs);
    return { status: out.status, records: bundle.records.length };
  } catch (err) {
    if (err instanceof IntegrityError) return { status: 'refused', message: err.message };
    throw err;
  }
}

// Photo bytes in the office database (table office_blobs, migration 3): content-addressed by SHA-256, never
// changed once stored, kept beside the records so one backup of the database holds both.
import type { Queryable } from './db';

/** Stores photo bytes under their SHA-256 (hex) unless already held; true when stored now. The caller has checked the hash. */
export async function insertBlob(db: Queryable, sha256: string, type: string, data: Uint8Array): Promise<boolean> {
  const rows = await db.query(
    `insert into office_blobs (sha256, type, bytes, data) values ($1, $2, $3, $4)
     on conflict (sha256) do nothing returning 1 as new`,
    [sha256, type, data.length, data],
  );
  return rows.length > 0;
}

/** The type and size of held photo bytes, or undefined when the office does not hold them. */
export async function blobInfo(db: Queryable, sha256: string): Promise<{ type: string; bytes: number } | undefined> {
  const [row] = await db.query<{ type: string; bytes: number }>('select type, bytes from office_blobs where sha256 = $1', [sha256]);
  return row === undefined ? undefined : { type: row.type, bytes: Number(row.bytes) };
}

/** Held photo bytes and their type, or undefined when the office does not hold them. */
export async function readBlob(db: Queryable, sha256: string): Promise<{ type: string; data: Buffer } | undefined> {
  const [row] = await db.query<{ type: string; data: Uint8Array }>('select type, data from office_blobs where sha256 = $1', [sha256]);
  if (row === undefined) return undefined;
  return { type: row.type, data: Buffer.from(row.data.buffer, row.data.byteOffset, row.data.byteLength) };
}

/** Which of these SHA-256 names (hex) the office holds. */
export async function heldBlobs(db: Queryable, names: readonly string[]): Promise<Set<string>> {
  if (names.length === 0) return new Set();
  const rows = await db.query<{ sha256: string }>('select sha256 from office_blobs where sha256 = any($1::text[])', [[...names]]);
  return new Set(rows.map((r) => r.sha256));
}

// Storing a received bundle (one transaction: all or nothing) and reading bundles back for a pull.
//
// Why the pull cursor is safe against transactions committing out of order: a push takes one
// transaction-level advisory lock (PUSH_LOCK) before it draws its number from office_bundle_seq, and
// PostgreSQL releases that lock only after the commit is visible. So pushes draw numbers and commit one at
// a time, in number order: whenever a reader's snapshot holds bundle N, every bundle below N has already
// committed (or rolled back, leaving a gap no one will ever fill). A pull may then hand out the highest
// number it sees as the cursor without skipping a bundle that commits later with a lower number. The
// price is that pushes are stored one at a time; the expensive parts (reading the body, JSON, checksum,
// record validation) happen before the transaction, and one bundle's inserts are a few statements, so
// the lock is held for milliseconds (see `npm run bench` for the figures). PGlite is one connection and
// runs transactions one at a time anyway; the lock makes a PostgreSQL server behave the same.
import type { Bundle, SyncRecord } from '../../core/index';
import type { Database, Queryable } from './db';
import { winningRecord } from './merge';

/** Advisory lock key held by each push from drawing its number to its commit ("frsh-bnd"). */
const PUSH_LOCK = 0x66726e64;

/** What storing a bundle did: stored it now, or already had this bundle id with the same checksum. */
export type StoreOutcome = { status: 'stored'; seq: number; newVersions: number } | { status: 'had'; seq: number };

/** A refusal found inside the database: the bundle id reused for other content, or a revision reused with another body. */
export class IntegrityError extends Error {
  readonly reason: 'bundle-id-reused' | 'revision-reused';
  constructor(reason: IntegrityError['reason'], message: string) {
    super(message);
    this.name = 'IntegrityError';
    this.reason = reason;
  }
}

/** Options for storing: a hook run inside the transaction just before COMMIT (used by the crash test). */
export interface StoreOptions {
  beforeCommit?: (tx: Queryable) => Promise<void>;
}

interface Clash {
  kind: string;
  id: string;
  rev: string;
}

interface HeldRow {
  kind: string;
  id: string;
  rev: string;
  deleted: boolean;
  body: SyncRecord['body'];
}

/**
 * Stores a parsed bundle pushed by device `deviceNo` in one transaction: the bundle, every record version
 * it brings (a version the office already has with the same body is not doubled) and the current version
 * of each record. Throws IntegrityError, storing nothing, when a revision already stored has another body.
 */
export async function storeBundle(
  db: Database,
  bundle: Bundle,
  deviceNo: number,
  options: StoreOptions = {},
): Promise<StoreOutcome> {
  const document = JSON.stringify(bundle);
  return db.transaction(async (tx) => {
    await tx.query('select pg_advisory_xact_lock($1)', [PUSH_LOCK]);
    const had = await tx.query<{ seq: string; checksum: string }>(
      'select seq::text as seq, checksum from office_bundles where id = $1',
      [bundle.id],
    );
    if (had.length > 0) {
      if (had[0].checksum !== bundle.checksum) {
        throw new IntegrityError(
          'bundle-id-reused',
          `The office already has a different bundle with id ${bundle.id}; a bundle id must never be reused for other records.`,
        );
      }
      return { status: 'had', seq: Number(had[0].seq) };
    }
    // One statement does the rest of the writing (fewer round trips: each costs more than the work on a
    // busy machine): the bundle with its number, every version not already held, the device's last push,
    // any clash with a stored revision, and the current versions of the records the bundle touches. A
    // clash throws below and rolls the whole transaction back, so nothing of the bundle stays.
    // jsonb equality compares values, not key order or spacing, so a re-sent identical record passes.
    // No row locks are needed on current_records: PUSH_LOCK already keeps other pushes out.
    const [written] = await tx.query<{ seq: string; inserted: string; clashes: Clash[] | null; held: HeldRow[] | null }>(
      `with x as materialized (
         select r.kind, r.id, r.rev, coalesce(r.deleted, false) as deleted, r.body
           from jsonb_to_recordset($1::text::jsonb -> 'records') as r(kind text, id uuid, rev text, deleted boolean, body jsonb)),
       b as (
         insert into office_bundles (seq, id, device_no, bundle_device, created, checksum, record_count, document)
         values (nextval('office_bundle_seq'), $2, $3, $4, $5, $6, $7, $1::text)
         returning seq),
       clash as (
         select v.kind, v.id::text as id, v.rev from x
           join record_versions v on v.kind = x.kind and v.id = x.id and v.rev = x.rev
          where v.body <> x.body or v.deleted <> x.deleted
          limit 5),
       ins as (
         insert into record_versions (kind, id, rev, deleted, body, device, bundle_id, received_at, seq)
         select x.kind, x.id, x.rev, x.deleted, x.body, $4, $2, now(), (select seq from b) from x
         on conflict (kind, id, rev) do nothing
         returning 1),
       dev as (
         update office_devices set last_push_at = now(), last_bundle_id = $2, app_device_id = $4
          where device_no = $3 returning 1),
       held as (
         select c.kind, c.id::text as id, c.rev, c.deleted, c.body from current_records c
          where (c.kind, c.id) in (select kind, id from x))
       select (select seq from b)::text as seq,
              (select count(*) from ins)::text as inserted,
              (select json_agg(clash) from clash) as clashes,
              (select json_agg(held) from held) as held,
              (select count(*) from dev) as dev`,
      // The document is sent once: the rows are read out of it by the database (large parameters are
      // the slow part of a query on PGlite).
      [document, bundle.id, deviceNo, bundle.device, bundle.created, bundle.checksum, bundle.records.length],
    );
    const clashes = written.clashes ?? [];
    if (clashes.length > 0) {
      const c = clashes[0];
      throw new IntegrityError(
        'revision-reused',
        `The office already has ${c.kind} ${c.id} revision ${c.rev} with different content; a revision must never be reused for a changed record.` +
          (clashes.length > 1 ? ` (${clashes.length - 1} more like it in this bundle)` : ''),
      );
    }
    const seq = written.seq;
    await updateCurrent(tx, bundle.records, written.held ?? [], seq);
    if (options.beforeCommit) await options.beforeCommit(tx);
    return { status: 'stored', seq: Number(seq), newVersions: Number(written.inserted) };
  });
}

// The current version of each record the bundle touches, chosen by core's merge rule between what the
// office holds (`held`) and every version in the bundle; only winners that differ from the held one are written.
async function updateCurrent(tx: Queryable, records: readonly SyncRecord[], held: readonly HeldRow[], seq: string): Promise<void> {
  const best = new Map<string, SyncRecord>();
  for (const h of held) {
    const rec = { kind: h.kind, id: h.id, rev: h.rev, body: h.body, ...(h.deleted ? { deleted: true } : {}) } as SyncRecord;
    best.set(`${h.kind}/${h.id}`, rec);
  }
  const changed = new Map<string, SyncRecord>();
  for (const r of records) {
    const key = `${r.kind}/${r.id}`;
    const before = best.get(key);
    const winner = before === undefined ? r : winningRecord(before, r);
    if (winner !== before) {
      best.set(key, winner);
      changed.set(key, winner);
    }
  }
  if (changed.size === 0) return;
  // Winners are versions already in record_versions (this bundle's were inserted above): name them by key.
  const keys = [...changed.values()].map((r) => ({ kind: r.kind, id: r.id, rev: r.rev }));
  await tx.query(
    `insert into current_records (kind, id, rev, deleted, body, seq)
     select v.kind, v.id, v.rev, v.deleted, v.body, $2
       from jsonb_to_recordset($1::jsonb) as k(kind text, id uuid, rev text)
       join record_versions v on v.kind = k.kind and v.id = k.id and v.rev = k.rev
     on conflict (kind, id) do update
       set rev = excluded.rev, deleted = excluded.deleted, body = excluded.body, seq = excluded.seq`,
    [JSON.stringify(keys), seq],
  );
}

/** One page of a pull: the bundle documents (JSON text, in cursor order), the next cursor, and whether more wait. */
export interface PullPage {
  documents: string[];
  cursor: number;
  more: boolean;
}

/** Most bundles one pull answers, and the most bytes of bundle text (at least one bundle is always sent). */
export const PULL_MAX_BUNDLES = 200;
/** Most bytes of bundle documents in one pull answer (UTF-16 code units, close to bytes for JSON). */
export const PULL_MAX_CHARS = 8 * 1024 * 1024;

/**
 * Bundles numbered after `after`, oldest first, except those made by the asking phone: a bundle is left
 * out when its own `device` field is `appDevice` (the phone's device id), whatever token pushed it. So a
 * reinstalled phone (a new device id) with a reused token gets everything back; with no `appDevice`
 * every bundle is sent (merging one's own records again changes nothing).
 */
export async function pullBundles(db: Queryable, after: number, appDevice: string | undefined): Promise<PullPage> {
  // One statement is one snapshot: the page and the highest number seen come from the same moment.
  const rows = await db.query<{ seq: string | null; document: string | null; top: string }>(
    `with page as (
       select seq, document from office_bundles
        where seq > $1 and ($2::text is null or bundle_device <> $2::text)
        order by seq limit $3),
     top as (select coalesce(max(seq), 0) as top from office_bundles)
     select p.seq::text as seq, p.document, t.top::text as top
       from top t left join page p on true
      order by p.seq`,
    [after, appDevice ?? null, PULL_MAX_BUNDLES + 1],
  );
  const top = Number(rows[0]?.top ?? 0);
  const documents: string[] = [];
  let chars = 0;
  let cursor = after;
  for (const r of rows) {
    if (r.seq === null || r.document === null) break;
    const full = documents.length === PULL_MAX_BUNDLES || (documents.length > 0 && chars + r.document.length > PULL_MAX_CHARS);
    if (full) return { documents, cursor, more: true };
    documents.push(r.document);
    chars += r.document.length;
    cursor = Number(r.seq);
  }
  // Everything after the cursor was sent: jump past bundles of the asking device too.
  return { documents, cursor: Math.max(cursor, top), more: false };
}

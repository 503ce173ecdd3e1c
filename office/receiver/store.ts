// Storing a received bundle (one transaction: all or nothing) and reading bundles back for a pull.
//
// Why the pull cursor is safe against transactions committing out of order: a push takes one
// transaction-level advisory lock (PUSH_LOCK) before it draws its number from office_bundle_seq, and
// PostgreSQL releases that lock only after the commit is visible. So pushes draw numbers and commit one at
// a time, in number order: whenever a reader's snapshot holds bundle N, every bundle below N has already
// committed (or rolled back, leaving a gap no one will ever fill). A pull may then hand out the highest
// number it sees as the cursor without skipping a bundle that commits later with a lower number. This holds
// across processes too: several receivers on one server share the lock, so one cursor order serves every
// pull from any of them. The price is that pushes are stored one at a time; the expensive parts (reading
// the body, JSON, checksum, record validation) happen before the transaction, a bundle is one set-based
// statement, and on a server one call does the rest in one round trip (Database.onConnection): a function
// of the connection's session reads the document's JSON, takes the lock and stores, and the call's own
// commit ends it, so the lock is held for the milliseconds the server stores (see `npm run bench`).
// PGlite is one connection and runs statements one at a time anyway, so it takes no lock: there the one
// statement is the whole transaction.
import type { Bundle } from '../../core/index';
import type { Database, Queryable } from './db';

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
  const params = [document, bundle.id, deviceNo, bundle.device, bundle.created, bundle.checksum, bundle.records.length];
  const ingest = (q: Queryable) => q.query<Ingested>(INGEST_SQL, params, 'freshet_ingest').then(([row]) => row, refuseReused);
  // PGlite runs one statement at a time, and the statement is all or nothing: it is the transaction, one
  // message to the engine's thread (pglite-thread.ts) rather than three with the engine held between them.
  if (db.engine === 'pglite' && options.beforeCommit === undefined) return outcome(bundle, await ingest(db));
  // On a server one statement calls a function of the connection's own session (INGEST_LOCKED) that reads
  // the document's JSON, then takes the lock, then stores: the lock is held while the server stores, not
  // while it reads JSON or waits on round trips.
  if (db.onConnection !== undefined && options.beforeCommit === undefined) {
    const [row] = await db.onConnection<Ingested>('freshet_ingest_locked', INGEST_LOCKED, CALL_INGEST_LOCKED, params).catch(refuseReused);
    return outcome(bundle, row);
  }
  return db.transaction(async (tx) => {
    // The lock is its own statement: a statement's snapshot is taken when it starts, so everything read
    // below must come after the lock is held (it then sees every push committed before this one). PGlite
    // is one connection that runs one transaction at a time: there the lock would only cost a statement.
    if (db.engine === 'postgres') await tx.query('select pg_advisory_xact_lock($1)', [PUSH_LOCK]);
    const out = outcome(bundle, await ingest(tx));
    if (out.status === 'stored' && options.beforeCommit) await options.beforeCommit(tx);
    return out;
  });
}

/** The ingest statement's one row: the bundle already held (its number and checksum), or what was stored. */
interface Ingested {
  had_seq: string | null;
  had_checksum: string | null;
  seq: string | null;
  inserted: string;
}

/** What storing did, from the statement's row; an IntegrityError when the bundle id was used for other records. */
function outcome(bundle: Bundle, written: Ingested): StoreOutcome {
  if (written.had_seq !== null) {
    if (written.had_checksum !== bundle.checksum) {
      throw new IntegrityError(
        'bundle-id-reused',
        `The office already has a different bundle with id ${bundle.id}; a bundle id must never be reused for other records.`,
      );
    }
    return { status: 'had', seq: Number(written.had_seq) };
  }
  return { status: 'stored', seq: Number(written.seq), newVersions: Number(written.inserted) };
}

// The statement refused the bundle (migration 5's office_refuse_reused_revisions): the versions it names
// in its detail are already stored with other content. Anything else is passed on as it was.
function refuseReused(err: unknown): never {
  const e = err as { code?: unknown; hint?: unknown; detail?: unknown } | null;
  if (e?.code !== 'P0001' || e.hint !== 'freshet: revision reused' || typeof e.detail !== 'string') throw err;
  const clashes = JSON.parse(e.detail) as Clash[];
  const c = clashes[0];
  throw new IntegrityError(
    'revision-reused',
    `The office already has ${c.kind} ${c.id} revision ${c.rev} with different content; a revision must never be reused for a changed record.` +
      (clashes.length > 1 ? ` (${clashes.length - 1} more like it in this bundle)` : ''),
  );
}

// The whole bundle in one set-based statement (one round trip; on a busy machine each costs more than the
// work), prepared once per connection under a name (parsing and planning it cost about a quarter of a
// bundle's time on PGlite); every column is text, as a named statement gives it: $1 the bundle document, $2 its id, $3 the device number, $4 the bundle's device, $5 created,
// $6 checksum, $7 record count.
//  - had: the bundle id already stored; then nothing is written and the caller compares checksums.
//  - x: the bundle's records, read out of the document by the database (the document is sent once; large
//    parameters are the slow part of a query on PGlite).
//  - ins: every version not already held (append-only, unique on kind, id, rev).
//  - clash: among the versions `ins` skipped as already held, one whose stored body differs; the statement
//    then raises (migration 5), which undoes all it wrote, and the caller throws IntegrityError. Only
//    skipped versions are looked up (usually none). jsonb equality compares values, not key order or
//    spacing, so a re-sent identical record passes.
//  - the merge decision is not written: the view current_records (migration 4) takes each record's version
//    with the highest revision, core/sync's `decide` winner rule (the higher revision wins and the same
//    revision is the same record). Revisions are fixed-width ASCII made to sort as strings
//    (core/records/hlc.ts), so they are compared byte by byte (collation "C"), never by the database's
//    language collation.
// Where a bundle's time goes (PGlite, bundles of 100 readings, medians of 150 interleaved runs on a quiet
// machine): the statement took 4.4 ms against 2.25 ms for a bare insert of the same rows into one table
// while it also kept a current table; without it (and with the versions' site index) 3.5 ms against 2.3.
// Of what is left, the document costs about 0.3 ms and the clash check about 0.1 ms. Parsing, checksum and
// validation in Node add about 1.5 ms.
// Every lookup is by primary key, so the cost per bundle does not grow with the database. Every CTE sees
// the snapshot from before the statement, so `clash` never sees this bundle's own versions. No row locks are
// needed: PUSH_LOCK keeps other pushes out until this one commits.
const INGEST_SQL = ingestSql('$1::text::jsonb');

// On a server: the statement above inside a function of the connection's own session (pg_temp: made once on
// each connection, always from this file's text, never shared with another receiver's version). A function
// runs each statement with a fresh snapshot, so the one after the lock sees every push committed before it,
// as a statement of its own would. The document's JSON (about a millisecond for 100 records) is read into
// `parsed` before the lock. The output columns resolve to the tables' columns where names meet.
const INGEST_LOCKED = `create function pg_temp.freshet_ingest_locked(text, uuid, integer, text, text, text, integer)
  returns table (had_seq text, had_checksum text, seq text, inserted text, refused boolean, dev text)
  language plpgsql volatile as $fn$
#variable_conflict use_column
declare
  parsed jsonb := $1::jsonb;
begin
  perform pg_advisory_xact_lock(${PUSH_LOCK});
  return query ${ingestSql('parsed')};
end $fn$`;
const CALL_INGEST_LOCKED = 'select * from pg_temp.freshet_ingest_locked($1, $2, $3, $4, $5, $6, $7)';

/** The ingest statement, reading the bundle's records out of `document` (an SQL expression giving its jsonb). */
function ingestSql(document: string): string {
  return `
with had as (select seq, checksum from office_bundles where id = $2),
x as materialized (
  select r.kind, r.id, r.rev, coalesce(r.deleted, false) as deleted, r.body
    from jsonb_to_recordset(${document} -> 'records') as r(kind text, id uuid, rev text, deleted boolean, body jsonb)
   where not exists (select 1 from had)),
b as (
  insert into office_bundles (seq, id, device_no, bundle_device, created, checksum, record_count, document)
  select nextval('office_bundle_seq'), $2, $3, $4, $5, $6, $7, $1::text
   where not exists (select 1 from had)
  returning seq),
ins as (
  insert into record_versions (kind, id, rev, deleted, body, device, bundle_id, received_at, seq)
  select x.kind, x.id, x.rev, x.deleted, x.body, $4, $2, now(), b.seq from x cross join b
  on conflict (kind, id, rev) do nothing
  returning kind, id, rev),
clash as (
  select v.kind, v.id::text as id, v.rev
    from (select kind, id, rev from x except all select kind, id, rev from ins) held
    join record_versions v using (kind, id, rev)
    join x using (kind, id, rev)
   where v.body <> x.body or v.deleted <> x.deleted
   limit 5),
dev as (
  update office_devices set last_push_at = now(), last_bundle_id = $2, app_device_id = $4
   where device_no = $3 and exists (select 1 from b)
  returning 1)
select (select seq from had)::text as had_seq,
       (select checksum from had) as had_checksum,
       (select seq from b)::text as seq,
       (select count(*) from ins)::text as inserted,
       (select office_refuse_reused_revisions(json_agg(clash)) from clash having count(*) > 0) as refused,
       (select count(*) from dev)::text as dev`;
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

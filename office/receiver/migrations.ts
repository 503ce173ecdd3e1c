// The receiver's schema as numbered migrations, the same SQL for PGlite and a PostgreSQL server. A released
// step is never edited: changes are new steps. Each step runs in its own transaction with its number.
import type { Database } from './db';

/** Advisory lock key that serialises migrations when several processes start on one server ("frsh-mig"). */
const MIGRATION_LOCK = 0x66727368;

/** The migration steps, in order; index + 1 is the step's number. */
export const MIGRATIONS: readonly string[] = [
  `
  create table office_devices (
    device_no serial primary key,
    name text not null unique,
    -- SHA-256 (hex) of the bearer token; the token itself is shown once and never stored.
    token_hash text not null unique,
    created_at timestamptz not null default now(),
    revoked_at timestamptz,
    last_push_at timestamptz,
    last_bundle_id uuid,
    -- The device id the phone writes into its bundles, as last seen.
    app_device_id text
  );
  -- The server's own numbering of received bundles: the pull cursor. See store.ts for why it is safe.
  create sequence office_bundle_seq;
  create table office_bundles (
    seq bigint primary key,
    id uuid not null unique,
    device_no integer not null references office_devices (device_no),
    bundle_device text not null,
    created text not null,
    checksum text not null,
    record_count integer not null,
    -- The bundle exactly as received (re-serialised from its parsed JSON, key order kept), so a pull
    -- hands other phones the same records with a checksum that still holds.
    document text not null,
    received_at timestamptz not null default now()
  );
  create table record_versions (
    kind text not null,
    id uuid not null,
    rev text not null,
    deleted boolean not null,
    body jsonb not null,
    device text not null,
    bundle_id uuid not null references office_bundles (id),
    received_at timestamptz not null,
    seq bigint not null,
    primary key (kind, id, rev)
  );
  create index record_versions_seq on record_versions (seq);
  -- Versions are history: an update or delete is always a mistake, so the database refuses it.
  create function record_versions_append_only() returns trigger language plpgsql as $$
  begin
    raise exception 'record_versions is append-only';
  end $$;
  create trigger record_versions_no_change before update or delete on record_versions
    for each row execute function record_versions_append_only();
  -- The version of each record that wins by core's merge rules (chosen in the receiver, not in SQL).
  create table current_records (
    kind text not null,
    id uuid not null,
    rev text not null,
    deleted boolean not null,
    body jsonb not null,
    seq bigint not null,
    primary key (kind, id)
  );
  create index current_records_site on current_records ((body ->> 'siteId'), kind);
  `,
  // Step 2: cheaper writes per record. The foreign key from each version to its bundle goes: every version
  // is written by the same statement as its bundle (store.ts), so the key could never fail, and checking it
  // cost one lookup per record, about half of storing a bundle on a server. The index of versions by bundle
  // number goes too: nothing reads versions by number (pulls read office_bundles), and every record paid
  // for keeping it. A version's bundle stays findable by bundle_id and seq.
  `
  alter table record_versions drop constraint if exists record_versions_bundle_id_fkey;
  drop index if exists record_versions_seq;
  `,
  // Step 3: photo bytes (office/receiver/blobs.ts), content-addressed by their SHA-256, kept in the same
  // database as the records so one backup holds both. Never changed once stored: the name is the hash.
  `
  create table office_blobs (
    sha256 text primary key check (sha256 ~ '^[0-9a-f]{64}$'),
    type text not null check (type in ('image/jpeg', 'image/png', 'image/webp')),
    bytes integer not null check (bytes between 1 and 16777216),
    data bytea not null,
    received_at timestamptz not null default now()
  );
  `,
  // Step 4: the current version of each record is read from its versions instead of being written a second
  // time. The table kept a copy of every record's winning version, and keeping it (an upsert per record,
  // its key and its site index) was about a third of storing a bundle. The winner is the version with the
  // highest revision (core/sync's rule; revisions compare byte by byte, collation "C", as store.ts
  // explains), which the versions' own key finds: a view of that name keeps every reader unchanged. The
  // versions' site index takes the place of the table's, for the exports by site (current.ts).
  `
  drop table current_records;
  create index record_versions_site on record_versions ((body ->> 'siteId'), kind);
  create view current_records as
    select distinct on (kind, id) kind, id, rev, deleted, body, seq
      from record_versions
     order by kind, id, rev collate "C" desc;
  `,
  // Step 5: a bundle whose revision is already stored with another body is refused by the statement that
  // stores it (store.ts): raising an error undoes everything the statement wrote, so on PGlite a bundle is
  // stored by that one statement alone, with no transaction around it to end from the receiver's side.
  `
  create function office_refuse_reused_revisions(clashes json) returns boolean language plpgsql as $$
  begin
    raise exception 'a revision already stored with other content was sent again'
      using errcode = 'P0001', hint = 'freshet: revision reused', detail = clashes::text;
  end $$;
  `,
  // Step 6: bundle documents (tens of kB of JSON each) are compressed with LZ4 where the server has it:
  // PostgreSQL's own method took about 0.8 ms more per bundle, inside the push lock. Documents stored
  // before keep their method (both read back alike); an engine without LZ4 (PGlite) keeps its own.
  `
  do $$
  begin
    if exists (select 1 from pg_settings where name = 'default_toast_compression' and 'lz4' = any(enumvals)) then
      alter table office_bundles alter column document set compression lz4;
    end if;
  end $$;
  `,
];

/** Brings the database's schema up to step `upTo` (the latest by default); returns the step numbers it applied. */
export async function migrate(db: Database, upTo = MIGRATIONS.length): Promise<number[]> {
  // Under the same lock as the steps: two receivers starting at once on a new server would otherwise both
  // create the table, and one of them fail on the catalogue's unique key.
  await db.transaction(async (tx) => {
    await tx.query('select pg_advisory_xact_lock($1)', [MIGRATION_LOCK]);
    await tx.query(`create table if not exists office_migrations (
      version integer primary key, applied_at timestamptz not null default now())`);
  });
  const applied: number[] = [];
  for (let i = 0; i < Math.min(upTo, MIGRATIONS.length); i++) {
    const version = i + 1;
    const done = await db.transaction(async (tx) => {
      await tx.query('select pg_advisory_xact_lock($1)', [MIGRATION_LOCK]);
      const had = await tx.query('select 1 from office_migrations where version = $1', [version]);
      if (had.length > 0) return false;
      for (const statement of splitStatements(MIGRATIONS[i])) await tx.query(statement);
      await tx.query('insert into office_migrations (version) values ($1)', [version]);
      return true;
    });
    if (done) applied.push(version);
  }
  return applied;
}

// A migration is run statement by statement inside the transaction (one protocol call each), split at
// semicolons that end a line outside a dollar-quoted function body.
function splitStatements(script: string): string[] {
  const out: string[] = [];
  let current = '';
  let inDollar = false;
  for (const line of script.split('\n')) {
    if (/^\s*--/.test(line)) continue;
    current += line + '\n';
    if ((line.match(/\$\$/g) ?? []).length % 2 === 1) inDollar = !inDollar;
    if (!inDollar && /;\s*$/.test(line)) {
      out.push(current.trim().replace(/;$/, ''));
      current = '';
    }
  }
  if (current.trim() !== '') out.push(current.trim());
  return out;
}

// One small database interface over the two engines the receiver runs on: PGlite (PostgreSQL compiled to
// WebAssembly, in a folder) and a PostgreSQL server through `pg`. Everything above this file writes the
// same SQL for both; the only differences handled here are connection handling and the result types.
import { PGlite } from '@electric-sql/pglite';
import { runNamed } from './pglite-named';
import pg from 'pg';

/** One query: positional parameters ($1, $2, …) and rows as plain objects. */
export interface Queryable {
  /**
   * Runs one statement; bigint columns should be cast to text in the SQL (the engines return them
   * differently). With a `name` the statement is prepared once per connection under that name and then
   * only run (no parsing or planning again): give every column as text in the SQL, since a named
   * statement's columns come back as text (or null) on PGlite.
   */
  query<T = Record<string, unknown>>(sql: string, params?: readonly unknown[], name?: string): Promise<T[]>;
}

/** A database the receiver can use: queries, transactions (all or nothing), several statements, close. */
export interface Database extends Queryable {
  /** Which engine: 'pglite' (a folder) or 'postgres' (a server). */
  readonly engine: 'pglite' | 'postgres';
  /** Runs fn in one transaction: committed when it resolves, rolled back when it throws. */
  transaction<T>(fn: (tx: Queryable) => Promise<T>): Promise<T>;
  /** Runs a script of several statements (migrations), with no parameters. */
  exec(sql: string): Promise<void>;
  /** Closes the connection(s); for PGlite, flushes the folder. */
  close(): Promise<void>;
  /**
   * True once this database can answer nothing more and must be opened again (PGlite: its engine was
   * closed or aborted; keep-open.ts then reopens it). Absent for a server, whose pool reconnects itself.
   */
  lost?(): boolean;
}

/** Opens (and on first use creates) a PGlite database in folder `dir`; creating one takes ~10–30 s. */
export async function openPglite(dir: string): Promise<Database> {
  const db = await PGlite.create(dir, { startParams: pgliteStartParams() });
  // An engine that aborted (WebAssembly trap, exit) answers nothing more; closed is PGlite's own flag.
  let aborted = false;
  const watch = (err: unknown): never => {
    const e = err as { name?: unknown; message?: unknown } | null;
    if (e?.name === 'RuntimeError' || e?.name === 'ExitStatus' || /^Aborted\(/.test(String(e?.message))) aborted = true;
    throw err;
  };
  // PGlite runs PostgreSQL in this thread. Queued statements resume one another through promise
  // callbacks, which run before the event loop reads sockets again, so a queue of pushes could keep the
  // HTTP server from reading for many seconds (long enough for its keep-alive timer to drop connections
  // whose next request had already arrived). Yielding to the event loop before each statement lets the
  // server read and answer between statements.
  const prepared = new Set<string>();
  const wrap = (q: { query: PGlite['query'] }, inTransaction: boolean): Queryable => ({
    async query<T>(sql: string, params: readonly unknown[] = [], name?: string) {
      await yieldToEventLoop();
      if (name !== undefined) return runNamed<T>(db, prepared, name, sql, params, inTransaction).catch(watch);
      const r = await q.query<T>(sql, [...params]).catch(watch);
      return r.rows;
    },
  });
  return {
    engine: 'pglite',
    ...wrap(db, false),
    // PGlite is one connection: its transaction() queues every other query and transaction behind this one.
    transaction: async (fn) => {
      await yieldToEventLoop();
      return db.transaction((tx) => fn(wrap(tx, true))).catch(watch);
    },
    async exec(sql) {
      await db.exec(sql).catch(watch);
    },
    close: () => db.close(),
    lost: () => aborted || db.closed || !db.ready,
  };
}

// PGlite's own start parameters (it runs with fsync off: what is written reaches the operating system, which
// keeps it when the receiver's process dies, but not when the machine itself fails), and full-page writes
// off. Those guard against pages torn by a machine failure, which fsync off leaves unguarded anyway, and
// they cost a copy of each page in the log at its first change after every checkpoint: on a growing
// database nearly every index page a bundle touches (`npm run bench`, office-ingest-growth).
function pgliteStartParams(): string[] | undefined {
  const defaults = (PGlite as unknown as { defaultStartParams?: unknown }).defaultStartParams;
  if (!Array.isArray(defaults) || !defaults.every((p) => typeof p === 'string')) return undefined;
  return [...defaults, '-c', 'full_page_writes=off'];
}

function yieldToEventLoop(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}

/** Connects to a PostgreSQL server at `url` (postgres://user@host:port/db) with a small pool. */
export async function openPostgres(url: string, poolSize = 10): Promise<Database> {
  const pool = new pg.Pool({ connectionString: url, max: poolSize });
  // Fail early with the server's own message when the URL is wrong, rather than at the first request.
  const probe = await pool.connect();
  probe.release();
  // A pool's idle client can report an error (server restart); log it rather than crash the process.
  pool.on('error', (err) => console.error(`database connection error: ${err.message}`));
  const wrap = (c: { query: pg.Pool['query'] }): Queryable => ({
    async query<T>(sql: string, params: readonly unknown[] = [], name?: string) {
      // pg prepares a named statement on each connection the first time it runs there.
      const r = await c.query(name === undefined ? sql : { name, text: sql, values: [...params] }, name === undefined ? [...params] : undefined);
      return r.rows as T[];
    },
  });
  return {
    engine: 'postgres',
    ...wrap(pool),
    async transaction(fn) {
      const client = await pool.connect();
      let broken = false;
      // A connection lost while checked out (the server restarted) is reported on the client as an
      // 'error' event as well as by the query under way: without a listener the process would exit.
      const lost = () => {
        broken = true;
      };
      client.on('error', lost);
      try {
        await client.query('begin');
        const out = await fn(wrap(client));
        await client.query('commit');
        return out;
      } catch (err) {
        try {
          await client.query('rollback');
        } catch {
          // The connection itself failed: it must not go back into the pool.
          broken = true;
        }
        throw err;
      } finally {
        client.removeListener('error', lost);
        client.release(broken);
      }
    },
    async exec(sql) {
      await pool.query(sql);
    },
    close: () => pool.end(),
  };
}

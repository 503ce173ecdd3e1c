// The receiver's database interface, one for both engines (db.ts opens a PostgreSQL server behind it,
// pglite-thread.ts the embedded one): statements, transactions, scripts, close. A file of its own, so the
// engines' files import it without importing each other.
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
  /**
   * A server only: runs `sql` with `params` as a statement prepared under `name` on one connection of the
   * pool, after running `setup` there once (say, creating a function of the connection's own session that
   * `sql` calls). One statement and one round trip; on its own it is one transaction. Rows of `sql` come back.
   */
  onConnection?<T>(name: string, setup: string, sql: string, params: readonly unknown[]): Promise<T[]>;
}

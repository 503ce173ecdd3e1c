// One small database interface over the two engines the receiver runs on: PGlite (PostgreSQL compiled to
// WebAssembly, in a folder) and a PostgreSQL server through `pg`. Everything above this file writes the
// same SQL for both; the only differences handled here are connection handling and the result types.
import pg from 'pg';
import type { Database, Queryable } from './database';
import { openPgliteThread } from './pglite-thread';

export type { Database, Queryable } from './database';

/** Opens (and on first use creates) a PGlite database in folder `dir`, in a thread of its own; creating one takes ~10–30 s. */
export function openPglite(dir: string): Promise<Database> {
  return openPgliteThread(dir);
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
  const setUpOn = new WeakMap<pg.PoolClient, Set<string>>();
  return {
    engine: 'postgres',
    ...wrap(pool),
    async onConnection<T>(name: string, setup: string, sql: string, params: readonly unknown[]) {
      return withClient(pool, async (client, broken) => {
        try {
          let names = setUpOn.get(client);
          if (names === undefined) setUpOn.set(client, (names = new Set()));
          if (!names.has(name)) {
            await client.query(setup);
            names.add(name);
          }
          // pg prepares the named statement on this connection the first time it runs here.
          return (await client.query({ name, text: sql, values: [...params] })).rows as T[];
        } catch (err) {
          // No SQLSTATE: the connection itself failed, not a statement.
          if ((err as { code?: unknown }).code === undefined) broken();
          throw err;
        }
      });
    },
    transaction: (fn) => withClient(pool, async (client, broken) => {
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
          broken();
        }
        throw err;
      }
    }),
    async exec(sql) {
      await pool.query(sql);
    },
    close: () => pool.end(),
  };
}

// A pool connection for `use`, given back afterwards; one that failed (`use` calls broken(), or the server
// went away) is dropped rather than put back. A connection lost while checked out is reported on the client
// as an 'error' event as well as by the query under way: without a listener the process would exit.
async function withClient<T>(pool: pg.Pool, use: (client: pg.PoolClient, broken: () => void) => Promise<T>): Promise<T> {
  const client = await pool.connect();
  let isBroken = false;
  const broken = () => {
    isBroken = true;
  };
  client.on('error', broken);
  try {
    return await use(client, broken);
  } finally {
    client.removeListener('error', broken);
    client.release(isBroken);
  }
}

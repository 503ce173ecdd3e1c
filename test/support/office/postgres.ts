// A throwaway database on the PostgreSQL server named by FRESHET_TEST_POSTGRES_URL (set by .ci/run), or a
// printed reason why the server tests do not run here.
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { describe, it } from 'vitest';

/** The server URL for tests, or undefined when none was given. */
export const POSTGRES_URL = process.env.FRESHET_TEST_POSTGRES_URL;

/** Prints why the PostgreSQL tests are skipped (once per file) and returns true when they are. */
export function skipWithoutPostgres(file: string): boolean {
  if (POSTGRES_URL) return false;
  console.log(`${file}: skipped: no PostgreSQL server (set FRESHET_TEST_POSTGRES_URL, as .ci/run does)`);
  return true;
}

/** Creates an empty database on the server; resolves to its URL and a function that drops it. */
export async function throwawayDatabase(prefix: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `${prefix}_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: POSTGRES_URL });
  await admin.connect();
  await admin.query(`create database ${name}`);
  await admin.end();
  const url = new URL(POSTGRES_URL as string);
  url.pathname = `/${name}`;
  return {
    url: url.href,
    drop: async () => {
      const c = new pg.Client({ connectionString: POSTGRES_URL });
      await c.connect();
      await c.query(`drop database if exists ${name} with (force)`);
      await c.end();
    },
  };
}

/**
 * describe() for tests that need the server: when none was given, one skipped test in its place saying why
 * (.ci/run always gives one, so CI runs them all).
 */
export function describeOnPostgres(file: string, title: string, body: () => void): void {
  if (skipWithoutPostgres(file)) {
    describe(title, () => {
      it.skip('needs a PostgreSQL server: set FRESHET_TEST_POSTGRES_URL (.ci/run starts one)', () => {});
    });
    return;
  }
  describe(title, body);
}

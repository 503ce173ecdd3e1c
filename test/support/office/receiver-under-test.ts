// The office receiver as the suites run it in-process, once per engine: the engines (PGlite in a temp
// folder, a throwaway database on the PostgreSQL server), and the receiver started before a suite, emptied
// before each test and closed after the suite. Used by protocol-suite.ts and robustness-suite.ts.
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, it } from 'vitest';
import type { Database } from '../../../office/receiver/db';
import { createReceiver } from '../../../office/receiver/http';
import { openOfficeDatabase } from '../../../office/receiver/open';
import { describeOnPostgres, POSTGRES_URL, throwawayDatabase } from './postgres';

/** How a test file provides its engine: a name, a free port of ours, and a database opener and closer. */
export interface Engine {
  name: string;
  port: number;
  open: () => Promise<Database>;
  /** Removes what open() created (temp folder, test database) after close. */
  dispose?: () => Promise<void>;
}

/** PGlite in a fresh temp folder (named `prefix…`), removed after the suite. */
export function pgliteEngine(port: number, prefix: string): Engine {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return { name: 'PGlite', port, open: () => openOfficeDatabase({ data: dir }), dispose: async () => rmSync(dir, { recursive: true, force: true }) };
}

/**
 * Registers `suite` on a throwaway database (named `prefix_…`) of the PostgreSQL server in
 * FRESHET_TEST_POSTGRES_URL, or, with no server, one skipped test titled `title` that says what it needs.
 */
export function onPostgres(file: string, title: string, port: number, prefix: string, suite: (engine: Engine) => void): void {
  if (!POSTGRES_URL) {
    describeOnPostgres(file, title, () => undefined);
    return;
  }
  let drop: (() => Promise<void>) | undefined;
  suite({
    name: `PostgreSQL (${new URL(POSTGRES_URL as string).host})`,
    port,
    open: async () => {
      const made = await throwawayDatabase(prefix);
      drop = made.drop;
      return openOfficeDatabase({ database: made.url });
    },
    dispose: async () => drop?.(),
  });
}

/** The receiver of a suite: its database, its address, and a row count. */
export interface ReceiverUnderTest {
  readonly db: Database;
  readonly base: string;
  count(table: string): Promise<number>;
}

/**
 * Inside a describe: opens `engine`'s database and a receiver on its port before the suite (allowing
 * `origin`, refusing bundles over `maxBundleBytes`, its log lines to `log`), empties every table before
 * each test, and closes both after the suite.
 */
export function useReceiver(engine: Engine, options: { origin: string; maxBundleBytes: number; log?: (line: string) => void }): ReceiverUnderTest {
  let db: Database | undefined;
  let server: Server;
  beforeAll(async () => {
    db = await engine.open();
    server = createReceiver({ db, origins: [options.origin], maxBundleBytes: options.maxBundleBytes, log: options.log ?? (() => {}) });
    await new Promise<void>((r) => server.listen(engine.port, '127.0.0.1', r));
  }, 120_000);

  afterAll(async () => {
    await new Promise<void>((r) => {
      server.closeAllConnections();
      server.close(() => r());
    });
    await db?.close();
    await engine.dispose?.();
  });

  beforeEach(async () => {
    // TRUNCATE fires no row triggers, so the append-only guard on record_versions does not object.
    await db!.exec('truncate record_versions, office_bundles, office_devices restart identity cascade');
  });

  return {
    get db(): Database {
      if (!db) throw new Error('the receiver is not open: use its db inside a test');
      return db;
    },
    base: `http://127.0.0.1:${engine.port}`,
    async count(table: string): Promise<number> {
      const [r] = await this.db.query<{ n: string }>(`select count(*)::text as n from ${table}`);
      return Number(r.n);
    },
  };
}

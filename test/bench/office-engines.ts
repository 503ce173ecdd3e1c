// The databases the office benchmarks run on: PGlite in a temp folder always, and a PostgreSQL server when
// FRESHET_TEST_POSTGRES_URL names one (`npm run bench` starts a throwaway cluster when PostgreSQL is
// installed); without one, a line says the server figures were skipped and why.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Database } from '../../office/receiver/db';
import { openOfficeDatabase } from '../../office/receiver/open';
import { POSTGRES_URL, throwawayDatabase } from '../support/office/postgres';
import { skipped } from './measure';

/** Runs `fn` on a fresh PGlite folder, then on a fresh database of the PostgreSQL server when one is given. */
export async function onEachEngine(bench: string, fn: (engine: 'PGlite' | 'PostgreSQL', db: Database) => Promise<void>): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'freshet-office-bench-'));
  try {
    const db = await openOfficeDatabase({ data: dir });
    try {
      await fn('PGlite', db);
    } finally {
      await db.close();
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  if (!POSTGRES_URL) {
    skipped(`${bench} on PostgreSQL`, 'no PostgreSQL server: none given in FRESHET_TEST_POSTGRES_URL and none installed under /usr/lib/postgresql to start');
    return;
  }
  const made = await throwawayDatabase('freshet_bench');
  try {
    const db = await openOfficeDatabase({ database: made.url });
    try {
      await fn('PostgreSQL', db);
    } finally {
      await db.close();
    }
  } finally {
    await made.drop();
  }
}

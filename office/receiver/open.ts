// Opening the office database from command-line options: PGlite in the data folder (held with a lock file,
// since one folder must never be open in two processes at once), or a PostgreSQL server by URL. Either
// way the schema is brought up to date before it is used.
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { openPglite, openPostgres, type Database } from './db';
import { migrate } from './migrations';
import { keepOpen } from './keep-open';

/** Where the office keeps its records: a folder for PGlite, or a PostgreSQL server's URL. */
export interface StoreLocation {
  data?: string;
  database?: string;
}

/** A plain-language problem with the options or the folder (shown as one line, exit status 1). */
export class OfficeSetupError extends Error {
  override name = 'OfficeSetupError';
}

/** How long between "still creating" lines while a new embedded database is made, ms. */
const PROGRESS_EVERY_MS = 5000;

/**
 * Opens and migrates the database; the returned close() also releases the folder. `report` (optional)
 * gets plain lines while a new embedded database is created (its first use takes up to a minute).
 */
export async function openOfficeDatabase(where: StoreLocation, report?: (line: string) => void): Promise<Database> {
  if (where.database !== undefined) {
    if (!/^postgres(ql)?:\/\//.test(where.database)) {
      throw new OfficeSetupError(`--database needs a PostgreSQL URL like postgres://user@host:5432/freshet; got ${JSON.stringify(where.database)}`);
    }
    let db: Database;
    try {
      db = await openPostgres(where.database);
    } catch (err) {
      throw new OfficeSetupError(`Could not connect to the PostgreSQL server: ${err instanceof Error ? err.message : String(err)}`);
    }
    await migrate(db);
    return db;
  }
  if (where.data === undefined || where.data === '') {
    throw new OfficeSetupError('Say where the office keeps its records: --data <folder> (embedded database) or --database <postgres URL>');
  }
  const dir = resolve(where.data);
  mkdirSync(dir, { recursive: true });
  const release = lockFolder(dir);
  const firstUse = report !== undefined && !existsSync(join(dir, 'pglite', 'PG_VERSION'));
  const started = Date.now();
  const ticker = firstUse ? setInterval(() => report(`  still creating the office database (${Math.round((Date.now() - started) / 1000)} s so far)…`), PROGRESS_EVERY_MS) : undefined;
  if (firstUse) report(`Creating the office database in ${dir} (first use only; this takes up to a minute)…`);
  try {
    const db = await openPglite(join(dir, 'pglite'));
    await migrate(db);
    if (firstUse) report(`Office database ready (${Math.round((Date.now() - started) / 1000)} s).`);
    return {
      ...db,
      async close() {
        try {
          await db.close();
        } finally {
          release();
        }
      },
    };
  } catch (err) {
    release();
    throw err;
  } finally {
    clearInterval(ticker);
  }
}

/**
 * The database the receiver serves from: as openOfficeDatabase, and an embedded one is opened again
 * whenever its engine stops (keep-open.ts), with progress lines to `log`.
 */
export async function openServingDatabase(where: StoreLocation, log?: (line: string) => void): Promise<Database> {
  const db = await openOfficeDatabase(where);
  if (where.database !== undefined) return db;
  return keepOpen(db, () => openOfficeDatabase(where), { log });
}

// A lock file holding the owner's process id. A lock left by a process that no longer runs (killed) is
// taken over; one held by a live process is refused with a sentence saying what to do.
function lockFolder(dir: string): () => void {
  const file = join(dir, 'in-use.lock');
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = openSync(file, 'wx', 0o600);
      writeSync(fd, String(process.pid));
      closeSync(fd);
      // Only its own lock is removed: after a lost engine let go of the folder, another process may hold it.
      // And only once: a later open in this same process (the receiver reopening) holds a lock of the same
      // process id, which a second close of this one must not remove.
      let released = false;
      return () => {
        if (released) return;
        released = true;
        try {
          if (readFileSync(file, 'utf8').trim() === String(process.pid)) rmSync(file, { force: true });
        } catch {
          // Already gone.
        }
      };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
      const pid = Number(readFileSync(file, 'utf8').trim());
      if (Number.isInteger(pid) && pid > 0 && isAlive(pid)) {
        throw new OfficeSetupError(
          `The office folder ${dir} is in use by process ${pid} (a running receiver?). Stop it first, ` +
            'or keep the records on a PostgreSQL server (--database) to run commands while the receiver runs.',
        );
      }
      rmSync(file, { force: true });
    }
  }
  throw new OfficeSetupError(`Could not take the lock on the office folder ${dir}; try again.`);
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

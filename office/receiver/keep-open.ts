// Keeping the embedded database (PGlite) open while the receiver runs. PGlite runs inside the receiver's
// own process: when its engine stops (closed, aborted) nothing would start it again, and every request
// after would fail. Here the receiver notices (Database.lost), lets go of the data folder, and opens it
// again in rounds of a few tries with growing waits, while every request meanwhile is answered 503 with a
// Retry-After saying when the next try is due. A round that fails ends (nothing spins for ever); the next
// request starts another. A transaction the engine never committed is not in the folder when it is opened
// again (PostgreSQL's own recovery), so a push answered 503 stored nothing, and the phone's second send
// of the same bundle id is stored once (or answered "already received" when the first did commit).
import type { Database, Queryable } from './db';

/** The database is being opened again; the request is answered 503 with this wait. */
export class DatabaseDown extends Error {
  constructor(message: string, readonly retryAfter_s: number) {
    super(message);
    this.name = 'DatabaseDown';
  }
}

/** How the reopening goes: tries per round and the waits before them. */
export interface KeepOpenOptions {
  /** Where progress lines go (the engine lost, each failed try, opened again). */
  log?: (line: string) => void;
  /** Tries per round (default 8). */
  attempts?: number;
  /** Wait before the first try, ms (default 250); each later wait doubles it. */
  firstWait_ms?: number;
  /** Longest wait between tries, ms (default 30,000). */
  maxWait_ms?: number;
}

/** Seconds an open usually takes on an existing folder, added to the Retry-After while reopening. */
const OPEN_ESTIMATE_S = 2;
/** Longest the receiver waits for a lost engine to close before it opens the folder again, ms. */
const CLOSE_LIMIT_MS = 10_000;

/**
 * A Database that opens `reopen()` again whenever the one in use reports it was lost (`lost()`), and
 * refuses with DatabaseDown (and its Retry-After) while it has none. `first` is the one opened at start.
 */
export function keepOpen(first: Database, reopen: () => Promise<Database>, options: KeepOpenOptions = {}): Database {
  const log = options.log ?? ((line: string) => process.stderr.write(line + '\n'));
  const attempts = options.attempts ?? 8;
  const firstWait = options.firstWait_ms ?? 250;
  const maxWait = options.maxWait_ms ?? 30_000;
  let current: Database | null = first;
  let closing: Promise<void> = Promise.resolve();
  let round: Promise<void> | null = null;
  let nextTryAt = 0;
  let opening = false;
  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  let wake: (() => void) | undefined;

  const retryAfter = (): number => {
    const waitS = opening ? 0 : Math.max(0, Math.ceil((nextTryAt - Date.now()) / 1000));
    return Math.min(60, Math.max(1, waitS + OPEN_ESTIMATE_S));
  };
  const down = () => new DatabaseDown('The office database is being opened again after it stopped; nothing was stored.', retryAfter());

  const sleep = (ms: number) => new Promise<void>((resolve) => {
    nextTryAt = Date.now() + ms;
    wake = resolve;
    timer = setTimeout(resolve, ms);
  });

  const runRound = async (): Promise<void> => {
    await closing;
    let wait = firstWait;
    let lastError = '';
    for (let i = 1; i <= attempts && !stopped; i++) {
      await sleep(wait);
      if (stopped) return;
      opening = true;
      try {
        const db = await reopen();
        if (stopped) {
          await db.close();
          return;
        }
        current = db;
        log(`The office database is open again (try ${i} of ${attempts}).`);
        return;
      } catch (err) {
        lastError = err instanceof Error ? err.message : String(err);
        log(`Opening the office database again failed (try ${i} of ${attempts}): ${lastError}`);
      } finally {
        opening = false;
      }
      wait = Math.min(maxWait, wait * 2);
    }
    if (!stopped) log(`The office database could not be opened again after ${attempts} tries (${lastError}); the next request tries again.`);
  };

  const startRound = () => {
    if (round !== null || stopped) return;
    round = runRound().finally(() => {
      round = null;
    });
  };

  const lose = (db: Database, err: unknown) => {
    if (current !== db) return;
    current = null;
    log(`The office database stopped answering (${err instanceof Error ? err.message : String(err)}); answering 503 while it is opened again.`);
    // Its close lets go of the data folder, which the reopening takes again.
    closing = Promise.race([
      db.close().catch(() => {}),
      new Promise<void>((resolve) => setTimeout(resolve, CLOSE_LIMIT_MS).unref()),
    ]);
    startRound();
  };

  async function use<T>(fn: (db: Database) => Promise<T>): Promise<T> {
    const db = current;
    if (db === null) {
      startRound();
      throw down();
    }
    try {
      return await fn(db);
    } catch (err) {
      if (!db.lost?.()) throw err;
      lose(db, err);
      throw down();
    }
  }

  return {
    engine: first.engine,
    lost: () => current === null,
    query: <T>(sql: string, params?: readonly unknown[], name?: string) => use((db) => db.query<T>(sql, params, name)),
    transaction: <T>(fn: (tx: Queryable) => Promise<T>) => use((db) => db.transaction(fn)),
    exec: (sql: string) => use((db) => db.exec(sql)),
    async close() {
      stopped = true;
      clearTimeout(timer);
      wake?.();
      await round;
      await closing;
      const db = current;
      current = null;
      if (db !== null) await db.close();
    },
  };
}

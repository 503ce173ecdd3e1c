// The embedded database's own thread: PGlite (PostgreSQL compiled to WebAssembly) opened on one folder,
// answering the messages of pglite-thread.ts. PostgreSQL's work then runs beside the receiver's HTTP
// side (reading bodies, JSON, checksums, record checks) instead of taking turns with it on one thread.
// Statements run one at a time, as PGlite runs them; a transaction holds the engine from `begin` to `end`
// and every other statement waits for it (PGlite's own queue), as before.
import { parentPort, workerData } from 'node:worker_threads';
import { PGlite, type Transaction } from '@electric-sql/pglite';
import { runNamed } from './pglite-named';
import type { EngineReply, EngineRequest } from './pglite-thread';

const port = parentPort ?? notAWorker();

function notAWorker(): never {
  throw new Error('pglite-engine.ts runs as a worker thread (pglite-thread.ts starts it)');
}
const { dir } = workerData as { dir: string };

// PGlite's own start parameters (it runs with fsync off: what is written reaches the operating system, which
// keeps it when the receiver's process dies, but not when the machine itself fails), and full-page writes
// off. Those guard against pages torn by a machine failure, which fsync off leaves unguarded anyway, and
// they cost a copy of each page in the log at its first change after every checkpoint: on a growing
// database nearly every index page a bundle touches (`npm run bench`, office-ingest-growth).
function startParams(): string[] | undefined {
  const defaults = (PGlite as unknown as { defaultStartParams?: unknown }).defaultStartParams;
  if (!Array.isArray(defaults) || !defaults.every((p) => typeof p === 'string')) return undefined;
  return [...defaults, '-c', 'full_page_writes=off'];
}

/** An engine that aborted (WebAssembly trap, exit) answers nothing more. */
function isAbort(err: unknown): boolean {
  const e = err as { name?: unknown; message?: unknown } | null;
  return e?.name === 'RuntimeError' || e?.name === 'ExitStatus' || /^Aborted\(/.test(String(e?.message));
}

/** An error as plain data for the other thread: its name, message and the database's own fields (code …). */
function plain(err: unknown): Record<string, unknown> {
  if (!(err instanceof Error)) return { name: 'Error', message: String(err) };
  const out: Record<string, unknown> = { name: err.name, message: err.message };
  for (const [k, v] of Object.entries(err)) if (v === null || ['string', 'number', 'boolean'].includes(typeof v)) out[k] = v;
  return out;
}

interface OpenTransaction {
  tx: Transaction;
  /** Ends it: commit (true) or roll back (false). */
  decide: (commit: boolean) => void;
  /** Set by `end`: told how the transaction ended. */
  told?: (err: unknown) => void;
}

/** Thrown inside a transaction to roll it back. */
const ROLLBACK = Symbol('rollback');

function serve(db: PGlite): void {
  const prepared = new Set<string>();
  const open = new Map<number, OpenTransaction>();
  let nextTx = 1;
  let aborted = false;
  const reply = (r: EngineReply) => port.postMessage(r);
  const done = (id: number) => (value: unknown) => reply({ id, ok: true, value });
  const fail = (id: number) => (err: unknown) => {
    if (isAbort(err)) aborted = true;
    reply({ id, ok: false, error: plain(err), lost: aborted || db.closed });
  };

  // One thing at a time on the engine, in arrival order: a statement, a script, or a transaction from its
  // begin to its end. PGlite's named statements (pglite-named.ts) take only its query lock, not its
  // transaction lock, so without this a statement sent alone could run inside another caller's open
  // transaction and be undone with it. A transaction's own statements (tx given) run inside its turn.
  let turn: Promise<unknown> = Promise.resolve();
  const exclusive = <T>(work: () => Promise<T>): Promise<T> => {
    const mine = turn.then(work, work);
    turn = mine.then(() => undefined, () => undefined);
    return mine;
  };

  const query = async (m: Extract<EngineRequest, { op: 'query' }>): Promise<unknown[]> => {
    const t = m.tx === undefined ? undefined : open.get(m.tx);
    if (m.tx !== undefined && t === undefined) throw new Error(`no open transaction ${m.tx}`);
    if (m.name !== undefined) return runNamed(db, prepared, m.name, m.sql, m.params, t !== undefined);
    return (await (t?.tx ?? db).query(m.sql, [...m.params])).rows;
  };

  // A transaction stays open between messages: its callback waits for `end` to say commit or roll back.
  const begin = (id: number): Promise<void> => {
    const txNo = nextTx++;
    let decide: (commit: boolean) => void = () => {};
    const decided = new Promise<boolean>((resolve) => (decide = resolve));
    let begun = false;
    return db.transaction(async (tx) => {
      begun = true;
      open.set(txNo, { tx, decide });
      done(id)(txNo);
      if (!(await decided)) throw ROLLBACK;
    }).then(
      () => open.get(txNo)?.told?.(null),
      (err: unknown) => {
        if (!begun) fail(id)(err);
        else open.get(txNo)?.told?.(err === ROLLBACK ? null : err);
      },
    ).finally(() => open.delete(txNo));
  };

  port.on('message', (m: EngineRequest) => {
    switch (m.op) {
      case 'query':
        (m.tx === undefined ? exclusive(() => query(m)) : query(m)).then(done(m.id), fail(m.id));
        return;
      case 'exec':
        exclusive(() => db.exec(m.sql)).then(() => done(m.id)(null), fail(m.id));
        return;
      case 'begin':
        void exclusive(() => begin(m.id));
        return;
      case 'end': {
        const t = open.get(m.tx);
        if (t === undefined) {
          fail(m.id)(new Error(`no open transaction ${m.tx}`));
          return;
        }
        t.told = (err) => (err === null ? done(m.id)(null) : fail(m.id)(err));
        t.decide(m.commit);
        return;
      }
      case 'close':
        exclusive(() => db.close()).then(() => done(m.id)(null), fail(m.id));
        return;
    }
  });
}

PGlite.create(dir, { startParams: startParams() }).then(
  (db) => {
    serve(db);
    port.postMessage({ id: 0, ok: true, value: null } satisfies EngineReply);
  },
  (err: unknown) => port.postMessage({ id: 0, ok: false, error: plain(err), lost: true } satisfies EngineReply),
);

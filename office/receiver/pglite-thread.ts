// The embedded database (PGlite) in a thread of its own (pglite-engine.ts), behind the receiver's Database
// interface. PGlite runs PostgreSQL as WebAssembly in whichever thread opens it; in the receiver's own
// thread every statement took turns with reading requests, parsing JSON and checking records. In its own
// thread the two run side by side on a machine with two cores or more (`npm run bench`: the receiver's
// ms per bundle on PGlite). Statements and transactions travel as messages; a transaction holds the engine
// from its begin to its end, so every other statement waits for it, as PGlite has always run them.
import type { Database, Queryable } from './database';
import { startTsWorker } from './ts-worker';

/** Longest close() waits for the engine to close itself before stopping its thread, ms. */
const CLOSE_WAIT_MS = 10_000;

/** What the receiver asks of the engine's thread (id pairs a reply with its request; 0 is the opening). */
export type EngineRequest =
  | { id: number; op: 'query'; sql: string; params: unknown[]; name?: string; tx?: number }
  | { id: number; op: 'exec'; sql: string }
  | { id: number; op: 'begin' }
  | { id: number; op: 'end'; tx: number; commit: boolean }
  | { id: number; op: 'close' };

/** A request before it is given its id. */
type Ask = EngineRequest extends infer R ? (R extends EngineRequest ? Omit<R, 'id'> : never) : never;

/** The engine's answer: a value, or an error as plain data and whether the engine can answer any more. */
export type EngineReply =
  | { id: number; ok: true; value: unknown }
  | { id: number; ok: false; error: Record<string, unknown>; lost: boolean };

/** The engine's error again as an Error, with the database's fields (code, detail …) as they were. */
function revive(data: Record<string, unknown>): Error {
  const err = new Error(String(data.message ?? 'the embedded database failed'));
  Object.assign(err, data);
  return err;
}

/** Opens (and on first use creates) a PGlite database in folder `dir`, in a thread of its own. */
export async function openPgliteThread(dir: string): Promise<Database> {
  const worker = startTsWorker(new URL('./pglite-engine.ts', import.meta.url), { dir });
  const waiting = new Map<number, { resolve: (v: unknown) => void; reject: (e: Error) => void }>();
  let nextId = 1;
  let lost = false;
  let closed = false;
  let closing: Promise<void> | undefined;
  const stop = (why: Error) => {
    lost = true;
    for (const w of waiting.values()) w.reject(why);
    waiting.clear();
    hold();
  };
  worker.on('message', (r: EngineReply) => {
    const w = waiting.get(r.id);
    if (w === undefined) return;
    waiting.delete(r.id);
    hold();
    if (r.ok) w.resolve(r.value);
    else {
      if (r.lost) lost = true;
      w.reject(revive(r.error));
    }
  });
  worker.on('error', (err) => stop(err));
  worker.on('exit', (code) => stop(new Error(`the embedded database's thread stopped (exit ${code})`)));
  // The thread keeps the process alive only while a request waits for its answer, as the engine did in the
  // receiver's own thread: an idle open database never holds a finished command open.
  const hold = () => (waiting.size > 0 ? worker.ref() : worker.unref());

  const call = (request: Ask): Promise<unknown> => {
    if (lost || closed) return Promise.reject(new Error('The embedded database is closed.'));
    const id = nextId++;
    return new Promise((resolve, reject) => {
      waiting.set(id, { resolve, reject });
      hold();
      worker.postMessage({ ...request, id });
    });
  };
  // The opening's answer (id 0) comes unasked.
  const opened = new Promise<unknown>((resolve, reject) => waiting.set(0, { resolve, reject }));
  try {
    await opened;
  } catch (err) {
    await worker.terminate();
    throw err;
  }

  const on = (tx?: number): Queryable => ({
    async query<T>(sql: string, params: readonly unknown[] = [], name?: string) {
      return (await call({ op: 'query', sql, params: [...params], name, tx })) as T[];
    },
  });
  return {
    engine: 'pglite',
    ...on(),
    async transaction(fn) {
      const tx = (await call({ op: 'begin' })) as number;
      let out;
      try {
        out = await fn(on(tx));
      } catch (err) {
        await call({ op: 'end', tx, commit: false }).catch(() => {});
        throw err;
      }
      await call({ op: 'end', tx, commit: true });
      return out;
    },
    async exec(sql) {
      await call({ op: 'exec', sql });
    },
    // One close, however many callers ask (the receiver's reopening asks again while the first is under
    // way): each waits for the engine to be closed and its thread gone, so the folder is free after it.
    close() {
      closing ??= (async () => {
        try {
          // The engine closes after whatever holds it; an engine that no longer answers is stopped anyway.
          if (!lost) await Promise.race([call({ op: 'close' }), new Promise((resolve) => setTimeout(resolve, CLOSE_WAIT_MS).unref())]);
        } finally {
          closed = true;
          await worker.terminate();
        }
      })();
      return closing;
    },
    lost: () => lost || closed,
  };
}

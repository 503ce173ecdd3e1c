// The simulated phones of the receiver benchmark (office-receiver.node.ts), in a thread of their own: phones
// are other devices, so making and sending their bundles must not take the receiver's thread (on PGlite
// that thread also runs the database). Each phone makes its bundles before the start signal; on it, all
// phones push at once, each one bundle after another, and the thread posts back every push's latency and
// status.
import { performance } from 'node:perf_hooks';
import { parentPort, workerData } from 'node:worker_threads';
import { bundleOf, push, readingRecords } from '../support/office/phones';

/** What the phones' thread is given. */
export interface PhonesWork {
  base: string;
  tokens: string[];
  bundlesPerPhone: number;
  readingsPerBundle: number;
}

/** What it posts back when every push has been answered. */
export interface PhonesResult {
  latencies: number[];
  statuses: [number, number][];
}

const work = workerData as PhonesWork;
const port = parentPort;
if (port === null) throw new Error('office-phones-worker.ts runs as a worker thread of the receiver benchmark');
const bundles = work.tokens.map((_, p) =>
  Array.from({ length: work.bundlesPerPhone }, (_, k) =>
    bundleOf(`bench-${p}`, readingRecords(`bench-${p}`, work.readingsPerBundle, (p * work.bundlesPerPhone + k) * work.readingsPerBundle))));
port.once('message', () => {
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  void Promise.all(bundles.map(async (mine, p) => {
    for (const b of mine) {
      const s = performance.now();
      const { status } = await push(work.base, work.tokens[p], b);
      latencies.push(performance.now() - s);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    }
  })).then(() => port.postMessage({ latencies, statuses: [...statuses] } satisfies PhonesResult));
});
port.postMessage('ready');

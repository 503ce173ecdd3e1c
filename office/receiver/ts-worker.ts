// A worker thread running one of the project's TypeScript files. A worker loads its entry file before
// any loader hook of its own, so it first registers tsx (a dependency, as bin/freshet.mjs does in the main
// thread) and then imports the file. tsx's exports map gives `tsx/esm/api` as index.cjs for require and
// index.mjs, beside it, for import; the worker imports the ES module one.
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/** Starts a worker thread on the TypeScript file `entry` with `workerData`. */
export function startTsWorker(entry: URL, workerData: unknown): Worker {
  const tsx = pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
  const boot = `import(${JSON.stringify(tsx)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry.href)}); })`;
  return new Worker(boot, { eval: true, workerData });
}

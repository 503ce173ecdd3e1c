// The office receiver under load: 50 simulated phones each push 20 bundles of 100 readings at the same
// time to a receiver on 127.0.0.1 (PGlite in a temp folder, and a PostgreSQL server when one can be had:
// office-engines.ts). The phones run in a thread of their own (office-phones-worker.ts), as other devices
// would: their work is not counted against the receiver's thread. Checks every record is stored exactly
// once, then prints ms per bundle (wall time of the whole load / bundles) beside its floor measured in the
// same run: the same kind of bundles' rows inserted directly, one statement (its own transaction) per
// bundle, with no HTTP, checks or merge (half before the load, half after, so a machine whose load drifts
// weighs on both alike); and the p95 push latency.
import { performance } from 'node:perf_hooks';
import type { Bundle } from '../../core/index';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { createReceiver } from '../../office/receiver/http';
import { startTsWorker } from '../../office/receiver/ts-worker';
import { bundleOf, readingRecords } from '../support/office/phones';
import type { PhonesResult, PhonesWork } from './office-phones-worker';
import { figure, sig3 } from './measure';
import { onEachEngine } from './office-engines';

const PHONES = 50;
const BUNDLES_PER_PHONE = 20;
const READINGS_PER_BUNDLE = 100;
const PORT = 4590;

// The floor's bundles: the same shape as the phones' (another phone, readings of their own).
function floorBundles(n: number): Bundle[] {
  return Array.from({ length: n }, (_, k) => bundleOf('bench-floor', readingRecords('bench-floor', READINGS_PER_BUNDLE, k * READINGS_PER_BUNDLE)));
}

// Starts the phones' thread; resolves once every phone has made its bundles, to a function that starts the
// pushes and resolves when all are answered.
async function startPhones(work: PhonesWork): Promise<() => Promise<PhonesResult>> {
  const worker = startTsWorker(new URL('./office-phones-worker.ts', import.meta.url), work);
  const failed = new Promise<never>((_, reject) => {
    worker.once('error', reject);
    worker.once('exit', (code) => reject(new Error(`the benchmark's phones thread stopped (exit ${code})`)));
  });
  const next = () => Promise.race([new Promise<unknown>((r) => worker.once('message', r)), failed]);
  await next();
  return async () => {
    const done = next();
    worker.postMessage('go');
    const result = (await done) as PhonesResult;
    await worker.terminate();
    return result;
  };
}

// The floor: each bundle's rows written by one insert statement, its own transaction, one bundle after another.
async function bareInsertMs(db: Database, bundles: Bundle[]): Promise<number> {
  await db.exec('create table bench_floor (kind text, id uuid, rev text, deleted boolean, body jsonb, primary key (kind, id, rev))');
  const t0 = performance.now();
  for (const b of bundles) {
    const rows = JSON.stringify(b.records.map((r) => ({ kind: r.kind, id: r.id, rev: r.rev, deleted: false, body: r.body })));
    // One statement on its own is one transaction: the plainest way, one round trip to the engine.
    await db.query(
      `insert into bench_floor select * from jsonb_to_recordset($1::jsonb) as x(kind text, id uuid, rev text, deleted boolean, body jsonb)`,
      [rows],
    );
  }
  const ms = performance.now() - t0;
  await db.exec('drop table bench_floor');
  return ms;
}

async function run(engine: string, db: Database): Promise<void> {
  const tokens: string[] = [];
  for (let p = 0; p < PHONES; p++) tokens.push(await createDevice(db, `bench phone ${p}`));
  const floorSet = floorBundles(200);
  const floorBeforeMs = await bareInsertMs(db, floorSet.slice(0, 100));
  const server = createReceiver({ db, origins: [], log: () => {} });
  await new Promise<void>((r) => server.listen(PORT, '127.0.0.1', r));
  const base = `http://127.0.0.1:${PORT}`;
  let latencies: number[] = [];
  let statuses = new Map<number, number>();
  let t0 = performance.now();
  try {
    const go = await startPhones({ base, tokens, bundlesPerPhone: BUNDLES_PER_PHONE, readingsPerBundle: READINGS_PER_BUNDLE });
    t0 = performance.now();
    const result = await go();
    latencies = result.latencies;
    statuses = new Map(result.statuses);
  } finally {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  }
  const totalMs = performance.now() - t0;
  const floorMs = (floorBeforeMs + (await bareInsertMs(db, floorSet.slice(100)))) / floorSet.length;
  const [stored] = await db.query<{ n: string; ids: string; cur: string }>(
    `select count(*)::text as n, count(distinct id)::text as ids, (select count(*) from current_records)::text as cur from record_versions`);
  const expected = PHONES * BUNDLES_PER_PHONE * READINGS_PER_BUNDLE;
  const exactlyOnce = Number(stored.n) === expected && Number(stored.ids) === expected && Number(stored.cur) === expected &&
    statuses.get(201) === PHONES * BUNDLES_PER_PHONE;
  latencies.sort((a, b) => a - b);
  const p95 = latencies[Math.min(latencies.length - 1, Math.ceil(0.95 * latencies.length) - 1)];
  const bundles = PHONES * BUNDLES_PER_PHONE;
  figure({
    name: `office-receiver-50x20x100-${engine === 'PGlite' ? 'pglite' : 'postgresql'}`,
    value: totalMs / bundles,
    unit: 'ms per bundle',
    floor: floorMs,
    floor_is: 'bare insert of a bundle\'s 100 rows, one statement (its own transaction) per bundle, no HTTP, checks or merge',
    target: 'ratio <= 2.0, p95 < 500 ms',
    engine,
    p95_ms: sig3(p95),
    median_ms: sig3(latencies[Math.floor(latencies.length / 2)]),
    bundles_per_s: sig3(bundles / (totalMs / 1000)),
    every_record_once: exactlyOnce,
    answers: Object.fromEntries(statuses),
  });
  if (!exactlyOnce) throw new Error(`office receiver benchmark on ${engine}: records were not stored exactly once`);
}

/** Runs the receiver benchmark on PGlite, then on PostgreSQL when a server can be had. */
export default async function officeReceiverBench(): Promise<void> {
  await onEachEngine('office-receiver-50x20x100', run);
}

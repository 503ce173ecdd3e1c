// The office receiver under load: 50 simulated phones each push 20 bundles of 100 readings at the same
// time to a receiver on 127.0.0.1 (PGlite in a temp folder, and a PostgreSQL server when
// FRESHET_TEST_POSTGRES_URL names one). Checks every record is stored exactly once, then prints bundles
// per second and the p95 push latency, beside a baseline measured in the same run: the same bundles'
// rows inserted directly, one transaction per bundle, with no HTTP, checks or merge.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { Bundle } from '../../core/index';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { createReceiver } from '../../office/receiver/http';
import { openOfficeDatabase } from '../../office/receiver/open';
import { bundleOf, push, readingRecords } from '../support/office/phones';
import { POSTGRES_URL, throwawayDatabase } from '../support/office/postgres';
import { emit, sig3 } from './measure';

const PHONES = 50;
const BUNDLES_PER_PHONE = 20;
const READINGS_PER_BUNDLE = 100;
const PORT = 4590;

function phoneBundles(): Bundle[][] {
  return Array.from({ length: PHONES }, (_, p) =>
    Array.from({ length: BUNDLES_PER_PHONE }, (_, k) =>
      bundleOf(`bench-${p}`, readingRecords(`bench-${p}`, READINGS_PER_BUNDLE, (p * BUNDLES_PER_PHONE + k) * READINGS_PER_BUNDLE))));
}

// The floor: each bundle's rows written by one insert in its own transaction, one bundle after another.
async function bareInsertMs(db: Database, bundles: Bundle[]): Promise<number> {
  await db.exec('create temporary table bench_floor (kind text, id uuid, rev text, deleted boolean, body jsonb, primary key (kind, id, rev))');
  const t0 = performance.now();
  for (const b of bundles) {
    const rows = JSON.stringify(b.records.map((r) => ({ kind: r.kind, id: r.id, rev: r.rev, deleted: false, body: r.body })));
    await db.transaction((tx) => tx.query(
      `insert into bench_floor select * from jsonb_to_recordset($1::jsonb) as x(kind text, id uuid, rev text, deleted boolean, body jsonb)`,
      [rows],
    ));
  }
  const ms = performance.now() - t0;
  await db.exec('drop table bench_floor');
  return ms;
}

async function run(engine: string, db: Database): Promise<void> {
  const tokens: string[] = [];
  for (let p = 0; p < PHONES; p++) tokens.push(await createDevice(db, `bench phone ${p}`));
  const work = phoneBundles();
  const floorBundles = phoneBundles().flat().slice(0, 100);
  const floorMs = (await bareInsertMs(db, floorBundles)) / floorBundles.length;
  const server = createReceiver({ db, origins: [], log: () => {} });
  await new Promise<void>((r) => server.listen(PORT, '127.0.0.1', r));
  const base = `http://127.0.0.1:${PORT}`;
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  const t0 = performance.now();
  try {
    await Promise.all(work.map(async (bundles, p) => {
      for (const b of bundles) {
        const s = performance.now();
        const { status } = await push(base, tokens[p], b);
        latencies.push(performance.now() - s);
        statuses.set(status, (statuses.get(status) ?? 0) + 1);
      }
    }));
  } finally {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  }
  const totalMs = performance.now() - t0;
  const [stored] = await db.query<{ n: string; ids: string; cur: string }>(
    `select count(*)::text as n, count(distinct id)::text as ids, (select count(*) from current_records)::text as cur from record_versions`);
  const expected = PHONES * BUNDLES_PER_PHONE * READINGS_PER_BUNDLE;
  const exactlyOnce = Number(stored.n) === expected && Number(stored.ids) === expected && Number(stored.cur) === expected &&
    statuses.get(201) === PHONES * BUNDLES_PER_PHONE;
  latencies.sort((a, b) => a - b);
  const p95 = latencies[Math.min(latencies.length - 1, Math.ceil(0.95 * latencies.length) - 1)];
  const bundlesPerS = (PHONES * BUNDLES_PER_PHONE) / (totalMs / 1000);
  emit({
    bench: 'office receiver: 50 phones × 20 bundles × 100 readings, concurrent pushes',
    engine,
    bundles_per_s: sig3(bundlesPerS),
    p95_ms: sig3(p95),
    median_ms: sig3(latencies[Math.floor(latencies.length / 2)]),
    total_s: sig3(totalMs / 1000),
    every_record_once: exactlyOnce,
    records_stored: Number(stored.n),
    answers: Object.fromEntries(statuses),
    baseline_bare_insert_ms_per_bundle: sig3(floorMs),
    ratio_receiver_ms_per_bundle_to_baseline: sig3(totalMs / (PHONES * BUNDLES_PER_PHONE) / floorMs),
  });
  if (!exactlyOnce) throw new Error(`office receiver benchmark on ${engine}: records were not stored exactly once`);
}

/** Runs the receiver benchmark on PGlite, then on PostgreSQL when a server is named. */
export default async function officeReceiverBench(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'freshet-office-bench-'));
  try {
    const db = await openOfficeDatabase({ data: dir });
    try {
      await run('PGlite', db);
    } finally {
      await db.close();
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  if (!POSTGRES_URL) {
    emit({ bench: 'office receiver on PostgreSQL', skipped: 'no server: set FRESHET_TEST_POSTGRES_URL (as .ci/run does)' });
    return;
  }
  const made = await throwawayDatabase('freshet_bench');
  try {
    const db = await openOfficeDatabase({ database: made.url });
    try {
      await run('PostgreSQL', db);
    } finally {
      await db.close();
    }
  } finally {
    await made.drop();
  }
}

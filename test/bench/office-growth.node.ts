// The office database growing: 1,000,000 readings stored through the receiver's ingest (storeBundle, one
// transaction per bundle of 500, no HTTP) into an empty database, on PGlite and on PostgreSQL when one can
// be had. Two figures, each with its floor from the same run:
//  - ingest: ms per bundle over the last tenth of the bundles / over the first tenth (flat is 1);
//  - pull: a page of bundles read at the end of the full database / the same size of page at its start.
// FRESHET_BENCH_GROWTH_READINGS sets a smaller total for a quick look (the line says how many were stored).
import { performance } from 'node:perf_hooks';
import type { Database } from '../../office/receiver/db';
import { createDevice } from '../../office/receiver/devices';
import { pullBundles, storeBundle } from '../../office/receiver/store';
import { bundleOf, readingRecords } from '../support/office/phones';
import { figure, median, sig3 } from './measure';
import { onEachEngine } from './office-engines';

const READINGS = Number(process.env.FRESHET_BENCH_GROWTH_READINGS ?? 1_000_000);
const PER_BUNDLE = 500;
const PULL_ROUNDS = 9;
const WARMUP = 4;

function mean(xs: readonly number[]): number {
  return xs.reduce((a, b) => a + b, 0) / xs.length;
}

async function deviceNo(db: Database, name: string): Promise<number> {
  await createDevice(db, name);
  const [d] = await db.query<{ device_no: number }>('select device_no from office_devices where name = $1', [name]);
  return Number(d.device_no);
}

async function run(engine: 'PGlite' | 'PostgreSQL', db: Database): Promise<void> {
  const phone = await deviceNo(db, 'growth phone');
  // Pulls ask as a phone that made none of these bundles (pull leaves out only the asking phone's own).
  const reader = 'growth-reader-phone';
  const bundles = Math.max(10, Math.round(READINGS / PER_BUNDLE));
  const ms: number[] = [];
  // The first WARMUP bundles are stored untimed (the code paths compile), then `bundles` more are timed.
  for (let k = -WARMUP; k < bundles; k++) {
    // Made one at a time, so the benchmark's own memory stays small; only the store is timed.
    const phoneId = `grow-${(k + WARMUP) % 50}`;
    const b = bundleOf(phoneId, readingRecords(phoneId, PER_BUNDLE, (k + WARMUP) * PER_BUNDLE));
    const t0 = performance.now();
    const out = await storeBundle(db, b, phone);
    if (k >= 0) ms.push(performance.now() - t0);
    if (out.status !== 'stored') throw new Error(`office growth benchmark: bundle ${k} was not stored (${out.status})`);
  }
  const tenth = Math.floor(bundles / 10);
  const first = ms.slice(0, tenth);
  const last = ms.slice(bundles - tenth);
  const [n] = await db.query<{ n: string }>('select count(*)::text as n from record_versions');
  const tag = engine === 'PGlite' ? 'pglite' : 'postgresql';
  figure({
    name: `office-ingest-growth-${tag}`,
    value: mean(last),
    unit: 'ms per bundle of 500 readings, last tenth',
    floor: mean(first),
    floor_is: 'ms per bundle over the first tenth, into the nearly empty database',
    target: 'ratio <= 1.3',
    engine,
    readings_stored: Number(n.n),
    median_ratio: sig3(median(last) / median(first)),
  });
  // A pull page (the receiver's own query) at the start and at the end, interleaved, median of each.
  const [top] = await db.query<{ seq: string }>('select max(seq)::text as seq from office_bundles');
  const pageBundles = (await pullBundles(db, 0, reader)).documents.length;
  const endCursor = Number(top.seq) - pageBundles;
  const atStart: number[] = [];
  const atEnd: number[] = [];
  for (let r = 0; r < PULL_ROUNDS; r++) {
    let t0 = performance.now();
    const a = await pullBundles(db, 0, reader);
    atStart.push(performance.now() - t0);
    t0 = performance.now();
    const z = await pullBundles(db, endCursor, reader);
    atEnd.push(performance.now() - t0);
    if (a.documents.length !== z.documents.length) throw new Error('office growth benchmark: the two pull pages differ in size');
  }
  figure({
    name: `office-pull-page-at-end-${tag}`,
    value: median(atEnd),
    unit: `ms per pull page of ${pageBundles} bundles`,
    floor: median(atStart),
    floor_is: 'the same size of page pulled from the start of the same database',
    target: 'ratio <= 1.3',
    engine,
    readings_stored: Number(n.n),
  });
}

/** Runs the growth benchmark on PGlite, then on PostgreSQL when a server can be had. */
export default async function officeGrowthBench(): Promise<void> {
  await onEachEngine('office-ingest-growth and office-pull-page-at-end', run);
}
